/**
 * Evaluates a plan against a site's own intervals and tariff: before/after PF charges per
 * month and rule, the leading-power report, the resonance and voltage screens and the
 * economics. Pure: takes the loaded inputs, returns a JSON-ready object (no Infinity).
 */
import { compareCorrection, type BankPlan } from '../domain/correction/compare-correction';
import { computeMetrics } from '../domain/power/period-metrics';
import { averagePf } from '../domain/power/quantities';
import { screenResonance, screenResonanceSteps, detunedTuningOrder, type ResonanceScreen } from '../domain/correction/resonance';
import { voltageRise, capacitorDuty, type DutyCheck } from '../domain/correction/voltage-and-duty';
import { CAUTIONS, type Caution } from '../domain/correction/cautions';
import { capexOf, type CostLine } from '../domain/economics/capex';
import { economics } from '../domain/economics/economics';
import { lossSavingBenefit, releasedCapacityBenefit } from '../domain/economics/optional-benefits';
import type { OptionalBenefit } from '../domain/economics/economics';
import { specKvar, stepsOf, type PlanSpec } from './plan-spec';
import type { SiteInputs } from './site-inputs';
import { ApiError } from '../api/errors';

/** Highest voltage the engine runs a bank at (its bank schema's bound), V. */
const BANK_MAX_V = 100_000;

export type Figures = { annualSaving: number; netAnnual: number; paybackYears: number | null; npv: number; irr: number | null };

export type PlanEvaluation = {
  plan: { name: string; kind: 'fixed' | 'switched'; kvar: number; effectiveKvar: number; stepsKvar: number[] | null; detunedReactorPct: number | null };
  currency: string;
  tariffName: string;
  /** Multiplier from the months evaluated to one year (1 for a year of data). */
  annualFactor: number;
  months: { periodId: string; label: string; before: number; after: number; saving: number; rules: { ruleId: string; ruleLabel: string; before: number; after: number }[]; leadingHours: number; addedLeadingHours: number; overCorrected: boolean }[];
  rules: { ruleId: string; ruleLabel: string }[];
  totals: { before: number; after: number; saving: number; annualBefore: number; annualAfter: number; annualSaving: number };
  pf: { before: number | null; after: number | null; peakKw: number };
  leading: { goesLeading: boolean; intervals: number; hours: number; kvarh: number; worstLeadPf: number | null; addedHours: number; overCorrectedMonths: string[]; message: string | null };
  screening: {
    missing: string[];
    resonance: ResonanceScreen | null;
    steps: ResonanceScreen[];
    detuned: { reactorPct: number; tuningOrder: number; message: string } | null;
    suggestDetuned: boolean;
    voltageRise: { risePct: number; message: string } | null;
    duty: DutyCheck | null;
  };
  economics: Figures & {
    capex: number;
    capexLines: CostLine[];
    omPerYear: number;
    lifeYears: number;
    discountRate: number;
    cashFlows: number[];
    optional: OptionalBenefit[];
    optionalPerYear: number;
    optionalCounted: boolean;
    sensitivity: ({ savingsFactor: number } & Figures)[];
  };
  notes: string[];
  cautions: readonly Caution[];
};

const finite = (x: number) => (Number.isFinite(x) ? x : null);

/** The engine's bank plan for a spec, with the site's service voltage filled in when only the rating is given. */
export function bankPlanOf(spec: PlanSpec, siteServiceV: number | null): BankPlan {
  const b = spec.bank;
  const serviceVoltageV = b.serviceVoltageV ?? (b.ratedVoltageV && siteServiceV ? siteServiceV : undefined);
  // A site may be supplied at transmission voltage; a bank does not run there, and the engine refuses it.
  if (serviceVoltageV !== undefined && serviceVoltageV > BANK_MAX_V) {
    const message = `The site is supplied at ${serviceVoltageV.toLocaleString('en-US')} V, above the ${BANK_MAX_V.toLocaleString('en-US')} V a bank here runs at: give the voltage of the bus the bank connects to.`;
    throw new ApiError(400, 'invalid_input', `bank.serviceVoltageV: ${message}`, { 'bank.serviceVoltageV': message });
  }
  if (b.kind === 'fixed') return { kind: 'fixed', kvar: b.kvar, ratedVoltageV: b.ratedVoltageV, serviceVoltageV };
  return { kind: 'switched', stepsKvar: stepsOf(b), targetPf: b.targetPf, leadingLimitPf: b.leadingLimitPf, ratedVoltageV: b.ratedVoltageV, serviceVoltageV };
}

export function annualFactorOf(hours: number): number {
  return hours >= 8700 && hours <= 8800 ? 1 : 8766 / Math.max(hours, 1);
}

export function evaluatePlan(inputs: SiteInputs, spec: PlanSpec): PlanEvaluation {
  const { series, periods, tariff, site } = inputs;
  const plan = bankPlanOf(spec, site.serviceVoltageV);
  const cmp = compareCorrection(tariff, series, periods, plan);
  const sim = cmp.simulation;
  const hours = periods.reduce((s, p) => s + p.hours, 0);
  const annualFactor = annualFactorOf(hours);
  const kvar = specKvar(spec.bank);
  // The fixed bank's own over-correction note is covered by the leading message.
  const notes = [...inputs.notes, ...(plan.kind === 'switched' ? sim.notes : [])];
  if (annualFactor !== 1) notes.push(`The data cover ${Math.round(hours)} hours; charges were scaled by ${annualFactor.toFixed(3)} to a year.`);

  // Average lagging PF of the whole data before and after, and the peak kW (for the optional lines).
  const whole = [{ id: 'all', label: 'all', kind: 'month' as const, zone: periods[0]!.zone, startMs: periods[0]!.startMs, endMs: periods.at(-1)!.endMs, hours }];
  const [mb] = computeMetrics(series, whole);
  const [ma] = computeMetrics(sim.series, whole);
  const pfBefore = averagePf(mb!.kwh, mb!.kvarhLag);
  const pfAfter = averagePf(ma!.kwh, ma!.kvarhLag);

  const s = sim.summary;
  const addedHours = s.periods.reduce((acc, p) => acc + p.addedLeadingHours, 0);
  const goesLeading = addedHours > 0;
  const over = s.overCorrectedPeriods;
  const overText = over.length === 0 ? '' : over.length <= 3 ? `; over-corrected at light load in ${over.join(', ')}` : `; over-corrected at light load in ${over.length} of ${periods.length} months`;
  const leadingMessage = goesLeading
    ? `With this bank the site runs leading for ${s.leadingHours.toLocaleString('en-US', { maximumFractionDigits: 0 })} h of the data (${addedHours.toLocaleString('en-US', { maximumFractionDigits: 0 })} h added by the bank), ${s.leadingKvarh.toLocaleString('en-US', { maximumFractionDigits: 0 })} kvarh leading, worst PF ${s.worstLeadPf?.toFixed(3) ?? '—'} lead${overText}. Check the utility's rules on leading power and the voltage at light load, or choose a Switched bank.`
    : null;

  // Screening from the site's transformer and voltage.
  const missing: string[] = [];
  if (!site.transformerKva) missing.push('transformer rating (kVA)');
  if (!site.transformerImpedancePct) missing.push('transformer impedance (%)');
  const reactorPct = spec.costs.detuned?.reactorPct ?? null;
  let resonance: ResonanceScreen | null = null;
  let steps: ResonanceScreen[] = [];
  let rise: { risePct: number; message: string } | null = null;
  // A bank whose output rounds to 0 kvar (a tiny size, or run far below its rated voltage) has no resonance to screen.
  const screenedKvar = round(sim.effectiveKvar);
  if (site.transformerKva && site.transformerImpedancePct && screenedKvar > 0) {
    const tx = { transformerKva: site.transformerKva, impedancePct: site.transformerImpedancePct };
    resonance = screenResonance({ ...tx, bankKvar: screenedKvar });
    if (plan.kind === 'switched') steps = screenResonanceSteps(tx, plan.stepsKvar);
    rise = voltageRise({ ...tx, bankKvar: screenedKvar });
  }
  const anyNear = !!resonance?.warning || steps.some((x) => x.warning);
  const detuned = reactorPct
    ? { reactorPct, tuningOrder: detunedTuningOrder(reactorPct), message: `Detuned with a ${reactorPct} % reactor: tuned to harmonic ${detunedTuningOrder(reactorPct).toFixed(2)}, below the 5th, so the bank no longer resonates at the screened harmonics (confirm with a harmonic study).` }
    : null;
  const ratedV = plan.ratedVoltageV;
  const serviceV = plan.serviceVoltageV;
  const duty = ratedV && serviceV ? capacitorDuty({ ratedKvar: kvar, ratedVoltageV: ratedV, serviceVoltageV: serviceV }) : null;

  // Economics.
  const capex = capexOf({ kvar, costPerKvar: spec.costs.perKvar, fixedCost: spec.costs.fixedInstallation, detuningPremiumPerKvar: spec.costs.detuned?.premiumPerKvar });
  const omPerYear = (capex.total * spec.costs.omPctOfCapex) / 100;
  const annualSaving = cmp.saving * annualFactor;
  const optional: OptionalBenefit[] = [];
  const bn = spec.benefits;
  if (bn?.lineLossCostPerYear !== undefined && pfBefore && pfAfter && pfAfter > pfBefore) optional.push(lossSavingBenefit(pfBefore, pfAfter, bn.lineLossCostPerYear));
  if (bn?.releasedCapacityValuePerKvaYear !== undefined && pfBefore && pfAfter && pfAfter > pfBefore) optional.push(releasedCapacityBenefit(mb!.peakKw, pfBefore, pfAfter, bn.releasedCapacityValuePerKvaYear));
  const e = economics({ capex: capex.total, annualSaving, omPerYear, lifeYears: spec.finance.lifeYears, discountRate: spec.finance.discountRate, optionalBenefits: optional, includeOptional: bn?.countInFigures ?? false });
  const fig = (f: { annualSaving: number; netAnnual: number; paybackYears: number; npv: number; irr: number | null }): Figures => ({ annualSaving: f.annualSaving, netAnnual: f.netAnnual, paybackYears: finite(f.paybackYears), npv: f.npv, irr: f.irr });
  if (!Number.isFinite(e.paybackYears)) notes.push('The savings do not cover the yearly O&M: the plan is not paid back.');

  const ruleIndex = new Map<string, string>();
  cmp.periods.forEach((p) => p.rules.forEach((r) => ruleIndex.set(r.ruleId, r.ruleLabel)));
  return {
    plan: { name: spec.name, kind: plan.kind, kvar, effectiveKvar: sim.effectiveKvar, stepsKvar: plan.kind === 'switched' ? plan.stepsKvar : null, detunedReactorPct: reactorPct },
    currency: tariff.currency,
    tariffName: inputs.tariffName,
    annualFactor,
    months: cmp.periods.map((p, k) => ({ ...p, leadingHours: s.periods[k]!.leadingHours, addedLeadingHours: s.periods[k]!.addedLeadingHours, overCorrected: s.periods[k]!.overCorrected })),
    rules: [...ruleIndex].map(([ruleId, ruleLabel]) => ({ ruleId, ruleLabel })),
    totals: { before: cmp.before.total, after: cmp.after.total, saving: cmp.saving, annualBefore: cmp.before.total * annualFactor, annualAfter: cmp.after.total * annualFactor, annualSaving },
    pf: { before: pfBefore, after: pfAfter, peakKw: mb!.peakKw },
    leading: { goesLeading, intervals: s.leadingIntervals, hours: s.leadingHours, kvarh: s.leadingKvarh, worstLeadPf: s.worstLeadPf, addedHours, overCorrectedMonths: s.overCorrectedPeriods, message: leadingMessage },
    screening: { missing, resonance, steps, detuned, suggestDetuned: anyNear && !detuned, voltageRise: rise, duty },
    economics: {
      ...fig(e),
      capex: capex.total,
      capexLines: capex.lines,
      omPerYear,
      lifeYears: spec.finance.lifeYears,
      discountRate: spec.finance.discountRate,
      cashFlows: e.cashFlows,
      optional,
      optionalPerYear: e.optionalPerYear,
      optionalCounted: e.optionalCounted,
      sensitivity: e.sensitivity.map((x) => ({ savingsFactor: x.savingsFactor, ...fig(x) })),
    },
    notes,
    cautions: CAUTIONS,
  };
}

function round(x: number): number {
  return Math.round(x * 100) / 100;
}
