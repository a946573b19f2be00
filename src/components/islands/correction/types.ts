/** Shapes the correction island reads from the API (type-only imports of the server modules). */
export type { PlanEvaluation } from '@/lib/correction-plans/evaluate-plan';
export type { SizingResult } from '@/lib/correction-plans/sizing';
export type { PlanDto } from '@/lib/correction-plans/plans-store';
export type { PlanSpec, PlanSpecInput } from '@/lib/correction-plans/plan-spec';

/** Payback in years, or the words when it never pays back. */
export function years(x: number | null | undefined): string {
  if (x === null || x === undefined) return 'not paid back';
  return x.toFixed(1);
}

export function planTypeLabel(kind: 'fixed' | 'switched', steps: number | null | undefined, detuned?: boolean): string {
  const base = kind === 'fixed' ? 'Fixed bank' : `Switched bank (${steps ?? '?'} steps)`;
  return detuned ? `${base}, detuned` : base;
}
