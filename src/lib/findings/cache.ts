/**
 * An in-process LRU of computed values, each entry held for one data stamp, with single-flight:
 * callers asking for the same key and stamp while it is being computed share that computation.
 * Bounded by entry count and by a byte budget (the caller says what a value weighs). A lookup
 * whose stamp differs from the stored one recomputes and replaces it; failures are not kept.
 * Values are deep-frozen when stored, so a caller that tried to change a shared result would
 * throw instead of quietly changing what the next caller sees.
 */

export type CacheLimits = { maxEntries: number; maxBytes: number };
export type CacheStats = { entries: number; bytes: number; hits: number; misses: number; shared: number; evictions: number; oversize: number };

type Entry<V> = { stamp: string; value: V; bytes: number };

export class StampedCache<V> {
  /** Map iteration order is insertion order: the first key is the least recently used. */
  private readonly entries = new Map<string, Entry<V>>();
  private readonly inflight = new Map<string, Promise<V>>();
  private bytes = 0;
  private readonly counts = { hits: 0, misses: 0, shared: 0, evictions: 0, oversize: 0 };

  constructor(
    private readonly limits: CacheLimits,
    private readonly weigh: (value: V) => number,
  ) {}

  /** The value for `key` at `stamp`, computed by `compute` only when no caller has it or is making it. */
  get(key: string, stamp: string, compute: () => Promise<V>): Promise<V> {
    const e = this.entries.get(key);
    if (e && e.stamp === stamp) {
      this.counts.hits++;
      this.entries.delete(key);
      this.entries.set(key, e);
      return Promise.resolve(e.value);
    }
    const flightKey = `${key}\u0001${stamp}`;
    const running = this.inflight.get(flightKey);
    if (running) {
      this.counts.shared++;
      return running;
    }
    this.counts.misses++;
    const p = (async () => {
      try {
        const value = deepFreeze(await compute());
        this.store(key, stamp, value);
        return value;
      } finally {
        this.inflight.delete(flightKey);
      }
    })();
    this.inflight.set(flightKey, p);
    return p;
  }

  private store(key: string, stamp: string, value: V) {
    this.drop(key);
    const bytes = this.weigh(value);
    if (bytes > this.limits.maxBytes) {
      this.counts.oversize++;
      return;
    }
    this.entries.set(key, { stamp, value, bytes });
    this.bytes += bytes;
    while (this.entries.size > this.limits.maxEntries || this.bytes > this.limits.maxBytes) {
      const oldest = this.entries.keys().next().value as string;
      this.drop(oldest);
      this.counts.evictions++;
    }
  }

  private drop(key: string) {
    const e = this.entries.get(key);
    if (!e) return;
    this.entries.delete(key);
    this.bytes -= e.bytes;
  }

  /** Forgets every entry (running computations finish and are stored). */
  clear() {
    this.entries.clear();
    this.bytes = 0;
  }

  stats(): CacheStats {
    return { entries: this.entries.size, bytes: this.bytes, ...this.counts };
  }
}

function deepFreeze<T>(v: T): T {
  if (v && typeof v === 'object' && !Object.isFrozen(v) && !ArrayBuffer.isView(v)) {
    Object.freeze(v);
    for (const x of Object.values(v as Record<string, unknown>)) deepFreeze(x);
  }
  return v;
}
