/** Display formatting for figures (the engine keeps full precision; only screens round). */

export function num(x: number | null | undefined, decimals = 0): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  return x.toLocaleString('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
}

export function money(x: number | null | undefined, currency: string | null | undefined, decimals = 2): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  try {
    return x.toLocaleString('en-US', { style: 'currency', currency: currency ?? 'USD', minimumFractionDigits: decimals, maximumFractionDigits: decimals });
  } catch {
    return `${num(x, decimals)} ${currency ?? ''}`.trim();
  }
}

/** PF to three decimals with its sense, e.g. "0.874 lag". */
export function pf(x: number | null | undefined, sense?: 'lag' | 'lead' | 'unity' | null): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  return `${x.toFixed(3)}${sense && sense !== 'unity' ? ` ${sense}` : ''}`;
}

export function pct(x: number | null | undefined, decimals = 1): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  return `${(x * 100).toFixed(decimals)} %`;
}

/** A local date-time in the site's zone, e.g. "14 Mar 2026 09:45". */
export function localTime(ms: number | null | undefined, zone: string): string {
  if (ms === null || ms === undefined) return '—';
  return new Intl.DateTimeFormat('en-GB', { timeZone: zone, day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hour12: false }).format(new Date(ms));
}

export function bytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}
