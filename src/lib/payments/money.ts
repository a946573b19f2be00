/** Minor units to a display string, honouring each currency's number of decimals (JPY has none). */
export function formatMinor(amount: number, currency: string): string {
  const code = currency.toUpperCase();
  try {
    const f = new Intl.NumberFormat('en-GB', { style: 'currency', currency: code });
    const digits = f.resolvedOptions().maximumFractionDigits ?? 2;
    return f.format(amount / 10 ** digits);
  } catch {
    return `${(amount / 100).toFixed(2)} ${code}`;
  }
}
