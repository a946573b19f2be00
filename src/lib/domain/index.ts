/**
 * Varledger audit engine: framework-free power-factor metrics, tariff PF rules,
 * capacitor-bank simulation, sizing and economics. Imports only zod, luxon and
 * its own files; takes numbers, typed arrays and rule objects, returns plain objects.
 *
 * Typical flow for one site:
 *
 *   const series = unwrap(buildSeries({ intervalMinutes: 15, stamps, active: kwh, reactive: { kind: 'registers', lag, lead } }));
 *   const periods = unwrap(monthlyPeriods(series, 'America/Chicago'));           // or billingPeriods(ranges, zone)
 *   const metrics = computeMetrics(series, periods, { demandWindowMinutes: 30 });
 *   const tariff = unwrap(parseTariff(storedJson));
 *   const charges = evaluateTariff(tariff, series, periods, { history });        // per period, per rule, explained
 *   const fixed = simulateFixedBank(series, { kvar: 150 }, periods);            // corrected series + leading report
 *   const after = evaluateTariff(tariff, fixed.series, periods);                 // saving = charges.total - after.total
 *   const table = sizingSearch(tariff, series, periods, { sizesKvar, targetPf: 0.95, costs, finance });
 *
 * Public API
 * - Series: `buildSeries(input)` validates raw arrays into an `IntervalSeries` (typed arrays;
 *   kWh, lagging and leading kvarh, flags); `localStampsToUtc(stamps, opts)` reads local
 *   wall-clock stamps (interval start or end, `24:00`, the repeated fall-back hour).
 * - Periods: `monthlyPeriods(seriesOrSpan, zone)` calendar months in an IANA zone (743/745-hour DST
 *   months); `billingPeriods(ranges, zone)` bill date ranges; `spanOf(series)`.
 * - Metrics: `computeMetrics(series, periods, opts)` -> `PeriodMetrics[]` (kWh, kvarh lag/lead/net,
 *   average PF on three bases, peak kW on the demand window with its kvar and PF, peak kVA,
 *   max kvar, min interval PF, hours below a threshold, load factor, completeness, zero-kW,
 *   export and leading counts). Power-triangle helpers: `powerFactor`, `tanPhi`, `combineLoads`,
 *   `truePowerFactor`.
 * - Tariffs: `tariffSchema` / `parseTariff(json)` (zod, JSON-storable, `.describe()`d);
 *   `tariffRuleSchema` the discriminated union of the six rule types listed in `RULE_TYPES`;
 *   `tariffVersionOn(versions, date)`; `tariffDataProblems(tariff, series)` (demand window vs data);
 *   `evaluateTariff(tariff, series, periods, opts)` ->
 *   `TariffEvaluation` (total, per period, per rule, each with quantities and explanation);
 *   `prepareTariff` + `evaluatePrepared` to re-evaluate one binding under corrections;
 *   `evaluateTariffVersions(versions, series, periods)` picks the version per period and
 *   carries ratchet memory across versions.
 * - Correction: `simulateFixedBank(series, bank, periods)`, `simulateSwitchedBank(series, bank, periods)`
 *   -> `BankSimulation` (corrected series, leading summary, over-corrected periods);
 *   `compareCorrection(tariff, series, periods, plan)` before/after charges per period and rule;
 *   `sizingSearch(tariff, series, periods, opts)` -> `SizingTable` (rows with saving, capex,
 *   payback, NPV, IRR, leading hours; best NPV and shortest payback marked; textbook Qc);
 *   `kvarRange(from, to, step)` for candidate sizes;
 *   formulas `kvarToCorrect`, `kvarPerKwMultiplier`, `correctedPf`, `voltageScale`,
 *   `lossReduction`, `releasedCapacityKva`, `economicPf`.
 * - Screening: `screenResonance(input)`, `screenResonanceSteps`, `detunedTuningOrder`,
 *   `voltageRise(input)`, `capacitorDuty(input)`, `CAPACITOR_LIMITS`; `CAUTIONS` (texts to show).
 * - Economics: `economics(input)` -> payback (Infinity when savings do not cover O&M), NPV,
 *   IRR, ±20 % sensitivity; `capexOf`, `npv`, `irr`, `simplePayback`, `lossSavingBenefit`,
 *   `releasedCapacityBenefit` (optional lines, labelled as optional).
 * - Results: validators return `Result<T>` (`{ ok, value, warnings } | { ok: false, errors }`);
 *   `unwrap` for callers that have already validated.
 */
export * from './result';
export * from './series/interval-series';
export * from './series/build-series';
export * from './series/local-stamps';
export { localCalendarFor, weekdayOfLocalDay, dateOfLocalDay, type LocalCalendar } from './series/local-calendar';
export * from './periods/period';
export * from './periods/monthly-periods';
export * from './periods/billing-periods';
export * from './power/quantities';
export * from './power/period-metrics';
export type { WindowAggregate } from './power/window-aggregate';
export type { DemandMethod } from './power/demand-blocks';
export type { ReactiveCorrection } from './power/aggregate-kernel';
export * from './tariff/tou-window';
export * from './tariff/common-schemas';
export * from './tariff/tariff-schema';
export * from './tariff/rule-registry';
export type { EnteredAmounts, RuleOutcome, RuleStatus } from './tariff/rule-contract';
export type { PriorPeriod } from './tariff/history';
export * from './tariff/evaluate-tariff';
export * from './tariff/evaluate-versions';
export { pfBillingDemandRuleSchema, type PfBillingDemandRule } from './tariff/rules/pf-billing-demand';
export { kvaBillingDemandRuleSchema, type KvaBillingDemandRule } from './tariff/rules/kva-billing-demand';
export { excessKvarDemandRuleSchema, type ExcessKvarDemandRule } from './tariff/rules/excess-kvar-demand';
export { excessKvarhRuleSchema, type ExcessKvarhRule } from './tariff/rules/excess-kvarh';
export { pfPercentAdjustmentRuleSchema, type PfPercentAdjustmentRule } from './tariff/rules/pf-percent-adjustment';
export { leadingKvarhRuleSchema, type LeadingKvarhRule } from './tariff/rules/leading-kvarh';
export * from './correction/formulas';
export * from './correction/bank-spec';
export * from './correction/simulate-bank';
export * from './correction/compare-correction';
export * from './correction/correction-summary';
export * from './correction/sizing-search';
export * from './correction/textbook-estimate';
export * from './correction/resonance';
export * from './correction/voltage-and-duty';
export * from './correction/cautions';
export * from './economics/cash-flow-math';
export * from './economics/capex';
export * from './economics/economics';
export * from './economics/optional-benefits';
