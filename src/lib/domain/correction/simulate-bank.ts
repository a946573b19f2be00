import type { Period } from '../periods/period';
import type { IntervalSeries } from '../series/interval-series';
import { applyBankKvarh } from './apply-correction';
import { fixedBankSchema, switchedBankSchema, type FixedBank, type SwitchedBankInput } from './bank-spec';
import { fixedBankKvarhPerInterval, switchedBankKvarhInto } from './bank-kvarh';
import { summariseCorrection, type CorrectionSummary } from './correction-summary';
import { voltageScale } from './formulas';

export interface BankSimulation {
  /** The series as it would have been metered with the bank in service. */
  series: IntervalSeries;
  /** Bank kvar actually delivered at the service voltage (all steps in). */
  effectiveKvar: number;
  summary: CorrectionSummary;
  /** Step changes over the series (switched banks), 0 for fixed banks. */
  stepSwitchings: number;
  notes: string[];
}

/**
 * Fixed bank applied interval by interval: Q' = Q - Qc x (V/Vrated)^2, all the time,
 * including at light load and no load, where the site goes leading.
 */
export function simulateFixedBank(series: IntervalSeries, bank: Omit<FixedBank, 'kind'>, periods: readonly Period[]): BankSimulation {
  const spec = fixedBankSchema.parse({ ...bank, kind: 'fixed' });
  const perInterval = fixedBankKvarhPerInterval(series, spec);
  const corrected = applyBankKvarh(series, perInterval);
  const summary = summariseCorrection(series, corrected, periods);
  const notes = summary.overCorrectedPeriods.length
    ? [`The fixed bank over-corrects at light load in ${summary.overCorrectedPeriods.join(', ')} (leading for an hour or more that was not leading before).`]
    : [];
  return { series: corrected, effectiveKvar: spec.kvar * voltageScale(spec.serviceVoltageV, spec.ratedVoltageV), summary, stepSwitchings: 0, notes };
}

/**
 * Switched bank with a PF controller, simulated on interval averages: steps go in
 * while PF is below the target and never past unity (or the leading limit).
 */
export function simulateSwitchedBank(series: IntervalSeries, bank: Omit<SwitchedBankInput, 'kind'>, periods: readonly Period[]): BankSimulation {
  const spec = switchedBankSchema.parse({ ...bank, kind: 'switched' });
  const kvarh = new Float64Array(series.length);
  const switchings = switchedBankKvarhInto(series, spec, kvarh);
  const corrected = applyBankKvarh(series, kvarh);
  const total = spec.stepsKvar.reduce((s, k) => s + k, 0);
  return {
    series: corrected,
    effectiveKvar: total * voltageScale(spec.serviceVoltageV, spec.ratedVoltageV),
    summary: summariseCorrection(series, corrected, periods),
    stepSwitchings: switchings,
    notes: [`Simulated on ${series.intervalMinutes}-min averages: switching within an interval is not seen, so real step operations are more frequent than the ${switchings} counted.`],
  };
}
