/** Largest relative change of one quantity between two tables documents, and where it happened. */
export interface QuantityDrift {
  quantity: string;
  relative: number;
  where: string;
  before: unknown;
  after: unknown;
  /** Set when the key exists on one side only (a quantity one format has and the other lacks). */
  absent?: "before" | "after";
}

/** |a - b| / max(|a|, |b|); 0 when both are 0 (common practice for comparing floating-point results). */
export function relativeChange(a: number, b: number): number {
  if (a === b) return 0;
  const scale = Math.max(Math.abs(a), Math.abs(b));
  return scale === 0 ? 0 : Math.abs(a - b) / scale;
}

/**
 * Walks two JSON values of the same shape and returns, for each quantity (its key path with array indices
 * written as []), the largest relative change of its numbers. A number that became null, a changed string or a
 * changed shape counts as an infinite change. Subtrees named in `skip` (top-level keys) are not compared.
 */
export function tablesDrift(before: unknown, after: unknown, skip: readonly string[] = []): QuantityDrift[] {
  const worst = new Map<string, QuantityDrift>();
  const note = (
    quantity: string,
    relative: number,
    where: string,
    b: unknown,
    a: unknown,
    absent?: "before" | "after",
  ) => {
    const seen = worst.get(quantity);
    if (!seen || relative > seen.relative)
      worst.set(
        quantity,
        absent
          ? { quantity, relative, where, before: b, after: a, absent }
          : { quantity, relative, where, before: b, after: a },
      );
  };
  const walk = (b: unknown, a: unknown, quantity: string, where: string, depth: number): void => {
    if (typeof b === "number" && typeof a === "number") {
      note(quantity, relativeChange(b, a), where, b, a);
      return;
    }
    if (Array.isArray(b) && Array.isArray(a)) {
      if (b.length !== a.length) {
        note(`${quantity}[]`, Infinity, where, `${b.length} entries`, `${a.length} entries`);
        return;
      }
      for (let i = 0; i < b.length; i++) walk(b[i], a[i], `${quantity}[]`, `${where}[${i}]`, depth + 1);
      return;
    }
    if (b && a && typeof b === "object" && typeof a === "object") {
      const keys = new Set([...Object.keys(b), ...Object.keys(a)]);
      for (const k of [...keys].sort()) {
        if (depth === 0 && skip.includes(k)) continue;
        const q = quantity ? `${quantity}.${k}` : k;
        const w = where ? `${where}.${k}` : k;
        if (!(k in b) || !(k in a))
          note(
            q,
            Infinity,
            w,
            k in b ? (b as Record<string, unknown>)[k] : "(absent)",
            k in a ? (a as Record<string, unknown>)[k] : "(absent)",
            k in b ? "after" : "before",
          );
        else walk((b as Record<string, unknown>)[k], (a as Record<string, unknown>)[k], q, w, depth + 1);
      }
      return;
    }
    note(quantity, b === a ? 0 : Infinity, where, b, a);
  };
  walk(before, after, "", "", 0);
  return [...worst.values()].sort((x, y) => (x.quantity < y.quantity ? -1 : 1));
}
