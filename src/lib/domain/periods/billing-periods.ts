import { DateTime } from 'luxon';
import { fail, ok, type Issue, type Result } from '../result';
import { isKnownZone } from '../series/zone-offsets';
import type { Period } from './period';

/** A billing period as printed on a bill: both dates inclusive, local dates. */
export interface BillingRange {
  /** First day, `YYYY-MM-DD`. */
  from: string;
  /** Last day, `YYYY-MM-DD`, inclusive (bills print the last day read). */
  to: string;
  label?: string;
}

/**
 * Billing periods from bill date ranges. Each runs from local midnight of `from` to
 * local midnight after `to`. Ranges must be in order and must not overlap; a gap
 * between bills is allowed and reported as a warning.
 */
export function billingPeriods(ranges: readonly BillingRange[], zone: string): Result<Period[]> {
  if (!isKnownZone(zone)) return fail([{ code: 'zone-unknown', message: `Unknown time zone "${zone}". Use an IANA name such as Australia/Sydney.` }]);
  const errors: Issue[] = [];
  const warnings: Issue[] = [];
  const periods: Period[] = [];
  ranges.forEach((r, index) => {
    const start = DateTime.fromISO(r.from, { zone });
    const last = DateTime.fromISO(r.to, { zone });
    if (!start.isValid || !last.isValid || r.from.length !== 10 || r.to.length !== 10) {
      errors.push({ code: 'date-invalid', message: `Billing period ${index + 1}: dates must look like 2025-01-15 (got "${r.from}" to "${r.to}").`, index });
      return;
    }
    if (last < start) {
      errors.push({ code: 'range-reversed', message: `Billing period ${index + 1}: ${r.to} is before ${r.from}.`, index });
      return;
    }
    const startMs = start.startOf('day').toMillis();
    const endMs = last.plus({ days: 1 }).startOf('day').toMillis();
    const prev = periods[periods.length - 1];
    if (prev && startMs < prev.endMs) {
      errors.push({ code: 'range-overlap', message: `Billing period ${index + 1} (${r.from}) starts before period ${index} ends. Bills must be in date order without overlap.`, index });
      return;
    }
    if (prev && startMs > prev.endMs) {
      warnings.push({ code: 'range-gap', message: `No billing period covers the days between period ${index} and period ${index + 1}.`, index });
    }
    periods.push({
      id: `${r.from}..${r.to}`,
      label: r.label ?? `${start.setLocale('en').toFormat('d LLL yyyy')} – ${last.setLocale('en').toFormat('d LLL yyyy')}`,
      kind: 'billing',
      zone,
      startMs,
      endMs,
      hours: (endMs - startMs) / 3_600_000,
    });
  });
  return errors.length ? fail(errors, warnings) : ok(periods, warnings);
}
