import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";

/** Where the expansion is slowest: the smallest E^2 = (H/H0)^2, its scale factor and redshift (z < 0 ahead). */
export interface SlowestPastExpansion {
  a: number;
  z: number;
  E2: number;
}

const SCAN_POINTS = 4000;
const LN_A_MIN = -Math.log1p(1e9);
/** The future side of the scan reaches a = e^LN_A_MAX (a loitering point ahead lies at a few times today's a). */
const LN_A_MAX = Math.log(1e4);

/**
 * The minimum of E^2(a) (Friedmann equation) on ln a in [-ln(1 + 1e9), 0] (the past; or up to ln 1e4 with
 * `ahead`), by a uniform scan in ln a refined by golden-section search (Kiefer 1953) around the smallest sample. It
 * measures how close a model is to a static or loitering one (where the minimum reaches 0), for messages about
 * models the engine cannot compute.
 */
export function slowestPastExpansion(model: BackgroundModel, ahead = false): SlowestPastExpansion {
  const lnAMax = ahead ? LN_A_MAX : 0;
  const e2 = expansionRateSquared(model);
  const f = (lnA: number) => e2(Math.exp(lnA));
  const step = (lnAMax - LN_A_MIN) / SCAN_POINTS;
  let best = lnAMax;
  let bestValue = f(lnAMax);
  for (let i = 1; i <= SCAN_POINTS; i++) {
    const x = lnAMax - i * step;
    const value = f(x);
    if (value < bestValue) {
      bestValue = value;
      best = x;
    }
  }
  // Golden-section search on [best - step, best + step] (clipped to the scanned range).
  const ratio = (Math.sqrt(5) - 1) / 2;
  let lo = Math.max(LN_A_MIN, best - step);
  let hi = Math.min(lnAMax, best + step);
  for (let i = 0; i < 100 && hi - lo > 1e-15; i++) {
    const x1 = hi - ratio * (hi - lo);
    const x2 = lo + ratio * (hi - lo);
    if (f(x1) < f(x2)) hi = x2;
    else lo = x1;
  }
  const lnA = (lo + hi) / 2;
  const refined = f(lnA);
  const at = refined < bestValue ? lnA : best;
  return { a: Math.exp(at), z: Math.expm1(-at), E2: Math.min(refined, bestValue) };
}
