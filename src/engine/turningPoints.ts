import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { dominantTermEarly, dominantTermLate } from "./dominantTerm.js";
import { firstNonPositive } from "./scanForSign.js";

// ln a ranges scanned for E^2 = 0. a^-4 stays finite down to ln a = -170.
const LN_A_EARLIEST = -170;
const LN_A_LATEST = 80;
const STEP_NEAR = 0.005;
const STEP_FAR = 0.05;

function scan(e2: (a: number) => number, far: number): number | null {
  const g = (u: number) => e2(Math.exp(u));
  const dir = far > 0 ? 1 : -1;
  const mid = dir * 12;
  return firstNonPositive(g, 0, mid, STEP_NEAR) ?? firstNonPositive(g, mid, far, STEP_FAR);
}

/**
 * The scale factor a < 1 at which E^2 reaches zero going back in time (the model bounced and has no big bang),
 * or null when E^2 > 0 for all 0 < a <= 1. Friedmann equation: H^2 = H0^2 E^2(a) must stay positive.
 */
export function bounceScaleFactor(model: BackgroundModel): number | null {
  const e2 = expansionRateSquared(model);
  const u = scan(e2, LN_A_EARLIEST);
  if (u !== null) return Math.exp(u);
  const early = dominantTermEarly(model);
  // E^2 negative as a -> 0 but no zero found above a = e^-170: the turn-around is earlier than that.
  if (early.coefficient < 0) return Math.exp(LN_A_EARLIEST);
  return null;
}

/**
 * The scale factor a > 1 at which E^2 reaches zero in the future (maximum expansion before a recollapse),
 * or null when the model expands forever. Friedmann equation: expansion halts where H^2 = 0.
 */
export function maximumScaleFactor(model: BackgroundModel): number | null {
  const e2 = expansionRateSquared(model);
  const u = scan(e2, LN_A_LATEST);
  if (u !== null) return Math.exp(u);
  const late = dominantTermLate(model);
  if (late.coefficient < 0) {
    throw new RangeError("E^2 turns negative beyond a = e^80 but its zero could not be located");
  }
  return null;
}
