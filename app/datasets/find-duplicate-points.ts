/** A row whose key equals that of an earlier row; both as 0-based row indices. */
export interface DuplicatePoint {
  first: number;
  duplicate: number;
}

/**
 * Rows whose key repeats an earlier row's key, in file order. The key is `a[i]` alone, or
 * the pair `(a[i], b[i])` (a bin's edges). NaN marks a row to ignore (one that failed
 * validation). Sorting a copy of `a` finds candidates without a hash map over every row,
 * so a clean file of a million points costs one native sort.
 */
export function findDuplicatePoints(a: Float64Array, b: Float64Array | null, count: number): DuplicatePoint[] {
  const sorted = a.slice(0, count).sort();
  let repeated: Set<number> | null = null;
  for (let i = 1; i < count; i++) {
    if (sorted[i] === sorted[i - 1]) (repeated ??= new Set()).add(sorted[i]);
  }
  if (repeated === null) return [];
  const firstOf = new Map<string, number>();
  const found: DuplicatePoint[] = [];
  for (let i = 0; i < count; i++) {
    if (!repeated.has(a[i])) continue;
    if (b !== null && Number.isNaN(b[i])) continue;
    const key = b === null ? String(a[i]) : `${a[i]}|${b[i]}`;
    const first = firstOf.get(key);
    if (first === undefined) firstOf.set(key, i);
    else found.push({ first, duplicate: i });
  }
  return found;
}
