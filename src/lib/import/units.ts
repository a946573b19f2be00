/**
 * Unit scaling for meter channels and the meter multiplier. Every channel is turned
 * into kilo-units (kWh, kvarh, kVAh per interval, or kW, kvar, kVA for demand).
 */

export interface UnitInfo {
  /** Factor to kilo-units: W -> 0.001, kW -> 1, MW -> 1000. */
  toKilo: number;
  /** Energy per interval (Wh family) or average demand (W family). */
  kind: 'energy' | 'demand';
}

const PREFIX: Record<string, number> = { '': 0.001, k: 1, M: 1000 };

/** Factor and kind of a unit such as `MWh`, `kvar` or `VA`. Throws on an unknown unit (mapping schema prevents it). */
export function unitInfo(unit: string): UnitInfo {
  const m = /^(k|M)?(W|var|VA)(h)?$/.exec(unit);
  if (!m) throw new RangeError(`Unknown unit "${unit}".`);
  return { toKilo: PREFIX[m[1] ?? ''], kind: m[3] ? 'energy' : 'demand' };
}

/**
 * Meter multiplier from a CT ratio and a PT (VT) ratio written as `primary:secondary`,
 * e.g. 800:5 and 480:120 give 160 x 4 = 640. Returns null when a ratio is unreadable.
 */
export function meterMultiplier(ctRatio: string, ptRatio = '1:1'): number | null {
  const ct = readRatio(ctRatio);
  const pt = readRatio(ptRatio);
  if (ct === null || pt === null) return null;
  return ct * pt;
}

function readRatio(text: string): number | null {
  const m = /^\s*(\d+(?:\.\d+)?)\s*[:/]\s*(\d+(?:\.\d+)?)\s*$/.exec(text);
  if (!m) return null;
  const a = Number(m[1]);
  const b = Number(m[2]);
  return a > 0 && b > 0 ? a / b : null;
}

export type UnitFamily = 'active' | 'reactive' | 'apparent';

export interface HeaderUnit {
  family: UnitFamily;
  /** Canonical unit spelling, e.g. `kvarh`. */
  unit: string;
  kind: 'energy' | 'demand';
}

/**
 * Finds a unit token in a header cell: `Energy (MWh)`, `kvarh_lag`, `Demand [W]`.
 * Case-insensitive for the base unit; the prefixes `k` and `M` are read either case
 * (no meter exports milliwatt-hours).
 */
export function unitFromHeader(header: string): HeaderUnit | null {
  const re = /(?:^|[^a-z])([km]?)(varh|var|vah|va|wh|w)(?![a-z])/gi;
  let m: RegExpExecArray | null;
  while ((m = re.exec(header)) !== null) {
    const prefix = m[1] === '' ? '' : m[1].toLowerCase() === 'k' ? 'k' : 'M';
    const base = m[2].toLowerCase();
    const family: UnitFamily = base.startsWith('var') ? 'reactive' : base.startsWith('va') ? 'apparent' : 'active';
    const kind = base.endsWith('h') ? 'energy' : 'demand';
    const canonical = family === 'reactive' ? 'var' : family === 'apparent' ? 'VA' : 'W';
    return { family, unit: `${prefix}${canonical}${kind === 'energy' ? 'h' : ''}`, kind };
  }
  return null;
}
