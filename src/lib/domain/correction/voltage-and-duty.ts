export interface VoltageRiseInput {
  bankKvar: number;
  transformerKva: number;
  impedancePct: number;
}

/**
 * Approximate steady-state voltage rise from a bank at the transformer secondary:
 * dV% ~ kvar x Z% / kVA_tx. Largest at light load, when nothing else pulls it down.
 */
export function voltageRise(input: VoltageRiseInput): { risePct: number; message: string } {
  const risePct = (input.bankKvar * input.impedancePct) / input.transformerKva;
  return {
    risePct,
    message: `About ${risePct.toFixed(2)} % voltage rise with ${input.bankKvar} kvar on ${input.transformerKva} kVA at ${input.impedancePct} %; check it against the supply voltage at light load.`,
  };
}

/** Shunt-capacitor duty limits (IEEE Std 18) and the NEC Article 460 margins. */
export const CAPACITOR_LIMITS = {
  /** Continuous rms voltage, fraction of rated (IEEE Std 18). */
  maxVoltageRatio: 1.1,
  /** Reactive output, fraction of rated (IEEE Std 18). */
  maxKvarRatio: 1.35,
  /** rms current, fraction of rated (IEEE Std 18). */
  maxCurrentRatio: 1.35,
  /** Conductor and disconnect rating, fraction of rated current (NEC 460). */
  conductorCurrentRatio: 1.35,
  /** Residual voltage after discharge, volts, and the time allowed, seconds (NEC 460, up to 1000 V). */
  dischargeVolts: 50,
  dischargeSeconds: 60,
} as const;

export interface DutyInput {
  ratedKvar: number;
  ratedVoltageV: number;
  serviceVoltageV: number;
}

export interface DutyCheck {
  voltageRatio: number;
  kvarAtServiceVoltage: number;
  kvarRatio: number;
  /** Rated current of a three-phase bank, A. */
  ratedCurrentA: number;
  /** Minimum ampacity of conductors and disconnect, A. */
  minConductorAmpacityA: number;
  withinLimits: boolean;
  messages: string[];
}

/** Checks a three-phase bank's voltage and kvar duty and sizes its conductors. */
export function capacitorDuty(input: DutyInput): DutyCheck {
  const voltageRatio = input.serviceVoltageV / input.ratedVoltageV;
  const kvarAtServiceVoltage = input.ratedKvar * voltageRatio ** 2;
  const kvarRatio = kvarAtServiceVoltage / input.ratedKvar;
  const ratedCurrentA = (input.ratedKvar * 1000) / (Math.sqrt(3) * input.ratedVoltageV);
  const messages: string[] = [];
  const eps = 1e-9;
  if (voltageRatio > CAPACITOR_LIMITS.maxVoltageRatio + eps) messages.push(`Service voltage is ${(voltageRatio * 100).toFixed(1)} % of the capacitor rating, above the 110 % limit: choose a higher voltage rating.`);
  if (kvarRatio > CAPACITOR_LIMITS.maxKvarRatio + eps) messages.push(`Output would be ${(kvarRatio * 100).toFixed(1)} % of rated kvar, above the 135 % limit.`);
  return {
    voltageRatio,
    kvarAtServiceVoltage,
    kvarRatio,
    ratedCurrentA,
    minConductorAmpacityA: ratedCurrentA * CAPACITOR_LIMITS.conductorCurrentRatio,
    withinLimits: messages.length === 0,
    messages,
  };
}
