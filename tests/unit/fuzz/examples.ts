/**
 * One valid example per JSON request body and per multipart mapping, keyed like the route list
 * ("POST /api/sites/{siteId}/plans"). The bad-input and fuzz tests start from these and break
 * one thing at a time; every nested object the schema allows is present, so that an unknown
 * field can be planted at each level. Invented values throughout.
 */
import type { RouteDoc } from '../../../src/lib/api/route-doc';

export const routeKey = (r: Pick<RouteDoc, 'method' | 'path'>) => `${r.method.toUpperCase()} ${r.path}`;

/** A tariff version using all six rule types and every optional nested part (window, ratchet, rounding, credit, bands). */
export const validTariff = () => ({
  name: 'Bad-input check tariff (invented)',
  currency: 'USD',
  effectiveFrom: '2024-01-01',
  demandWindowMinutes: 15,
  demandMethod: 'block',
  holidays: ['2024-12-25'],
  rules: [
    {
      type: 'pf-billing-demand',
      id: 'pf-demand',
      name: 'PF-adjusted demand',
      targetPf: 0.9,
      pfRounding: { decimals: 2, mode: 'nearest' },
      demandRatePerKw: 12,
      ratchet: { fraction: 0.8, lookbackPeriods: 11, basis: 'measured', order: 'adjust-then-ratchet' },
      window: { name: 'Summer weekdays', weekdays: [1, 2, 3, 4, 5], months: [6, 7, 8], timeRanges: [{ from: '07:00', to: '19:00' }], holidays: 'exclude' },
    },
    { type: 'excess-kvarh', id: 'kvarh-bands', allowance: { basis: 'pf', pf: 0.95 }, kvarhBasis: 'lagging', pricing: { kind: 'pf-bands', bands: [{ pfBelow: 0.9, ratePerKvarh: 0.02 }] } },
    { type: 'pf-percent-adjustment', id: 'percent', base: { source: 'energy-rate', ratePerKwh: 0.11 }, thresholdPf: 0.95, tiers: [{ pctPerStep: 1 }], credit: { abovePf: 0.97, pctPerStep: 0.5, maxPct: 5 } },
    { type: 'excess-kvar-demand', id: 'kvar-demand', allowance: { basis: 'ratio', kvarPerKw: 0.33 }, ratePerKvar: 8, ratchet: { fraction: 0.5 } },
    { type: 'kva-billing-demand', id: 'kva', mode: 'peak-kva', demandRate: 10 },
    { type: 'leading-kvarh', id: 'leading', ratePerKvarh: 0.05, condition: 'any-load' },
  ],
});

/** A correction plan with every optional part (detuned costs, optional benefits). */
export const validPlan = () => ({
  name: 'Bad-input check plan',
  bank: { kind: 'switched', totalKvar: 300, steps: 6, targetPf: 0.95, leadingLimitPf: 1, ratedVoltageV: 480, serviceVoltageV: 480 },
  costs: { perKvar: 60, fixedInstallation: 4000, detuned: { premiumPerKvar: 30, reactorPct: 7 }, omPctOfCapex: 1 },
  finance: { discountRate: 0.08, lifeYears: 15 },
  benefits: { lineLossCostPerYear: 1000, releasedCapacityValuePerKvaYear: 20, countInFigures: false },
});

/** A meter CSV (15-minute ISO stamps) and the mapping that reads it, with every optional nested part. */
export const meterCsv = (days = 2, from = '2025-03-01T00:00:00Z') => {
  const t0 = Date.parse(from);
  const lines = ['Start,kWh,kvarh lag,kvarh lead,kVA,PF'];
  for (let i = 0; i < days * 96; i++) lines.push(`${new Date(t0 + i * 900_000).toISOString()},100,60,0,116.6,0.857`);
  return lines.join('\n') + '\n';
};
export const validMeterMapping = () => ({
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  skipRows: 0,
  hasHeader: true,
  timestamp: { column: 'Start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [
    {
      meterId: 'Main meter',
      active: { column: 'kWh', unit: 'kWh' },
      reactive: { kind: 'lag-lead', lag: 'kvarh lag', lead: 'kvarh lead', unit: 'kvarh' },
      apparent: { column: 'kVA', unit: 'kVAh' },
      powerFactor: { column: 'PF' },
      multiplier: 1,
    },
  ],
  missingValues: [''],
});

/** A bill-history CSV and its mapping. */
export const billCsv = () => ['Bill from,Bill to,Energy (kWh),PF,PF charge ($)', '2025-01-01,2025-01-31,41200,0.86,120.50', '2025-02-01,2025-02-28,39800,0.88,99.10'].join('\n') + '\n';
export const validBillMapping = () => ({
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  thousandsSeparator: 'none',
  dateFormat: 'iso',
  columns: { periodStart: 'Bill from', periodEnd: 'Bill to', kwh: 'Energy (kWh)', powerFactor: 'PF', pfCharge: 'PF charge ($)' },
  powerFactorScale: 'fraction',
  currency: 'USD',
});

/**
 * Valid JSON bodies by route. A route with a JSON body missing here fails the bad-input test.
 * Ids are placeholders: bad input is refused before any id is looked up.
 */
export const VALID_BODIES: Record<string, () => Record<string, unknown>> = {
  'POST /api/workspaces': () => ({ name: 'Bad-input check workspace' }),
  'PUT /api/workspaces/active': () => ({ workspaceId: 'org_placeholder' }),
  'PATCH /api/members/{memberId}': () => ({ role: 'owner' }),
  'POST /api/invitations': () => ({ email: 'nobody@invented.example', role: 'finance' }),
  'POST /api/sites': () => ({ name: 'Bad-input check site', address: '1 Test Lane', timeZone: 'America/Chicago', utility: 'Invented Power', accountNumber: 'X-1', serviceVoltageV: 480, transformerKva: 1500, transformerImpedancePct: 5.75, currency: 'USD' }),
  'PATCH /api/sites/{siteId}': () => ({ name: 'Bad-input check site renamed', address: '2 Test Lane', timeZone: 'America/Chicago', utility: 'Invented Power', accountNumber: 'X-2', serviceVoltageV: 480, transformerKva: 1500, transformerImpedancePct: 5.75, currency: 'USD' }),
  'POST /api/sites/{siteId}/tariffs': validTariff,
  'PUT /api/sites/{siteId}/tariffs/{tariffId}': validTariff,
  'POST /api/sites/{siteId}/tariffs/preview': validTariff,
  'POST /api/sites/{siteId}/meter-data/preview': () => ({ head: meterCsv(1), truncated: false, mapping: validMeterMapping(), dateOrder: 'ymd' }),
  'POST /api/sites/{siteId}/bills': () => ({ periodStart: '2025-03-01', periodEnd: '2025-03-31', kwh: 41000, billedDemand: 410, billedDemandUnit: 'kW', kvarh: 24000, powerFactor: 0.86, pfCharge: 120.5, total: 5400, currency: 'USD' }),
  'POST /api/sites/{siteId}/plans/evaluate': validPlan,
  'POST /api/sites/{siteId}/plans': validPlan,
  'PUT /api/sites/{siteId}/plans/{planId}': validPlan,
  'POST /api/sites/{siteId}/reports': () => ({ planId: 'pln_placeholder', title: 'Bad-input check report' }),
  'POST /api/purchases': () => ({ siteIds: ['site_placeholder'] }),
};

/** Multipart routes whose `mapping` field is JSON, with a valid mapping and file. */
export const VALID_MULTIPART: Record<string, { mapping?: () => Record<string, unknown>; file: () => { name: string; content: string } }> = {
  'POST /api/sites/{siteId}/meter-data': { mapping: validMeterMapping, file: () => ({ name: 'meter.csv', content: meterCsv(2) }) },
  'POST /api/sites/{siteId}/bills/import': { mapping: validBillMapping, file: () => ({ name: 'bills.csv', content: billCsv() }) },
  'POST /api/sites/{siteId}/bills/{billId}/document': { file: () => ({ name: 'bill.pdf', content: '%PDF-1.4\n% invented\n' }) },
};

/** Routes whose body is not ours to shape: answered by their own rules (the signed webhook). */
export const SIGNED_BODY_ROUTES = new Set(['POST /api/payments/webhook']);

/** Plain objects (and objects in arrays) inside a value, by dotted path ('' is the value itself). */
export function nestedObjectPaths(value: unknown, path: string[] = []): string[][] {
  const out: string[][] = [];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...nestedObjectPaths(v, [...path, String(i)])));
  else if (value && typeof value === 'object') {
    out.push(path);
    for (const [k, v] of Object.entries(value)) out.push(...nestedObjectPaths(v, [...path, k]));
  }
  return out;
}

/** A deep copy of `value` with `fn` applied to the object at `path`. */
export function atPath<T>(value: T, path: string[], fn: (o: Record<string, unknown>) => unknown): T {
  const copy = structuredClone(value) as unknown;
  if (path.length === 0) return fn(copy as Record<string, unknown>) as T;
  let cur = copy as Record<string, unknown>;
  for (const k of path.slice(0, -1)) cur = cur[k] as Record<string, unknown>;
  const last = path.at(-1)!;
  cur[last] = fn(cur[last] as Record<string, unknown>);
  return copy as T;
}

/** A value of another JSON type than `v`, one that no schema coerces back. */
export const wrongType = (v: unknown) => (typeof v === 'string' ? 12345 : 'not-the-right-type');
