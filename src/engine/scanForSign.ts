import { brentRoot } from "./brentRoot.js";

/**
 * Walks u from `from` towards `to` in steps of `step` and returns the first u where g(u) <= 0, refined by Brent's
 * method between the last positive sample and that one; null when g stays positive. g(from) must be positive.
 * Grid scan plus bracketed root (common practice); two roots closer together than one step can be missed.
 */
export function firstNonPositive(g: (u: number) => number, from: number, to: number, step: number): number | null {
  const dir = to > from ? 1 : -1;
  const n = Math.ceil(Math.abs(to - from) / step);
  let uPrev = from;
  for (let i = 1; i <= n; i++) {
    const u = i === n ? to : from + dir * i * step;
    const v = g(u);
    if (!(v > 0)) {
      if (v === 0) return u;
      if (Number.isNaN(v)) return null;
      return brentRoot(g, uPrev, u, 0);
    }
    uPrev = u;
  }
  return null;
}
