import { describe, expect, it } from 'vitest';
import { StampedCache } from '../../../src/lib/findings/cache';

type V = { n: number; list: number[] };
const counting = () => {
  let calls = 0;
  const make = (n: number, delayMs = 0) => async (): Promise<V> => {
    calls++;
    if (delayMs) await new Promise((r) => setTimeout(r, delayMs));
    return { n, list: [n] };
  };
  return { make, calls: () => calls };
};
const cache = (maxEntries = 10, maxBytes = 1_000) => new StampedCache<V>({ maxEntries, maxBytes }, (v) => JSON.stringify(v).length);

describe('StampedCache', () => {
  it('computes once per key and stamp, and again when the stamp changes', async () => {
    const c = cache();
    const k = counting();
    expect((await c.get('a', 's1', k.make(1))).n).toBe(1);
    expect((await c.get('a', 's1', k.make(99))).n).toBe(1);
    expect(k.calls()).toBe(1);
    expect((await c.get('a', 's2', k.make(2))).n).toBe(2);
    expect(k.calls()).toBe(2);
    // The old stamp's value was replaced, not kept beside the new one.
    expect(c.stats().entries).toBe(1);
    expect((await c.get('a', 's1', k.make(3))).n).toBe(3);
  });

  it('shares one computation between concurrent callers of the same key and stamp', async () => {
    const c = cache();
    const k = counting();
    const all = await Promise.all(Array.from({ length: 20 }, () => c.get('a', 's', k.make(7, 20))));
    expect(k.calls()).toBe(1);
    expect(new Set(all).size).toBe(1);
    expect(c.stats()).toMatchObject({ misses: 1, shared: 19 });
  });

  it('does not share between different stamps or keys', async () => {
    const c = cache();
    const k = counting();
    const [a, b, d] = await Promise.all([c.get('a', 's1', k.make(1, 10)), c.get('a', 's2', k.make(2, 10)), c.get('b', 's1', k.make(3, 10))]);
    expect([a.n, b.n, d.n]).toEqual([1, 2, 3]);
    expect(k.calls()).toBe(3);
  });

  it('keeps no failure: waiters see the error and the next caller computes again', async () => {
    const c = cache();
    let calls = 0;
    const failing = async (): Promise<V> => {
      calls++;
      await new Promise((r) => setTimeout(r, 10));
      throw new Error('boom');
    };
    const results = await Promise.allSettled([c.get('a', 's', failing), c.get('a', 's', failing)]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected']);
    expect(calls).toBe(1);
    expect((await c.get('a', 's', async () => ({ n: 5, list: [] }))).n).toBe(5);
    expect(c.stats().entries).toBe(1);
  });

  it('evicts the least recently used entry beyond the entry bound', async () => {
    const c = cache(2);
    const k = counting();
    await c.get('a', 's', k.make(1));
    await c.get('b', 's', k.make(2));
    await c.get('a', 's', k.make(1)); // a is now the most recent
    await c.get('c', 's', k.make(3)); // evicts b
    expect(c.stats()).toMatchObject({ entries: 2, evictions: 1 });
    const before = k.calls();
    await c.get('a', 's', k.make(1));
    expect(k.calls()).toBe(before);
    await c.get('b', 's', k.make(2));
    expect(k.calls()).toBe(before + 1);
  });

  it('holds at most the byte budget and does not store a value larger than all of it', async () => {
    // {"n":1,"list":[1]} is 18 characters; a budget of 40 holds two.
    const c = cache(100, 40);
    await c.get('a', 's', async () => ({ n: 1, list: [1] }));
    await c.get('b', 's', async () => ({ n: 2, list: [2] }));
    await c.get('c', 's', async () => ({ n: 3, list: [3] }));
    expect(c.stats().entries).toBe(2);
    expect(c.stats().bytes).toBeLessThanOrEqual(40);
    const big = await c.get('d', 's', async () => ({ n: 4, list: Array.from({ length: 50 }, (_, i) => i) }));
    expect(big.list).toHaveLength(50);
    expect(c.stats()).toMatchObject({ entries: 2, oversize: 1 });
  });

  it('freezes stored values so a caller cannot change what the next caller gets', async () => {
    const c = cache();
    const v = await c.get('a', 's', async () => ({ n: 1, list: [1] }));
    expect(() => v.list.push(2)).toThrow(TypeError);
    expect(() => ((v as { n: number }).n = 2)).toThrow(TypeError);
    expect((await c.get('a', 's', async () => ({ n: 9, list: [] }))).list).toEqual([1]);
  });
});
