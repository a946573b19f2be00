/**
 * Our wording for the tariff editor: field labels, units, readable choices and typical
 * starting figures. Keyed by the field's key, or by `parent.key` where one key means
 * different things in different places (a rounding `mode` against a kVA billing `mode`).
 */

/** Labels; the generic fallback turns `camelCase` into words. */
const LABELS: Record<string, string> = {
  name: 'Version name',
  currency: 'Currency',
  effectiveFrom: 'In force from',
  demandWindowMinutes: 'Demand window',
  demandMethod: 'Demand method',
  holidays: 'Holidays',
  'rules.id': 'Rule id',
  'rules.name': 'Name on reports',
  window: 'Only in a time-of-use window',
  'window.name': 'Window name',
  weekdays: 'Weekdays',
  months: 'Months',
  timeRanges: 'Daily time ranges',
  from: 'From',
  to: 'To',
  'window.holidays': 'On holidays',
  targetPf: 'Target PF',
  pfBasis: 'PF basis',
  kvarhBasis: 'kvarh basis',
  pfRounding: 'Round the measured PF',
  decimals: 'Decimals',
  'pfRounding.mode': 'Rounding direction',
  formula: 'Adjustment formula',
  percentPerPoint: 'Increase per PF point',
  pointRounding: 'Rounding of points',
  maxIncreasePct: 'Cap on the increase',
  demandRatePerKw: 'Demand rate',
  demandDecimals: 'kW decimals before pricing',
  ratchet: 'Demand ratchet',
  fraction: 'Ratchet share',
  lookbackPeriods: 'Look-back periods',
  order: 'Order of PF adjustment and ratchet',
  mode: 'Billed demand',
  kvaShare: 'Share of peak kVA',
  reference: 'PF cost measured against',
  demandRate: 'Demand rate',
  allowance: 'Reactive allowance',
  basis: 'Allowance given as',
  'ratchet.basis': 'Earlier periods count with',
  pf: 'Allowance PF',
  kvarPerKw: 'Free kvar per kW',
  kvarSource: 'kvar reading',
  ratePerKvar: 'Rate per kvar',
  pricing: 'Pricing of billable kvarh',
  kind: 'Priced',
  ratePerKvarh: 'Rate per kvarh',
  bands: 'PF bands',
  pfBelow: 'When PF is below',
  base: 'Base of the percentage',
  source: 'Base',
  ratePerKwh: 'Energy price',
  ratePerKw: 'Demand price',
  field: 'Amount from the bill',
  thresholdPf: 'Threshold PF',
  stepPf: 'PF step',
  stepRounding: 'Rounding of steps',
  tiers: 'Surcharge tiers',
  downToPf: 'Down to PF',
  pctPerStep: 'Percent per step',
  credit: 'Credit for a high PF',
  abovePf: 'Credit above PF',
  maxPct: 'Credit cap',
  'credit.pctPerStep': 'Credit per step',
  'credit.stepRounding': 'Rounding of credit steps',
  condition: 'Charged',
};

/** What one row of a list is called, for its Add and Remove buttons. */
const NOUNS: Record<string, string> = { timeRanges: 'time range', tiers: 'tier', bands: 'band', holidays: 'holiday' };

export function nounFor(path: string): string {
  return lookup(NOUNS, path) ?? labelFor(path).replace(/s$/, '').toLowerCase();
}

/** Unit after the input; `{c}` is the tariff currency. */
const UNITS: Record<string, string> = {
  demandWindowMinutes: 'min',
  percentPerPoint: '% per point',
  maxIncreasePct: '%',
  demandRatePerKw: '{c}/kW',
  demandRate: '{c}/unit',
  kvarPerKw: 'kvar/kW',
  ratePerKvar: '{c}/kvar',
  ratePerKvarh: '{c}/kvarh',
  ratePerKwh: '{c}/kWh',
  ratePerKw: '{c}/kW',
  pctPerStep: '% per step',
  maxPct: '%',
  lookbackPeriods: 'periods',
};

/** Readable choices, by field key then value. */
const OPTIONS: Record<string, Record<string, string>> = {
  demandMethod: { block: 'Block (clock-aligned)', rolling: 'Rolling (every interval)' },
  pfBasis: { average: 'Period average (from kWh and kvarh)', 'at-peak': 'PF at the kW peak' },
  kvarhBasis: { lagging: 'Lagging only (leading ignored)', net: 'Net: lagging minus leading', absolute: 'Absolute: lagging plus leading' },
  'pfRounding.mode': { nearest: 'To the nearest', down: 'Down', up: 'Up' },
  pointRounding: { nearest: 'To the nearest point', down: 'Down to a whole point', up: 'Up to a whole point', exact: 'Exact (part points count)' },
  stepRounding: { nearest: 'To the nearest step', down: 'Down to a whole step', up: 'Up to a whole step', exact: 'Exact (part steps count)' },
  formula: { ratio: 'Demand × target ÷ PF', linear: 'Demand × (1 + target − PF)', 'per-point': 'A percentage per PF point below target' },
  order: { 'adjust-then-ratchet': 'Adjust each month, then apply the ratchet', 'ratchet-then-adjust': 'Apply the ratchet, then adjust' },
  mode: { 'peak-kva': 'Peak kVA', 'kw-over-average-pf': 'Peak kW ÷ average PF', 'greater-of-kw-or-kva-share': 'Greater of peak kW and a share of peak kVA' },
  reference: { unity: 'Unity PF (1.00)', 'target-pf': 'A target PF' },
  basis: { pf: 'A power factor', ratio: 'kvar per kW' },
  'ratchet.basis': { measured: 'Their measured demand', billed: 'Their billed demand (ratchet included)' },
  kvarSource: { coincident: 'At the kW peak (same reading)', 'period-max': 'Highest kvar of the period' },
  kind: { flat: 'At one rate', 'pf-bands': 'By PF band' },
  source: { 'energy-rate': 'Energy charge (kWh × price)', 'demand-rate': 'Demand charge (peak kW × price)', 'entered-amount': 'An amount entered from the bill' },
  field: { energyCharge: 'Energy charge', demandCharge: 'Demand charge', totalBill: 'Bill total' },
  condition: { 'any-load': 'On all leading kvarh', 'zero-kw-only': 'Only while kW is zero' },
  'window.holidays': { ignore: 'Treated like other days', exclude: 'Left out of the window', 'whole-day': 'In the window all day' },
};

/** Typical figures a new field starts with (each within the schema's bounds). */
export const START_VALUES: Record<string, unknown> = {
  targetPf: 0.9,
  thresholdPf: 0.95,
  pf: 0.9,
  kvarPerKw: 0.4843,
  fraction: 0.8,
  decimals: 2,
  abovePf: 0.97,
  pctPerStep: 0.5,
  maxPct: 1,
  pfBelow: 0.95,
  from: '07:00',
  to: '19:00',
};

/** Field keys without array indices, e.g. `rules.0.window.holidays` -> ['rules', 'window', 'holidays']. */
function keys(path: string): string[] {
  return path.split('.').filter((p) => !/^\d+$/.test(p));
}

function lookup<T>(table: Record<string, T>, path: string): T | undefined {
  const k = keys(path);
  const pair = k.slice(-2).join('.');
  return table[pair] ?? table[k.at(-1) ?? ''];
}

export function labelFor(path: string): string {
  const found = lookup(LABELS, path);
  if (found) return found;
  const key = keys(path).at(-1) ?? path;
  const words = key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

export function unitFor(path: string, currency: string): string | undefined {
  return lookup(UNITS, path)?.replace('{c}', currency);
}

export function optionLabel(path: string, value: string): string {
  return lookup(OPTIONS, path)?.[value] ?? value;
}

const DAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** Labels of the items of a small integer set (weekdays 1..7, months 1..12). */
export function setItemLabel(path: string, n: number): string {
  const key = keys(path).at(-1);
  if (key === 'weekdays') return DAYS[n - 1] ?? String(n);
  if (key === 'months') return MONTHS[n - 1] ?? String(n);
  return String(n);
}

/**
 * Fields that only matter for some choices of their rule; hidden otherwise (their value is
 * kept, and the engine ignores it).
 */
export const RELEVANT: Record<string, (parent: Record<string, unknown>) => boolean> = {
  percentPerPoint: (p) => p.formula === 'per-point',
  pointRounding: (p) => p.formula === 'per-point',
  kvaShare: (p) => p.type !== 'kva-billing-demand' || p.mode === 'greater-of-kw-or-kva-share',
  targetPf: (p) => p.type !== 'kva-billing-demand' || p.reference === 'target-pf',
};

/** Zod's generic messages in plain words; the engine's own messages pass through. */
export function readableError(message: string | undefined): string | undefined {
  if (!message) return message;
  if (/expected number, received/.test(message)) return 'Enter a number.';
  if (/expected string, received undefined/.test(message)) return 'Required.';
  const m = /^Too (?:small|big): expected (number|string|array) to (?:be|have) ([<>]=?)([^\s]+)/.exec(message);
  if (!m) return message;
  const [, what, op, n] = m;
  if (what === 'string' && op === '>=' && n === '1') return 'Required.';
  if (what === 'array' && op === '>=') return `Add at least ${n}.`;
  if (what === 'string') return op!.startsWith('<') ? `At most ${n} characters.` : `At least ${n} characters.`;
  const text = { '>': `Must be more than ${n}.`, '>=': `Must be ${n} or more.`, '<': `Must be less than ${n}.`, '<=': `Must be ${n} or less.` }[op!];
  return text ?? message;
}
