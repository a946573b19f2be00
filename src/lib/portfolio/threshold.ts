/** The PF a tariff is judged against: its first rule's target, threshold or PF allowance; 0.90 otherwise (common practice). */
export function tariffThreshold(definition: unknown): number {
  const rules = (definition as { rules?: Record<string, unknown>[] } | null)?.rules ?? [];
  for (const r of rules) {
    if (typeof r.targetPf === 'number') return r.targetPf;
    if (typeof r.thresholdPf === 'number') return r.thresholdPf;
    const a = r.allowance as { basis?: string; pf?: number; kvarPerKw?: number } | undefined;
    if (a?.basis === 'pf' && typeof a.pf === 'number') return a.pf;
    if (a?.basis === 'ratio' && typeof a.kvarPerKw === 'number') return 1 / Math.hypot(1, a.kvarPerKw);
  }
  return 0.9;
}

