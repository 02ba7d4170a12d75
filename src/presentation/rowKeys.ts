/**
 * The keys of a table's rows: "label|unit", and "label|unit|n" for the n-th repetition of a pair. Pages write the
 * pair on each row (data-row) and a page script counts repetitions the same way (keysOfRows), so that the what-if
 * panel's cells find their rows.
 */
export function keysOfRows(pairs: readonly string[]): string[] {
  const seen = new Map<string, number>();
  return pairs.map((base) => {
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    return n === 0 ? base : `${base}|${n}`;
  });
}
export const rowKeys = (rows: readonly { label: string; unit: string }[]): string[] =>
  keysOfRows(rows.map((r) => `${r.label}|${r.unit}`));
