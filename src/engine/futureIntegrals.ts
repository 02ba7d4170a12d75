import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { expansionRateSquaredSlope } from "./expansionRateSquaredSlope.js";
import { dominantTermLate } from "./dominantTerm.js";
import { GaussKronrodIntegrator } from "./gaussKronrod.js";
import { PANEL_REL_TOL } from "./pastIntegrals.js";

/** Integrals from today to the future, in units of t_H and D_H. */
export interface FutureIntegrals {
  /** int_1^a_end da/(a E): time from now to maximum expansion (Infinity when the model expands forever). */
  readonly timeToTurnaround: number;
  /** int_1^a_end da/(a^2 E): comoving distance light covers until maximum expansion, or until t -> infinity. */
  readonly conformalToTurnaround: number;
}

/**
 * Future integrals. Expanding forever: int_1^inf da/(a^2 E) with u = 1/a and u = v^k, k = 2/(2 - p) where
 * E^2 ~ a^-p late (removes the u^(-p/2) end-point behaviour); finite only when p < 2 (Infinity otherwise).
 * Recollapse at a_max: [1, a_max/2] in ln a, then [a_max/2, a_max] with a = a_max - v^2, which turns the
 * 1/sqrt(a_max - a) end-point behaviour into a smooth integrand (Friedmann equation near H = 0).
 */
export function futureIntegrals(model: BackgroundModel, maxScaleFactor: number | null): FutureIntegrals {
  const e2 = expansionRateSquared(model);
  const vec = new GaussKronrodIntegrator(2);
  const value = new Float64Array(2);
  const error = new Float64Array(2);
  if (maxScaleFactor === null) {
    const late = dominantTermLate(model);
    if (!(late.power < 2)) return { timeToTurnaround: Infinity, conformalToTurnaround: Infinity };
    const k = late.power > 0 ? 2 / (2 - late.power) : 1;
    const one = new GaussKronrodIntegrator(1);
    const v1 = new Float64Array(1);
    const err1 = new Float64Array(1);
    // int_0^1 du / E(1/u), u = v^k, du = k v^(k-1) dv.
    one.integrate(
      (v, out) => {
        const u = k === 1 ? v : Math.pow(v, k);
        if (u < 1e-250) {
          // Deep in the late-time regime E^2 = c u^p exactly: the integrand tends to k / sqrt(c).
          out[0] = k / Math.sqrt(late.coefficient);
          return;
        }
        const jac = k === 1 ? 1 : k * Math.pow(v, k - 1);
        const E2 = e2(1 / u);
        out[0] = Number.isFinite(E2) ? jac / Math.sqrt(E2) : 0;
      },
      0, 1, PANEL_REL_TOL, 0, v1, err1,
    );
    return { timeToTurnaround: Infinity, conformalToTurnaround: v1[0] };
  }
  const aMax = maxScaleFactor;
  const slope = -expansionRateSquaredSlope(model, aMax); // E^2 ~ slope (a_max - a) near the turnaround
  let t = 0;
  let c = 0;
  const aMid = aMax <= 2 ? 1 : aMax / 2;
  if (aMid > 1) {
    vec.integrate(
      (u, out) => {
        const a = Math.exp(u);
        const E = Math.sqrt(e2(a));
        out[0] = 1 / E;
        out[1] = 1 / (a * E);
      },
      0, Math.log(aMid), PANEL_REL_TOL, 0, value, error,
    );
    t += value[0];
    c += value[1];
  }
  vec.integrate(
    (v, out) => {
      const v2 = v * v;
      const a = aMax - v2;
      const direct = e2(a);
      const E2 = v2 <= 1e-9 * aMax || !(direct > 0) ? slope * v2 : direct;
      const g = (2 * v) / (a * Math.sqrt(E2));
      out[0] = g;
      out[1] = g / a;
    },
    0, Math.sqrt(aMax - aMid), PANEL_REL_TOL, 0, value, error,
  );
  t += value[0];
  c += value[1];
  return { timeToTurnaround: t, conformalToTurnaround: c };
}
