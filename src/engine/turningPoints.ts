import type { BackgroundModel } from "./backgroundModel.js";
import { dominantTermEarly, dominantTermLate } from "./dominantTerm.js";
import { firstNonPositive } from "./scanForSign.js";

// ln a ranges scanned for E^2 = 0. The scan uses E^2 divided by the magnitude of its dominant term (same sign
// as E^2), so it neither overflows nor underflows however far the scan goes.
const LN_A_EARLIEST = -700;
const LN_A_LATEST = 700;
const NEAR = 12;
const STEP_NEAR = 0.005;
const STEP_FAR = 0.05;

/**
 * a^n E^2(a) exp(-x a) at a = e^u (Friedmann equation; CPL term in log form, Chevallier & Polarski 2001),
 * n the power of the dominant term and x = 3 wa when a super-exponential CPL term dominates late.
 */
function scaledExpansionRateSquared(model: BackgroundModel, late: boolean): (u: number) => number {
  const { Omega_r: r, Omega_m: m, Omega_k: k, Omega_de: de, w0, wa } = model;
  const dom = late ? dominantTermLate(model) : dominantTermEarly(model);
  const n = Number.isFinite(dom.power) ? dom.power : 2;
  const x = late && wa > 0 && de !== 0 ? 3 * wa : 0;
  const p = -3 * (1 + w0 + wa);
  return (u) => {
    const a = Math.exp(u);
    const xa = x * a;
    const dark = de === 0 ? 0 : de * Math.exp((p + n) * u - 3 * wa * (1 - a) - xa);
    const ordinary = r * Math.exp((n - 4) * u - xa) + m * Math.exp((n - 3) * u - xa) + k * Math.exp((n - 2) * u - xa);
    return ordinary + dark;
  };
}

function scan(g: (u: number) => number, far: number): number | null {
  const mid = Math.sign(far) * NEAR;
  return firstNonPositive(g, 0, mid, STEP_NEAR) ?? firstNonPositive(g, mid, far, STEP_FAR);
}

/**
 * The scale factor a < 1 at which E^2 reaches zero going back in time (the model bounced and has no big bang),
 * or null when E^2 > 0 for all 0 < a <= 1. Friedmann equation: H^2 = H0^2 E^2(a) must stay positive.
 */
export function bounceScaleFactor(model: BackgroundModel): number | null {
  const u = scan(scaledExpansionRateSquared(model, false), LN_A_EARLIEST);
  if (u !== null) return Math.exp(u);
  // E^2 negative as a -> 0 but no zero found above a = e^-700: the turn-around is earlier still.
  if (dominantTermEarly(model).coefficient < 0) return Math.exp(LN_A_EARLIEST);
  return null;
}

/**
 * The scale factor a > 1 at which E^2 reaches zero in the future (maximum expansion before a recollapse),
 * or null when the model expands forever. Friedmann equation: expansion halts where H^2 = 0.
 */
export function maximumScaleFactor(model: BackgroundModel): number | null {
  const u = scan(scaledExpansionRateSquared(model, true), LN_A_LATEST);
  if (u !== null) return Math.exp(u);
  if (dominantTermLate(model).coefficient < 0) {
    throw new RangeError("E^2 turns negative only beyond a = e^700, outside the range this engine can follow");
  }
  return null;
}
