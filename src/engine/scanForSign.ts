import { brentRoot } from "./brentRoot.js";

/**
 * How far in ln a a sum of terms of fixed signs provably stays positive: positive terms summing to P, negative ones to
 * -N, each changing by at most a factor e^(A h) over a step h, keep the sum positive while P e^(-A h) > N e^(A h),
 * i.e. h < ln(P / N) / (2 A). Half of that, for rounding; Infinity when nothing is negative, 0 when P <= N.
 */
export function positiveReach(P: number, N: number, slopeBound: number): number {
  if (N === 0) return Infinity;
  if (!(P > N * (1 + 1e-9)) || !(slopeBound > 0)) return 0;
  return (0.5 * Math.log(P / N)) / (2 * slopeBound);
}

/**
 * Walks u from `from` towards `to` in steps of `step` and returns the first u where g(u) <= 0, refined by Brent's
 * method between the last positive sample and that one; null when g stays positive. g(from) must be positive.
 * Grid scan plus bracketed root (common practice); two roots closer together than one step can be missed.
 * `reach(u)`, when given, says how far beyond u (towards `to`) g is proven positive (positiveReach): grid points
 * inside are skipped, except the last, so a sign change is bracketed by the same neighbours as without it.
 */
export function firstNonPositive(
  g: (u: number) => number,
  from: number,
  to: number,
  step: number,
  reach?: (u: number) => number,
): number | null {
  const dir = to > from ? 1 : -1;
  const n = Math.ceil(Math.abs(to - from) / step);
  const at = (i: number) => (i === n ? to : from + dir * i * step);
  let proven = 0; // |u - from| up to which g > 0 is proven
  let uPrev = from;
  for (let i = 1; i <= n; i++) {
    const u = at(i);
    if (i < n && Math.abs(at(i + 1) - from) < proven) continue;
    const v = g(u);
    if (!(v > 0)) {
      if (v === 0) return u;
      if (Number.isNaN(v)) return null;
      return brentRoot(g, uPrev, u, 0);
    }
    uPrev = u;
    if (reach) {
      proven = Math.abs(u - from) + reach(u);
      if (proven === Infinity) return null;
      const before = Math.floor(proven / step); // jump close to the last grid point inside; the check skips the rest
      if (before - 3 > i) i = Math.min(before - 3, n - 1);
    }
  }
  return null;
}
