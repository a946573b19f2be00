import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { billingPeriods, evaluateTariff, monthlyPeriods, parseTariff, RULE_TYPES, tariffDataProblems, tariffSchema, tariffVersionOn, unwrap, type TariffInput } from '../../../../src/lib/domain';
import { seriesByTime } from '../support/factories';

const HOUR = 3_600_000;
// One invented week of hourly data from local midnight Monday 6 Jan 2025 in Chicago (CST = UTC-6).
const WEEK_START = Date.UTC(2025, 0, 6, 6);
const localHour = (t: number) => new Date(t - 6 * HOUR).getUTCHours();
const week = seriesByTime(WEEK_START, 7 * 24, 60, (t) => ({ kw: 100, kvar: localHour(t) >= 22 || localHour(t) < 6 ? 80 : 20 }));
const weekPeriod = unwrap(billingPeriods([{ from: '2025-01-06', to: '2025-01-12' }], 'America/Chicago'));

const nightRule = (window: object) => ({
  type: 'excess-kvarh' as const,
  id: 'night',
  allowance: { basis: 'ratio' as const, kvarPerKw: 0.5 },
  pricing: { kind: 'flat' as const, ratePerKvarh: 0.01 },
  window,
});
const tariffWith = (rules: TariffInput['rules'], extra: Partial<TariffInput> = {}) => unwrap(parseTariff({ name: 'Invented test tariff', currency: 'USD', rules, ...extra }));

describe('time-of-use windows in local time', () => {
  it.each<[object, string[], number, string]>([
    // window, holidays, billable kvarh, source
    [{ timeRanges: [{ from: '22:00', to: '06:00' }] }, [], 56 * 30, 'hand-computed: 22:00-06:00 wraps midnight: 8 night hours x 7 days, (80 - 50) kvarh each'],
    [{ weekdays: [1, 2, 3, 4, 5], timeRanges: [{ from: '22:00', to: '06:00' }] }, [], 40 * 30, 'hand-computed: weekdays judged by each interval\'s own local date, 5 x 8 hours'],
    [{ weekdays: [1, 2, 3, 4, 5], timeRanges: [{ from: '22:00', to: '06:00' }], holidays: 'exclude' }, ['2025-01-08'], 32 * 30, 'hand-computed: a listed holiday leaves the window'],
    [{ weekdays: [1, 2, 3, 4, 5], timeRanges: [{ from: '22:00', to: '06:00' }], holidays: 'whole-day' }, ['2025-01-08'], 32 * 80 + 8 * 80 + 16 * 20 - 0.5 * 5600, 'hand-computed: a listed holiday is in the window all day'],
    [{ weekdays: [6, 7] }, [], 48 * 80 * (8 / 24) + 48 * 20 * (16 / 24) - 0.5 * 4800, 'hand-computed: weekend all day: 16 night + 32 day hours'],
    [{ months: [2] }, [], 0, 'hand-computed: a February-only window is empty in January'],
  ])('window %j, holidays %j', (window, holidays, billable) => {
    const e = evaluateTariff(tariffWith([nightRule(window)], { holidays }), week, weekPeriod);
    expect(e.periods[0].rules[0].quantities.billableKvarh).toBeCloseTo(Math.max(0, billable), 6);
    expect(e.total).toBeCloseTo(Math.max(0, billable) * 0.01, 6);
  });

  it.each([
    ['2025-11-01', '2025-11-03', Date.UTC(2025, 10, 1, 4), 73, 8 + 9 + 8, 'IANA tz database: New York falls back on 2 Nov 2025, so that night has nine hours'],
    ['2025-03-08', '2025-03-10', Date.UTC(2025, 2, 8, 5), 71, 8 + 7 + 8, 'IANA tz database: New York springs forward on 9 Mar 2025, so that night has seven hours'],
  ])('a 22:00-06:00 window across a clock change (%s to %s)', (from, to, startMs, hours, nightHours) => {
    const s = seriesByTime(startMs, hours, 60, () => ({ kw: 100, kvar: 80 }));
    const period = unwrap(billingPeriods([{ from, to }], 'America/New_York'));
    const e = evaluateTariff(tariffWith([nightRule({ timeRanges: [{ from: '22:00', to: '06:00' }] })]), s, period);
    expect(e.periods[0].rules[0].quantities.kwh).toBeCloseTo(nightHours * 100, 9);
  });

  it('names the window in the result', () => {
    const e = evaluateTariff(tariffWith([nightRule({ name: 'Night', timeRanges: [{ from: '22:00', to: '06:00' }] })]), week, weekPeriod);
    expect(e.periods[0].rules[0].windowLabel).toBe('Night');
  });
});

describe('a tariff over several months', () => {
  // Invented: January peaks at 200 kW, February to April at 100 kW, always PF 0.80 (kvar = 0.75 kW).
  const start = Date.UTC(2025, 0, 1);
  const months = seriesByTime(start, (31 + 28 + 31 + 30) * 24, 60, (t) => {
    const kw = new Date(t).getUTCMonth() === 0 ? 200 : 100;
    return { kw, kvar: 0.75 * kw };
  });
  const periods = unwrap(monthlyPeriods({ fromMs: start, toMs: Date.UTC(2025, 4, 1) }, 'UTC'));
  const tariff = tariffWith([{ type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 10, ratchet: { fraction: 0.8 } }]);

  it.each([
    [0, 250, '0 of 11', 'hand-computed: January: (225 - 200) kW x $10, no earlier months'],
    [1, 200, '1 of 11', 'February: ratchet 0.8 x 225 = 180 kW vs 0.8 x 200 = 160 kW without PF (common practice: ratchet over the previous 11 months)'],
    [2, 200, '2 of 11', 'hand-computed: March: January still sets the floor'],
    [3, 200, '3 of 11', 'hand-computed: April: fewer than 11 months of history, the ratchet uses the 3 there are'],
  ])('period %s charges %s', (p, amount, used) => {
    const e = evaluateTariff(tariff, months, periods);
    expect(e.periods[p].total).toBeCloseTo(amount, 6);
    expect(e.periods[p].rules[0].explanation).toContain(`${used} earlier periods available`);
  });

  it('uses entered bills from before the data as ratchet history', () => {
    const e = evaluateTariff(tariff, months, periods, { history: [{ label: 'Dec 2024', peakKw: 400, billingDemandKw: 450 }] });
    // January: floor 0.8 x 450 = 360 kW vs 0.8 x 400 = 320 kW without PF -> 40 kW x $10.
    expect(e.periods[0].total).toBeCloseTo(400, 6);
  });

  it('totals per period and per rule add up', () => {
    const e = evaluateTariff(tariff, months, periods);
    expect(e.total).toBeCloseTo(850, 6);
    expect(e.byRule[0].total).toBeCloseTo(e.total, 9);
    expect(e.periods.reduce((s, p) => s + p.total, 0)).toBeCloseTo(e.total, 9);
  });

  it('warns when a period is incomplete', () => {
    const e = evaluateTariff(tariff, months, unwrap(monthlyPeriods({ fromMs: start, toMs: Date.UTC(2025, 5, 1) }, 'UTC')));
    expect(e.periods[4].warnings[0]).toMatch(/^744 of 744 intervals are missing/);
  });

  it('prices demand on the tariff\'s demand window (30-min demand from 15-min data, common practice)', () => {
    const quarter = seriesByTime(start, 96, 15, (_t, i) => ({ kw: i === 41 ? 300 : 100, kvar: 0 }));
    const day = unwrap(billingPeriods([{ from: '2025-01-01', to: '2025-01-01' }], 'UTC'));
    const kva = (w: number) =>
      evaluateTariff(tariffWith([{ type: 'kva-billing-demand', id: 'k', mode: 'peak-kva', demandRate: 1 }], { demandWindowMinutes: w }), quarter, day).periods[0].rules[0].quantities.peakKva;
    expect(kva(15)).toBeCloseTo(300, 9);
    expect(kva(30)).toBeCloseTo(200, 9);
  });
});

describe('tariff schema', () => {
  it('reports every problem with its path', () => {
    const r = parseTariff({ name: '', currency: 'usd', rules: [{ type: 'excess-kvarh', id: 'a' }, { type: 'no-such-rule', id: 'b' }] });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const paths = r.errors.map((e) => e.message.split(':')[0]);
    expect(paths).toEqual(expect.arrayContaining(['name', 'currency', 'rules.0.allowance', 'rules.0.pricing', 'rules.1.type']));
  });

  it('rejects a rule id used twice', () => {
    const rule = { type: 'leading-kvarh', id: 'x', ratePerKvarh: 0.01 };
    const r = parseTariff({ name: 'T', currency: 'EUR', rules: [rule, rule] });
    expect(!r.ok && r.errors[0].message).toMatch(/used twice/);
  });

  it('survives a JSON round trip unchanged (tariffs are stored as JSON)', () => {
    const t = tariffWith([nightRule({ timeRanges: [{ from: '22:00', to: '06:00' }] }), { type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: 5, ratchet: { fraction: 0.8 } }]);
    expect(unwrap(parseTariff(JSON.parse(JSON.stringify(t))))).toEqual(t);
  });

  it('converts to JSON Schema for OpenAPI, with descriptions', () => {
    const schema = z.toJSONSchema(tariffSchema, { io: 'input' }) as { description?: string; properties: Record<string, { description?: string }> };
    expect(schema.description).toMatch(/Power-factor clauses/);
    expect(schema.properties.currency.description).toMatch(/ISO 4217/);
  });

  it('labels every rule type', () => {
    expect(RULE_TYPES.map((t) => t.type)).toEqual(['pf-billing-demand', 'kva-billing-demand', 'excess-kvar-demand', 'excess-kvarh', 'pf-percent-adjustment', 'leading-kvarh']);
    expect(RULE_TYPES.every((t) => t.label.length > 0)).toBe(true);
  });

  it.each<[string, string | null, string]>([
    ['2024-12-31', null, 'common practice: a version applies from its effective date, before every version'],
    ['2025-01-01', 'v2025', 'common practice: a version applies from its effective date, on the effective date'],
    ['2025-09-30', 'v2025', 'common practice: a version applies from its effective date, the day before the next version'],
    ['2025-10-01', 'v2025b', 'common practice: a version applies from its effective date, from the next version on'],
  ])('version in force on %s', (date, name) => {
    const v = (n: string, effectiveFrom: string) => tariffWith([], { name: n, effectiveFrom });
    expect(tariffVersionOn([v('v2025b', '2025-10-01'), v('v2025', '2025-01-01')], date)?.name ?? null).toBe(name);
  });
});

describe('tariff against the data', () => {
  it.each([
    [15, 30, 0, 'common practice: 30-min demand from 15-min data'],
    [15, 15, 0, 'common practice: demand on the meter interval'],
    [30, 15, 1, 'common practice: a 15-min window cannot be formed from 30-min data'],
    [15, 20, 1, 'common practice: a 20-min window is not a multiple of 15 min'],
  ])('%s-min data, %s-min demand window: %s problem(s)', (intervalMinutes, demandWindowMinutes, count) => {
    const t = unwrap(parseTariff({ name: 'T', currency: 'USD', demandWindowMinutes, rules: [] }));
    expect(tariffDataProblems(t, { intervalMinutes })).toHaveLength(count);
  });
});
