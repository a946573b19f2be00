/** Resolving mapped columns against a header row. */
import type { ColumnRef } from './mapping-schema';

export interface HeaderIndex {
  /** Header cells as written (trimmed), or `column N` labels when the file has no header. */
  labels: string[];
  find(ref: ColumnRef): number;
}

/** Lower-cased, trimmed, inner spaces collapsed: how header names are compared. */
export function normaliseHeader(text: string): string {
  return text.trim().replace(/^"(.*)"$/, '$1').trim().replace(/\s+/g, ' ').toLowerCase();
}

/** Builds the lookup for a header row (`cells`), or for a header-less file of `width` columns. */
export function headerIndex(cells: string[] | null, width: number): HeaderIndex {
  const labels = cells ? cells.map((c) => c.trim().replace(/^"(.*)"$/, '$1').trim()) : Array.from({ length: width }, (_, i) => `column ${i + 1}`);
  const byName = new Map<string, number>();
  labels.forEach((l, i) => {
    const key = normaliseHeader(l);
    if (key && !byName.has(key)) byName.set(key, i);
  });
  return {
    labels,
    find(ref) {
      if (typeof ref === 'number') return ref <= labels.length ? ref - 1 : -1;
      return byName.get(normaliseHeader(ref)) ?? -1;
    },
  };
}

/** How a column reference is written in messages. */
export function refLabel(ref: ColumnRef): string {
  return typeof ref === 'number' ? `column ${ref}` : `"${ref}"`;
}
