import type { Period } from '../periods/period';
import type { WindowAggregate } from '../power/window-aggregate';

/** Amounts taken from a bill when a rule's base is not computed by the engine. */
export interface EnteredAmounts {
  energyCharge?: number;
  demandCharge?: number;
  totalBill?: number;
}

/** Values a rule remembers per period for ratchets (e.g. demand and adjusted demand). */
export type RuleMemory = Readonly<Record<string, number>>;

/** What a rule sees when it evaluates one period. */
export interface RuleInput {
  /** Aggregates of the period inside the rule's window. */
  agg: WindowAggregate;
  period: Period;
  currency: string;
  /** Memories of earlier periods, oldest first (entered history, then evaluated periods). */
  memory: readonly RuleMemory[];
  amounts?: EnteredAmounts;
}

export type RuleStatus = 'charge' | 'credit' | 'none' | 'not-applicable' | 'needs-input';

/** One rule's outcome for one period. `amount` > 0 is a charge, < 0 a credit. */
export interface RuleOutcome {
  amount: number;
  status: RuleStatus;
  /** The quantities used, with units in the keys (`peakKw`, `billableKvar`). */
  quantities: Record<string, number | null>;
  /**
   * The formula with the numbers filled in. A function so that the sizing search,
   * which evaluates the tariff hundreds of times, only formats text when asked.
   */
  explain: () => string;
  /** Stored for later periods' ratchets. */
  memory?: RuleMemory;
}

/** Highest value of `key` over the last `lookback` memories, and how many were there. */
export function ratchetFloor(memory: readonly RuleMemory[], key: string, lookback: number): { max: number; used: number } {
  const recent = memory.slice(-lookback).filter((m) => Number.isFinite(m[key]));
  return { max: recent.reduce((acc, m) => Math.max(acc, m[key]), 0), used: recent.length };
}
