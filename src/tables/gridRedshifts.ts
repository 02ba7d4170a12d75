import type { ResolvedGrid } from "../scenario/resolvedScenario.js";

/** Grid redshifts from 0 to z_max: evenly spaced in ln(1+z) ("log") or in z ("linear"); the last point is z_max exactly. */
export function gridRedshifts(grid: ResolvedGrid): number[] {
  const n = grid.points;
  const out = new Array<number>(n);
  const top = Math.log1p(grid.z_max);
  for (let i = 0; i < n; i++) {
    const f = i / (n - 1);
    out[i] = grid.spacing === "log" ? Math.expm1(f * top) : f * grid.z_max;
  }
  out[n - 1] = grid.z_max;
  return out;
}
