/**
 * Decodes a form-encoded body the way the payment SDK encodes one: bracketed keys
 * (`line_items[0][price_data][currency]=usd`, `metadata[k]=v`) become nested objects, and an
 * object whose keys are all 0..n-1 becomes an array.
 */
export type FormValue = string | FormValue[] | { [k: string]: FormValue };

export function decodeForm(body: string): Record<string, FormValue> {
  const root: Record<string, FormValue> = {};
  for (const [key, value] of new URLSearchParams(body)) {
    const m = key.match(/^([^[\]]+)((?:\[[^\]]*\])*)$/);
    if (!m) continue;
    const path = [m[1]!, ...[...m[2]!.matchAll(/\[([^\]]*)\]/g)].map((x) => x[1]!)];
    let node: Record<string, FormValue> = root;
    for (let i = 0; i < path.length - 1; i++) {
      const k = path[i]!;
      const next = node[k];
      if (typeof next !== 'object' || next === null || Array.isArray(next)) node[k] = {};
      node = node[k] as Record<string, FormValue>;
    }
    node[path.at(-1)!] = value;
  }
  return toArrays(root) as Record<string, FormValue>;
}

function toArrays(v: FormValue): FormValue {
  if (typeof v === 'string' || Array.isArray(v)) return v;
  const keys = Object.keys(v);
  const fixed = Object.fromEntries(keys.map((k) => [k, toArrays(v[k]!)]));
  const indexed = keys.length > 0 && keys.every((k, i) => /^\d+$/.test(k)) && keys.map(Number).sort((a, b) => a - b).every((n, i) => n === i);
  return indexed ? keys.map(Number).sort((a, b) => a - b).map((n) => fixed[String(n)]!) : fixed;
}

/** Reads a string at a path of an object decoded above, or undefined. */
export function str(v: FormValue | undefined): string | undefined {
  return typeof v === 'string' ? v : undefined;
}
