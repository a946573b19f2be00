/**
 * Validation results. Engine validators return these instead of throwing so the
 * web layer can show every problem at once (upload reports, tariff forms).
 */
export interface Issue {
  /** Stable machine code, e.g. `stamps-not-increasing`. */
  code: string;
  /** Plain sentence saying what is wrong and what to do next. */
  message: string;
  /** Position in the input (row, range, rule) when there is one. */
  index?: number;
}

export type Result<T> =
  | { ok: true; value: T; warnings: Issue[] }
  | { ok: false; errors: Issue[]; warnings: Issue[] };

/** Builds a success result. */
export function ok<T>(value: T, warnings: Issue[] = []): Result<T> {
  return { ok: true, value, warnings };
}

/** Builds a failure result. */
export function fail<T>(errors: Issue[], warnings: Issue[] = []): Result<T> {
  return { ok: false, errors, warnings };
}

/**
 * Unwraps a result or throws with every error message joined. For tests, scripts and
 * callers that have already validated their input.
 */
export function unwrap<T>(result: Result<T>): T {
  if (result.ok) return result.value;
  throw new Error(result.errors.map((e) => e.message).join('\n'));
}
