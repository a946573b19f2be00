/** fast-check arbitraries that break a valid value a little: a field deleted, replaced, added or pushed past a bound. */
import fc from 'fast-check';

type Path = (string | number)[];

/** Every path inside a JSON value, the value itself included. */
export function pathsOf(value: unknown, path: Path = []): Path[] {
  const out: Path[] = [path];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...pathsOf(v, [...path, i])));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) out.push(...pathsOf(v, [...path, k]));
  return out;
}

/** Numbers and strings at and past the edges that schemas bound (PF 1, 0, negatives, huge, tiny, dates, times). */
export const edgeValue = fc.oneof(
  fc.constantFrom(0, -0, 1, -1, 1.0000001, 0.9999999, 0.5, 100, 500, -500, 1e6, 1e6 + 1, 1e9, 1e300, -1e300, 5e-324, Number.MAX_SAFE_INTEGER, 2 ** 53 + 1, 1440, 1441, 32, 33),
  fc.constantFrom('', ' ', 'x'.repeat(121), '2025-02-30', '2024-02-29', '0000-01-01', '9999-12-31', '24:00', '23:59', '24:01', '00:00', 'USD', 'usd', 'ZZZ', '\u0000', '🙂', '__proto__', 'constructor', 'NaN', 'Infinity', '1e999'),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -2000, max: 2000 }),
);

const anyJson = fc.oneof({ weight: 3, arbitrary: edgeValue }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) });

type Mutation = { op: 'delete' | 'replace' | 'add'; at: number; value: unknown; key: string };
const mutation: fc.Arbitrary<Mutation> = fc.record({
  op: fc.constantFrom('delete', 'replace', 'replace', 'add'),
  at: fc.nat(),
  value: anyJson,
  // Not the names of Object.prototype members: fromZod drops those (see the known-bug test in schemas.test.ts).
  key: fc.oneof(fc.constantFrom('zzUnknown', 'id', 'type', 'kind', 'proto', '__defineX'), fc.string({ maxLength: 8 })).filter((k) => !(k in Object.prototype)),
});

function apply(value: unknown, m: Mutation): unknown {
  const paths = pathsOf(value);
  const path = paths[m.at % paths.length]!;
  const root = structuredClone(value);
  if (path.length === 0) return m.op === 'add' && root && typeof root === 'object' && !Array.isArray(root) ? Object.defineProperty(root, m.key, { value: m.value, enumerable: true, configurable: true, writable: true }) : m.value;
  let parent = root as Record<string | number, unknown>;
  for (const k of path.slice(0, -1)) parent = parent[k] as Record<string | number, unknown>;
  const last = path.at(-1)!;
  if (m.op === 'delete') {
    if (Array.isArray(parent)) parent.splice(Number(last), 1);
    else delete parent[last];
  } else if (m.op === 'add') {
    const target = parent[last];
    if (target && typeof target === 'object' && !Array.isArray(target)) Object.defineProperty(target, m.key, { value: m.value, enumerable: true, configurable: true, writable: true });
    else if (Array.isArray(target)) target.push(m.value);
    else parent[last] = m.value;
  } else parent[last] = m.value;
  return root;
}

/** A valid value with one to three mutations applied. */
export const mutated = (valid: () => unknown) => fc.array(mutation, { minLength: 1, maxLength: 3 }).map((ms) => ms.reduce(apply, valid()));
