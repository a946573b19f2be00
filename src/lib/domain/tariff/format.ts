/**
 * Number formatting for explanations. Engine figures stay unrounded; only the text
 * rounds, so the explanation shows what a reader would check on a calculator.
 * Formatters are cached: building an Intl formatter per call would dominate the
 * sizing search, which evaluates the tariff hundreds of times.
 */

const numberFormats = new Map<number, Intl.NumberFormat>();
const moneyFormats = new Map<string, Intl.NumberFormat | null>();

function numberFormat(decimals: number): Intl.NumberFormat {
  let f = numberFormats.get(decimals);
  if (!f) {
    f = new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
    numberFormats.set(decimals, f);
  }
  return f;
}

function moneyFormat(currency: string, decimals: number): Intl.NumberFormat | null {
  const key = `${currency}:${decimals}`;
  let f = moneyFormats.get(key);
  if (f === undefined) {
    try {
      f = new Intl.NumberFormat('en-US', { style: 'currency', currency, minimumFractionDigits: decimals, maximumFractionDigits: decimals });
    } catch {
      f = null;
    }
    moneyFormats.set(key, f);
  }
  return f;
}

/** Fixed decimals with thousands separators: `1,250.00`. */
export function num(value: number, decimals = 2): string {
  return numberFormat(decimals).format(value);
}

/** PF with three decimals and its sense when known: `0.871`, `0.913 leading`. */
export function pfText(pf: number, sense?: 'lag' | 'lead' | 'unity'): string {
  const s = sense === 'lead' ? ' leading' : sense === 'lag' ? ' lagging' : '';
  return `${pf.toFixed(3)}${s}`;
}

/** Money in the tariff's currency: `$82.37`, `€1,204.50`. */
export function money(amount: number, currency: string): string {
  const f = moneyFormat(currency, 2);
  return f ? f.format(amount) : `${num(amount)} ${currency}`;
}

/** Rate per unit: `$23.80/kW`; small energy rates keep up to 5 decimals. */
export function rate(value: number, currency: string, unit: string): string {
  const decimals = Math.abs(value) < 1 ? Math.min(5, Math.max(2, significantDecimals(value))) : 2;
  const f = moneyFormat(currency, decimals);
  return f ? `${f.format(value)}/${unit}` : `${num(value, decimals)} ${currency}/${unit}`;
}

function significantDecimals(value: number): number {
  const text = value.toString();
  const dot = text.indexOf('.');
  return dot < 0 ? 0 : text.length - dot - 1;
}

/** Percent with up to two decimals: `5.5 %`. */
export function pct(value: number): string {
  return `${Number(value.toFixed(2))} %`;
}
