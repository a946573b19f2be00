import { describe, expect, it } from 'vitest';
import { billedPf, reconcile, type BilledDeterminants } from '../../../src/lib/findings/reconcile';
import type { PeriodFinding } from '../../../src/lib/findings/compute';

// Invented bills and hand-made findings; expected values are formula-derived (average PF = kWh / sqrt(kWh² + kvarh²), common practice).
function period(id: string, kwh: number, kvarh: number, peakKw: number, pfCharge: number | null, completeness = 1): PeriodFinding {
  return {
    id, label: id, kind: 'billing', start: '', end: '', tariff: null, pfCharge, rules: [], warnings: [],
    metrics: { completeness, presentIntervals: completeness > 0 ? 100 : 0, kwh, kvarhLag: kvarh, pfAvgLagging: kwh / Math.hypot(kwh, kvarh), peakKw, peakKva: peakKw * 1.2 } as PeriodFinding['metrics'],
  };
}
const bill = (i: number, kwh: number, pfCharge: number | null, extra: Partial<BilledDeterminants> = {}): BilledDeterminants => ({
  id: `b${i}`, periodStart: `2026-0${i}-05`, periodEnd: `2026-0${i + 1}-04`, kwh, billedDemand: 500, demandUnit: 'kW', kvarh: null, pf: null, pfCharge, total: null, ...extra,
});
const pid = (i: number) => `2026-0${i}-05..2026-0${i + 1}-04`;

describe('reconciliation', () => {
  it('derives billed PF from kWh and kvarh: 10,000 kWh and 6,000 kvarh -> 0.857 (formula-derived: kWh / sqrt(kWh² + kvarh²))', () => {
    expect(billedPf({ pf: null, kwh: 10_000, kvarh: 6_000 })).toBeCloseTo(0.8575, 4);
  });

  it('detects a steady 1.25 kWh ratio as a multiplier error and names the implied multiplier', () => {
    const periods = [1, 2, 3, 4].map((i) => period(pid(i), 100_000 + i * 1000, 60_000, 500, 100));
    const bills = [1, 2, 3, 4].map((i) => bill(i, (100_000 + i * 1000) * 1.25, 100));
    const r = reconcile(bills, periods, 1);
    expect(r.multiplier.suspected).toBe(true);
    expect(r.multiplier.impliedMultiplier).toBeCloseTo(1.25, 6);
    expect(r.multiplier.message).toMatch(/1\.25/);
    expect(r.bills.every((b) => b.kwh.flagged)).toBe(true);
  });

  it('does not suspect the multiplier when kWh matches within 2 %', () => {
    const periods = [1, 2, 3].map((i) => period(pid(i), 100_000, 60_000, 500, 100));
    const bills = [1, 2, 3].map((i) => bill(i, 101_000, 100));
    expect(reconcile(bills, periods).multiplier.suspected).toBe(false);
  });

  it('flags a PF charge over max(5, 2 %) and counts only over-billing as disputable', () => {
    const periods = [1, 2, 3].map((i) => period(pid(i), 100_000, 60_000, 500, 400));
    const bills = [bill(1, 100_000, 404), bill(2, 100_000, 520), bill(3, 100_000, 300)];
    const r = reconcile(bills, periods);
    expect(r.bills.map((b) => b.pfCharge.flagged)).toEqual([false, true, true]);
    expect(r.disputable).toBeCloseTo(120, 9);
  });

  it('flags a printed PF more than 0.005 away', () => {
    const p = period(pid(1), 10_000, 6_000, 500, 0);
    expect(reconcile([bill(1, 10_000, 0, { pf: 0.851 })], [p]).bills[0]!.pf.flagged).toBe(true);
    expect(reconcile([bill(1, 10_000, 0, { pf: 0.855 })], [p]).bills[0]!.pf.flagged).toBe(false);
  });

  it('says so and compares nothing when interval data is missing or partial', () => {
    const r = reconcile([bill(1, 10_000, 50), bill(2, 10_000, 50)], [period(pid(1), 9_000, 5_000, 400, 10, 0.8)]);
    expect(r.bills.map((b) => b.compared)).toEqual([false, false]);
    expect(r.bills[0]!.notes[0]).toMatch(/80\.0 %/);
    expect(r.bills[1]!.notes[0]).toMatch(/No interval data/);
    expect(r.disputable).toBe(0);
  });
});
