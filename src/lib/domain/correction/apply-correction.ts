import { withReactive, type IntervalSeries } from '../series/interval-series';

/**
 * The corrected series for a bank's kvarh (one number for every interval or one per
 * interval). The bank's kvarh first cancels the interval's lagging kvarh; what is
 * left over becomes leading kvarh. The aggregation kernel applies the same rule
 * inline, so evaluating this series equals evaluating the correction directly.
 */
export function applyBankKvarh(series: IntervalSeries, bankKvarh: number | Float64Array): IntervalSeries {
  const n = series.length;
  const lag = new Float64Array(n);
  const lead = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const c = typeof bankKvarh === 'number' ? bankKvarh : bankKvarh[i];
    const l = series.kvarhLag[i];
    if (c <= l) {
      lag[i] = l - c;
      lead[i] = series.kvarhLead[i];
    } else {
      lag[i] = 0;
      lead[i] = series.kvarhLead[i] + (c - l);
    }
  }
  return withReactive(series, lag, lead);
}
