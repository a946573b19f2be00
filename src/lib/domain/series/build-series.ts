import { fail, ok, type Issue, type Result } from '../result';
import { SeriesFlag, type IntervalSeries } from './interval-series';

/** Reactive input: two registers, one net signed channel (+ lagging), or none. */
export type ReactiveInput =
  | { kind: 'registers'; lag: ArrayLike<number>; lead: ArrayLike<number> }
  | { kind: 'net'; net: ArrayLike<number> }
  | { kind: 'none' };

export interface SeriesInput {
  /** Meter interval in minutes. */
  intervalMinutes: number;
  /** UTC epoch milliseconds, one per interval. */
  stamps: ArrayLike<number>;
  /** Whether each stamp marks the start (default) or the end of its interval. */
  stampAt?: 'start' | 'end';
  /** Active values; NaN marks a missing reading (the interval is dropped and counted). */
  active: ArrayLike<number>;
  /** `kWh` per interval (default) or average `kW` over the interval. */
  activeUnit?: 'kWh' | 'kW';
  reactive: ReactiveInput;
  /** `kvarh` per interval (default) or average `kvar`. */
  reactiveUnit?: 'kvarh' | 'kvar';
  /** Optional per-interval estimated markers from the source. */
  estimated?: ArrayLike<boolean | number>;
}

const MAX_ERRORS = 20;

/**
 * Validates raw interval arrays and packs them into an `IntervalSeries`.
 * Stamps must be strictly increasing and at least one interval apart (gaps are allowed
 * and show up as incomplete periods). A missing kW reading drops the interval; a
 * missing reactive reading keeps it with `SeriesFlag.reactiveMissing` set. Nothing is
 * filled silently: every drop or flag is reported in `warnings`.
 */
export function buildSeries(input: SeriesInput): Result<IntervalSeries> {
  const errors: Issue[] = [];
  const warnings: Issue[] = [];
  const { intervalMinutes, stamps, active } = input;
  if (!Number.isInteger(intervalMinutes) || intervalMinutes < 1 || intervalMinutes > 1440) {
    return fail([{ code: 'interval-invalid', message: `Interval length ${intervalMinutes} min is not a whole number of minutes between 1 and 1440.` }]);
  }
  const n = stamps.length;
  const lengthIssue = checkLengths(input, n);
  if (lengthIssue) return fail([lengthIssue]);

  const stepMs = intervalMinutes * 60_000;
  const shiftMs = input.stampAt === 'end' ? -stepMs : 0;
  const toEnergy = input.activeUnit === 'kW' ? intervalMinutes / 60 : 1;
  const toReactiveEnergy = input.reactiveUnit === 'kvar' ? intervalMinutes / 60 : 1;

  const startMs = new Float64Array(n);
  const kwh = new Float64Array(n);
  const lagOut = new Float64Array(n);
  const leadOut = new Float64Array(n);
  const flags = new Uint8Array(n);
  let kept = 0;
  let droppedActive = 0;
  let reactiveMissing = 0;
  let previous = -Infinity;

  for (let i = 0; i < n; i++) {
    const t = Number(stamps[i]) + shiftMs;
    if (!Number.isFinite(t)) {
      pushLimited(errors, { code: 'stamp-invalid', message: `Row ${i + 1}: the timestamp is not a valid instant.`, index: i });
      continue;
    }
    if (t - previous < stepMs) {
      const what = t <= previous ? 'is not later than the one before' : `is less than ${intervalMinutes} min after the one before`;
      pushLimited(errors, { code: 'stamps-not-increasing', message: `Row ${i + 1}: the timestamp ${what}. Sort the file and remove duplicate rows.`, index: i });
      continue;
    }
    previous = t;
    const a = Number(active[i]);
    if (!Number.isFinite(a)) {
      droppedActive++;
      continue;
    }
    const [lag, lead, missing] = readReactive(input.reactive, i);
    if (lag < 0 || lead < 0) {
      pushLimited(errors, { code: 'register-negative', message: `Row ${i + 1}: a kvarh register is negative. Use a net signed channel instead of registers.`, index: i });
      continue;
    }
    startMs[kept] = t;
    kwh[kept] = a * toEnergy;
    lagOut[kept] = lag * toReactiveEnergy;
    leadOut[kept] = lead * toReactiveEnergy;
    let f = 0;
    if (missing) {
      f |= SeriesFlag.reactiveMissing;
      reactiveMissing++;
    }
    if (input.estimated && Number(input.estimated[i])) f |= SeriesFlag.estimated;
    flags[kept] = f;
    kept++;
  }
  if (errors.length) return fail(errors);
  if (droppedActive) warnings.push({ code: 'active-missing', message: `${droppedActive} interval(s) had no kW value and were left out; their periods show as incomplete.` });
  if (reactiveMissing) warnings.push({ code: 'reactive-missing', message: `${reactiveMissing} interval(s) had no kvarh value; they count as 0 kvarh and make average PF look better than it was.` });
  if (input.reactive.kind === 'net') warnings.push({ code: 'reactive-net-only', message: 'Reactive energy came as one net channel: lagging and leading kvarh within the same interval cannot be told apart.' });
  if (input.reactive.kind === 'none') warnings.push({ code: 'reactive-absent', message: 'No reactive channel: PF figures cannot be computed from this data.' });

  return ok(
    {
      intervalMinutes,
      length: kept,
      startMs: startMs.slice(0, kept),
      kwh: kwh.slice(0, kept),
      kvarhLag: lagOut.slice(0, kept),
      kvarhLead: leadOut.slice(0, kept),
      flags: flags.slice(0, kept),
      reactiveSource: input.reactive.kind === 'registers' ? 'registers' : input.reactive.kind,
    },
    warnings,
  );
}

function checkLengths(input: SeriesInput, n: number): Issue | null {
  const lengths: [string, number][] = [['active', input.active.length]];
  const r = input.reactive;
  if (r.kind === 'registers') lengths.push(['lagging kvarh', r.lag.length], ['leading kvarh', r.lead.length]);
  if (r.kind === 'net') lengths.push(['net kvarh', r.net.length]);
  if (input.estimated) lengths.push(['estimated', input.estimated.length]);
  const bad = lengths.find(([, len]) => len !== n);
  return bad ? { code: 'length-mismatch', message: `${n} timestamps but ${bad[1]} ${bad[0]} values: every channel needs one value per interval.` } : null;
}

function readReactive(r: ReactiveInput, i: number): [number, number, boolean] {
  if (r.kind === 'none') return [0, 0, true];
  if (r.kind === 'net') {
    const q = Number(r.net[i]);
    if (!Number.isFinite(q)) return [0, 0, true];
    return q >= 0 ? [q, 0, false] : [0, -q, false];
  }
  const lag = Number(r.lag[i]);
  const lead = Number(r.lead[i]);
  if (!Number.isFinite(lag) || !Number.isFinite(lead)) return [0, 0, true];
  return [lag, lead, false];
}

function pushLimited(list: Issue[], issue: Issue): void {
  if (list.length < MAX_ERRORS) list.push(issue);
}
