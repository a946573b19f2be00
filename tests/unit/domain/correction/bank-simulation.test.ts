import { describe, expect, it } from 'vitest';
import {
  compareCorrection,
  computeMetrics,
  correctedPf,
  evaluatePrepared,
  evaluateTariff,
  kvarToCorrect,
  monthlyPeriods,
  parseTariff,
  prepareTariff,
  simulateFixedBank,
  simulateSwitchedBank,
  unwrap,
} from '../../../../src/lib/domain';
import { Field } from '../../../../src/lib/domain/power/aggregate-fields';
import { KERNEL_FIELDS } from '../../../../src/lib/domain/power/aggregate-kernel';
import { applyBankKvarh } from '../../../../src/lib/domain/correction/apply-correction';
import { switchedBankCorrection, switchedBankKvarhInto } from '../../../../src/lib/domain/correction/bank-kvarh';
import { switchedBankSchema } from '../../../../src/lib/domain';
import { constantSeries, seriesByTime, seriesFrom } from '../support/factories';

const START = Date.UTC(2025, 0, 1);
const januaryOf = (s: { startMs: Float64Array; length: number }) => unwrap(monthlyPeriods({ fromMs: s.startMs[0], toMs: s.startMs[s.length - 1] + 1 }, 'UTC'));

describe('fixed bank on a constant load', () => {
  it.each([
    [100, 0.8, 0.95, 'IEEE Std 141 ch. 8: Qc = P (tan phi1 - tan phi2) lands on PF2'],
    [620, 0.65, 0.9, 'worked example: 620 kW from 0.65 to 0.90 with 424.6 kvar'],
    [250, 0.75, 1.0, 'common practice: full compensation to unity'],
  ])('%s kW from PF %s to %s', (kw, from, to) => {
    const kvar = kw * Math.sqrt(1 - from * from) / from;
    const s = constantSeries({ startMs: START, count: 96, intervalMinutes: 15, kw, kvar });
    const sim = simulateFixedBank(s, { kvar: kvarToCorrect(kw, from, to) }, januaryOf(s));
    const [m] = computeMetrics(sim.series, januaryOf(s));
    expect(m.pfAvgNet).toBeCloseTo(to, 9);
    expect(m.peakPf).toBeCloseTo(correctedPf(kw, kvar, kvarToCorrect(kw, from, to)), 9);
  });

  it('scales output by (V / Vrated)^2 (common practice: 460 V on a 480 V bank gives 91.84 %)', () => {
    const s = constantSeries({ startMs: START, count: 4, intervalMinutes: 15, kw: 100, kvar: 100 });
    const sim = simulateFixedBank(s, { kvar: 100, ratedVoltageV: 480, serviceVoltageV: 460 }, januaryOf(s));
    expect(sim.effectiveKvar).toBeCloseTo(91.84, 2);
    expect(sim.series.kvarhLag[0]).toBeCloseTo((100 - 100 * (460 / 480) ** 2) / 4, 9);
  });
});

describe('fixed bank at light load goes leading (common practice)', () => {
  // Invented plant: 08:00-18:00 UTC 400 kW / 300 kvar; otherwise 20 kW / 10 kvar. A 200 kvar bank.
  const day = (t: number) => new Date(t).getUTCHours() >= 8 && new Date(t).getUTCHours() < 18;
  const s = seriesByTime(START, 31 * 24, 60, (t) => (day(t) ? { kw: 400, kvar: 300 } : { kw: 20, kvar: 10 }));
  const periods = januaryOf(s);
  const sim = simulateFixedBank(s, { kvar: 200 }, periods);

  it.each([
    ['leading hours', sim.summary.leadingHours, 31 * 14, 'hand-computed: 14 light-load hours a day'],
    ['leading kvarh', sim.summary.leadingKvarh, 31 * 14 * 190, 'hand-computed: 200 - 10 = 190 kvar leading each light-load hour'],
    ['worst leading PF', sim.summary.worstLeadPf, 20 / Math.hypot(20, 190), 'common practice: PF = P / sqrt(P^2 + Q^2) = 0.1047 leading'],
  ])('%s', (_n, actual, expected) => {
    expect(actual).toBeCloseTo(expected as number, 6);
  });
  it('flags the month as over-corrected and says so', () => {
    expect(sim.summary.overCorrectedPeriods).toEqual(['January 2025']);
    expect(sim.notes[0]).toMatch(/over-corrects at light load in January 2025/);
  });
});

describe('switched bank controller', () => {
  const load = (kw: number, kvar: number) => constantSeries({ startMs: START, count: 4, intervalMinutes: 15, kw, kvar });
  it.each([
    // kW, kvar, steps, target, leading limit, kvar left, source
    [100, 75, [10, 10, 10, 10, 10, 10], 0.95, 1, 25, 'need 75 - 32.87 = 42.1 kvar -> 5 of 6 steps (IEEE Std 141 tan relation)'],
    [100, 15, [10, 10], 1.0, 1, 5, 'hand-computed: the second step would pass unity: stays at 5 kvar lagging'],
    [100, 15, [10, 10], 1.0, 0.95, -5, 'hand-computed: with a 0.95 leading limit the second step is allowed'],
    [100, 50, [5, 10, 20], 0.95, 1, 15, 'hand-computed: listed steps in order: 5 + 10 + 20 = 35 kvar'],
    [100, 20, [10, 10, 10], 0.95, 1, 20, 'hand-computed: already above target (PF 0.981): no steps'],
    [100, -10, [10], 0.95, 1, -10, 'hand-computed: already leading: no steps'],
  ])('%s kW, %s kvar, steps %j', (kw, kvar, stepsKvar, targetPf, leadingLimitPf, left) => {
    const s = load(kw, kvar);
    const sim = simulateSwitchedBank(s, { stepsKvar, targetPf, leadingLimitPf }, januaryOf(s));
    expect((sim.series.kvarhLag[0] - sim.series.kvarhLead[0]) * 4).toBeCloseTo(left, 9);
  });

  it('never goes past unity on a varied load (common practice)', () => {
    const s = seriesByTime(START, 2000, 15, (_t, i) => ({ kw: 50 + ((i * 37) % 400), kvar: 10 + ((i * 53) % 300) }));
    const sim = simulateSwitchedBank(s, { stepsKvar: Array(8).fill(40), targetPf: 0.98 }, januaryOf(s));
    let worstNet = Infinity;
    for (let i = 0; i < s.length; i++) worstNet = Math.min(worstNet, sim.series.kvarhLag[i] - sim.series.kvarhLead[i]);
    expect(worstNet).toBeGreaterThanOrEqual(-1e-9);
    expect(sim.summary.leadingIntervals).toBe(0);
    expect(sim.notes[0]).toMatch(/averages/);
  });

  it('switches nothing at zero kW or export', () => {
    const s = seriesByTime(START, 4, 15, (_t, i) => ({ kw: i < 2 ? 0 : -50, kvar: 40 }));
    const sim = simulateSwitchedBank(s, { stepsKvar: [20, 20], targetPf: 0.95 }, januaryOf(s));
    expect(Array.from(sim.series.kvarhLag)).toEqual(Array.from(s.kvarhLag));
  });
});

describe('the corrected series and the kernel agree', () => {
  const s = seriesByTime(START, 31 * 96, 15, (t) => {
    const h = new Date(t).getUTCHours();
    return h >= 7 && h < 19 ? { kw: 300, kvar: 240 } : { kw: 40, kvar: 25 };
  });
  const periods = januaryOf(s);
  const tariff = unwrap(
    parseTariff({
      name: 'Invented mixed tariff',
      currency: 'USD',
      demandWindowMinutes: 30,
      rules: [
        { type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 12 },
        { type: 'excess-kvar-demand', id: 'kv', allowance: { basis: 'pf', pf: 0.9 }, kvarSource: 'period-max', ratePerKvar: 2 },
        { type: 'excess-kvarh', id: 'xr', kvarhBasis: 'absolute', allowance: { basis: 'ratio', kvarPerKw: 0.4 }, pricing: { kind: 'flat', ratePerKvarh: 0.01 }, window: { timeRanges: [{ from: '20:00', to: '06:00' }] } },
        { type: 'leading-kvarh', id: 'ld', ratePerKvarh: 0.03, condition: 'any-load' },
      ],
    }),
  );
  it.each([0, 60, 150, 300])('a %s kvar fixed bank: kernel correction = evaluation of the corrected series', (kvar) => {
    const direct = evaluatePrepared(prepareTariff(tariff, s, periods), { kind: 'constant', kvarh: kvar / 4 });
    const viaSeries = evaluateTariff(tariff, applyBankKvarh(s, kvar / 4), periods);
    expect(direct.byRule.map((r) => r.total)).toEqual(viaSeries.byRule.map((r) => r.total).map((x) => expect.closeTo(x, 9)));
  });
  it.each([
    [{ stepsKvar: [40, 40, 40, 40], targetPf: 0.95 }, 'equal steps to unity'],
    [{ stepsKvar: [25, 25, 25, 25, 25, 25], targetPf: 0.98, leadingLimitPf: 0.97 }, 'equal steps with a leading limit'],
    [{ stepsKvar: [30, 60, 120], targetPf: 0.95 }, 'listed unequal steps'],
  ])('switched bank %j: in-kernel controller = filled per-interval kvarh (%s)', (spec, _case) => {
    const bank = switchedBankSchema.parse({ kind: 'switched', ...spec });
    const prep = prepareTariff(tariff, s, periods);
    const filled = new Float64Array(s.length);
    switchedBankKvarhInto(s, bank, filled);
    const inKernel = evaluatePrepared(prep, switchedBankCorrection(s, bank, new Float64Array(s.length))).byRule.map((r) => r.total);
    const viaArray = evaluatePrepared(prep, { kind: 'per-interval', kvarh: filled }).byRule.map((r) => r.total);
    expect(inKernel).toEqual(viaArray.map((x) => expect.closeTo(x, 9)));
  });

  it('kernel field offsets match the named fields', () => {
    expect(KERNEL_FIELDS).toEqual(Field);
  });
});

describe('before and after a bank, per period and rule', () => {
  // Invented steady load: 400 kW at PF 0.80 (300 kvar), all of January.
  const s = constantSeries({ startMs: START, count: 31 * 24, intervalMinutes: 60, kw: 400, kvar: 300 });
  const periods = januaryOf(s);
  const tariff = unwrap(parseTariff({ name: 'Invented', currency: 'USD', rules: [{ type: 'excess-kvar-demand', id: 'kv', allowance: { basis: 'pf', pf: 0.95 }, ratePerKvar: 3 }] }));
  it('a fixed bank of Qc = P (tan phi1 - tan phi2) removes the whole excess-kvar charge (IEEE Std 141 ch. 8)', () => {
    const c = compareCorrection(tariff, s, periods, { kind: 'fixed', kvar: kvarToCorrect(400, 0.8, 0.95) });
    // Before: (300 - 400 x 0.3287) kvar x $3 = $505.6.
    expect(c.periods[0].before).toBeCloseTo((300 - 400 * Math.sqrt(1 - 0.95 ** 2) / 0.95) * 3, 6);
    expect(c.periods[0].after).toBeCloseTo(0, 6);
    expect(c.saving).toBeCloseTo(c.periods[0].before, 9);
    expect(c.periods[0].rules[0]).toMatchObject({ ruleId: 'kv', before: c.periods[0].before });
  });
});

describe('kernel paths agree with evaluating the corrected series', () => {
  // Invented varied load with zero-kW and export intervals and a missing day, 15-min data.
  const rows: [number, number][] = [];
  for (let i = 0; i < 31 * 96; i++) {
    const h = Math.floor((i % 96) / 4);
    const kw = i % 97 === 0 ? 0 : i % 211 === 0 ? -30 : h >= 7 && h < 19 ? 250 + ((i * 37) % 90) : 30 + ((i * 13) % 25);
    const kvar = kw <= 0 ? (i % 2 ? 8 : -5) : kw * (0.55 + ((i * 7) % 30) / 100);
    rows.push([(kw * 15) / 60, (kvar * 15) / 60]);
  }
  const full = seriesFrom(START, 15, rows);
  const keep = Array.from({ length: full.length }, (_, i) => i).filter((i) => i < 96 * 10 || i >= 96 * 11);
  const s = seriesFrom(START, 15, keep.map((i) => rows[i]));
  // seriesFrom spaces rows evenly; rebuild with the gap kept.
  const gapped = { ...s, startMs: Float64Array.from(keep.map((i) => START + i * 15 * 60_000)) };
  const periods = januaryOf(gapped);
  const rules = [
    { type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 12, pfBasis: 'at-peak' },
    { type: 'kva-billing-demand', id: 'kva', mode: 'peak-kva', demandRate: 3 },
    { type: 'excess-kvar-demand', id: 'kv', allowance: { basis: 'pf', pf: 0.9 }, kvarSource: 'period-max', ratePerKvar: 2 },
    { type: 'excess-kvarh', id: 'xr', kvarhBasis: 'absolute', allowance: { basis: 'ratio', kvarPerKw: 0.4 }, pricing: { kind: 'flat', ratePerKvarh: 0.01 }, window: { timeRanges: [{ from: '20:00', to: '06:00' }] } },
    { type: 'leading-kvarh', id: 'ld', ratePerKvarh: 0.03, condition: 'zero-kw-only' },
  ];
  it.each([
    [15, 'block', 'one reading per interval'],
    [30, 'block', 'clock-aligned half-hour blocks'],
    [30, 'rolling', 'rolling half-hour'],
    [60, 'rolling', 'rolling hour'],
  ])('%s-min %s demand (%s)', (demandWindowMinutes, demandMethod) => {
    const tariff = unwrap(parseTariff({ name: 'Invented', currency: 'USD', demandWindowMinutes, demandMethod, rules }));
    const prep = prepareTariff(tariff, gapped, periods);
    for (const kvar of [0, 40, 120, 400]) {
      const direct = evaluatePrepared(prep, { kind: 'constant', kvarh: kvar / 4 });
      const viaSeries = evaluateTariff(tariff, applyBankKvarh(gapped, kvar / 4), periods);
      direct.periods[0].rules.forEach((r, k) => {
        const other = viaSeries.periods[0].rules[k];
        expect(r.amount).toBeCloseTo(other.amount, 9);
        for (const [key, value] of Object.entries(r.quantities)) expect(value ?? 0).toBeCloseTo(other.quantities[key] ?? 0, 9);
      });
      const bank = switchedBankSchema.parse({ kind: 'switched', stepsKvar: [kvar / 4 + 10, kvar / 4 + 10, kvar / 4 + 10, kvar / 4 + 10], targetPf: 0.97 });
      const filled = new Float64Array(gapped.length);
      switchedBankKvarhInto(gapped, bank, filled);
      const inKernel = evaluatePrepared(prep, switchedBankCorrection(gapped, bank, new Float64Array(gapped.length)));
      const viaFilled = evaluateTariff(tariff, applyBankKvarh(gapped, filled), periods);
      expect(inKernel.byRule.map((r) => r.total)).toEqual(viaFilled.byRule.map((r) => expect.closeTo(r.total, 9)));
    }
  });
});
