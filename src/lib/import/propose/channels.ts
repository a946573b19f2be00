/** Reading channel roles, units and meter labels from header cells. */
import { unitFromHeader, type HeaderUnit } from '../units';

export type ChannelRole = 'active' | 'lag' | 'lead' | 'net' | 'reactive' | 'q1' | 'q2' | 'q3' | 'q4' | 'apparent' | 'pf';

export interface HeaderChannel {
  role: ChannelRole;
  unit: HeaderUnit | null;
  /** What is left of the header once units and channel words are removed: the meter's name, or ''. */
  meterLabel: string;
}

const CHANNEL_WORDS =
  /\b(active|reactive|apparent|energy|import(ed)?|delivered|received|lagging|lag|leading|lead|inductive|capacitive|net|signed|demand|power|factor|pf|quadrant|q[1-4]|interval|total|consumption|usage|value|reading|kw|kwh|mw|mwh|w|wh|kvar|kvarh|mvar|mvarh|var|varh|kva|kvah|mva|mvah|va|vah|per|avg|average|data|channel)\b/gi;

/** The channel a header cell names, or null for a column that is not a meter channel. `unitCell` is a units-row cell when the file has one. */
export function headerChannel(header: string, unitCell = ''): HeaderChannel | null {
  const h = header.toLowerCase();
  const unit = unitFromHeader(header) ?? (unitCell ? unitFromHeader(unitCell) : null);
  const label = header
    .replace(/\([^)]*\)|\[[^\]]*\]/g, ' ')
    .replace(CHANNEL_WORDS, ' ')
    .replace(/[_\-:/|.,]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  const q = /\bq\s*([1-4])\b|quadrant\s*([1-4])/.exec(h);
  let role: ChannelRole | null = null;
  if (/\bpf\b|power[ _-]?factor|cos ?(phi|φ)/.test(h)) role = 'pf';
  else if (q) role = `q${q[1] ?? q[2]}` as ChannelRole;
  else {
    const family = unit?.family ?? (/kvar|reactive/.test(h) ? 'reactive' : /kva\b|apparent/.test(h) ? 'apparent' : /\bkw|active|energy|consumption|usage|import|demand|load/.test(h) ? 'active' : null);
    if (family === 'reactive') role = /lag|induct/.test(h) ? 'lag' : /lead|capac/.test(h) ? 'lead' : /\bnet\b|signed/.test(h) ? 'net' : 'reactive';
    else if (family === 'apparent') role = 'apparent';
    else if (family === 'active') role = 'active';
  }
  if (!role) return null;
  return { role, unit, meterLabel: label };
}

/** Header words that mark the meter-id column of a stacked multi-meter file. */
export function looksLikeMeterIdHeader(header: string): boolean {
  return /meter|device|serial|\bid\b|channel|point|register/i.test(header);
}

/** Header words that mark a timestamp that ends its interval, or begins it. */
export function stampAtHint(header: string): 'start' | 'end' | null {
  const h = header.toLowerCase();
  if (/\bend(s|ing)?\b|\bto\b|until|\bthrough\b/.test(h)) return 'end';
  if (/start|begin|\bfrom\b/.test(h)) return 'start';
  return null;
}

/** Header words that say which clock the stamps use. */
export function zoneHint(header: string): 'utc' | 'local' | null {
  const h = header.toLowerCase();
  if (/\butc\b|\bgmt\b|\bzulu\b/.test(h)) return 'utc';
  if (/local|wall/.test(h)) return 'local';
  return null;
}
