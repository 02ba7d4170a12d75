import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";

/** Where, between z = 1e9 and today, the expansion was slowest: the smallest E^2 = (H/H0)^2 and its redshift. */
export interface SlowestPastExpansion {
  z: number;
  E2: number;
}

const SCAN_POINTS = 4000;
const LN_A_MIN = -Math.log1p(1e9);

/**
 * The minimum of E^2(a) (Friedmann equation) on ln a in [-ln(1 + 1e9), 0], by a uniform scan in ln a refined by
 * golden-section search (Kiefer 1953) around the smallest sample. It measures how close a model is to a static or
 * loitering one (where the minimum reaches 0), for messages about models the engine cannot compute.
 */
export function slowestPastExpansion(model: BackgroundModel): SlowestPastExpansion {
  const e2 = expansionRateSquared(model);
  const f = (lnA: number) => e2(Math.exp(lnA));
  const step = -LN_A_MIN / SCAN_POINTS;
  let best = 0;
  let bestValue = f(0);
  for (let i = 1; i <= SCAN_POINTS; i++) {
    const value = f(-i * step);
    if (value < bestValue) {
      bestValue = value;
      best = -i * step;
    }
  }
  // Golden-section search on [best - step, best + step] (clipped to the scanned range).
  const ratio = (Math.sqrt(5) - 1) / 2;
  let lo = Math.max(LN_A_MIN, best - step);
  let hi = Math.min(0, best + step);
  for (let i = 0; i < 100 && hi - lo > 1e-15; i++) {
    const x1 = hi - ratio * (hi - lo);
    const x2 = lo + ratio * (hi - lo);
    if (f(x1) < f(x2)) hi = x2;
    else lo = x1;
  }
  const lnA = (lo + hi) / 2;
  const refined = f(lnA);
  return refined < bestValue ? { z: Math.expm1(-lnA), E2: refined } : { z: Math.expm1(-best), E2: bestValue };
}
