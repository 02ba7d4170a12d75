import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "./hubbleScales.js";
import { integrateScalar } from "./gaussKronrod.js";
import { brentRoot } from "./brentRoot.js";
import { PANEL_REL_TOL, earlyIntegralsConverge } from "./pastIntegrals.js";

/** Raised when no redshift has the requested lookback time, age or comoving distance. */
export class NoSuchRedshiftError extends RangeError {}

/**
 * The highest redshift solved for. Above it (T > 2.7e9 K) electron-positron annihilation and neutrino decoupling
 * change the radiation content, which this background model holds fixed (common practice).
 */
export const Z_CEILING = 1e9;
const X_CEILING = Math.log1p(Z_CEILING);

/**
 * Brackets the root of G(x) = 0 on x = ln(1 + z) in [0, X_CEILING], G increasing with G(0) < 0, by doubling x and
 * capping it at X_CEILING; returns the upper end, or null when G(X_CEILING) is still negative.
 */
function bracketUp(G: (x: number) => number): number | null {
  let xHi = Math.log(2);
  while (G(xHi) < 0) {
    if (xHi === X_CEILING) return null;
    xHi = Math.min(2 * xHi, X_CEILING);
  }
  return xHi;
}

/**
 * Solves F(z) = target for z >= 0 where F increases with z (Brent 1973 on x = ln(1 + z)), bracketing by doubling
 * x up to z = Z_CEILING. `limit` is sup F, used only to phrase the error.
 */
function solveIncreasing(F: (z: number) => number, target: number, what: string, limit: number): number {
  if (target === 0) return 0;
  if (!(target > 0) || !(target < limit)) {
    throw new NoSuchRedshiftError(`no redshift has ${what} ${target}: it must lie in (0, ${limit.toPrecision(10)})`);
  }
  const G = (x: number) => F(Math.expm1(x)) - target;
  const xHi = bracketUp(G);
  if (xHi === null) {
    throw new NoSuchRedshiftError(
      `${what} ${target} is reached only above z = ${Z_CEILING}, beyond the redshifts this background model covers`,
    );
  }
  return Math.expm1(brentRoot(G, 0, xHi, 1e-15));
}

function integrands(model: BackgroundModel) {
  const e2 = expansionRateSquared(model);
  // In s = sqrt(a): dt/t_H = 2 ds / (s E), deta/D_H = 2 ds / (s^3 E) (Hogg 1999 eqs. 15 and 30).
  return {
    time: (s: number) => 2 / (s * Math.sqrt(e2(s * s))),
    conformal: (s: number) => 2 / (s * s * s * Math.sqrt(e2(s * s))),
  };
}

/** Redshift at which the lookback time equals lookbackGyr (must be less than the age). */
export function redshiftAtLookbackTime(model: BackgroundModel, lookbackGyr: number): number {
  const tH = hubbleTimeGyr(model.H0_km_s_Mpc);
  const { time } = integrands(model);
  const lookback = (z: number) => tH * integrateScalar(time, 1 / Math.sqrt(1 + z), 1, PANEL_REL_TOL).value;
  if (!earlyIntegralsConverge(model).age)
    return solveIncreasing(lookback, lookbackGyr, "lookback time (Gyr)", Infinity);
  const age0 = tH * integrateScalar(time, 0, 1, PANEL_REL_TOL).value;
  // Near the big bang the remaining age carries the precision: solve for the age age0 - lookback there.
  if (lookbackGyr > age0 / 2 && lookbackGyr < age0) return redshiftAtAge(model, age0 - lookbackGyr);
  return solveIncreasing(lookback, lookbackGyr, "lookback time (Gyr)", age0);
}

/** Redshift at which the age of the universe equals ageGyr (must be positive and at most today's age). */
export function redshiftAtAge(model: BackgroundModel, ageGyr: number): number {
  if (!earlyIntegralsConverge(model).age)
    throw new NoSuchRedshiftError("this model has no finite age, so no redshift has a given age");
  const tH = hubbleTimeGyr(model.H0_km_s_Mpc);
  const { time } = integrands(model);
  const ageAt = (z: number) => tH * integrateScalar(time, 0, 1 / Math.sqrt(1 + z), PANEL_REL_TOL).value;
  const age0 = ageAt(0);
  if (ageGyr === age0) return 0;
  if (!(ageGyr > 0 && ageGyr < age0)) {
    throw new NoSuchRedshiftError(`no redshift has age (Gyr) ${ageGyr}: it must lie in (0, ${age0.toPrecision(10)}]`);
  }
  // The age falls with z; solve ln(target) - ln(age(z)) = 0, which keeps relative precision for tiny ages.
  const G = (x: number) => Math.log(ageGyr) - Math.log(ageAt(Math.expm1(x)));
  const xHi = bracketUp(G);
  if (xHi === null) {
    const ageAtCeiling = ageAt(Z_CEILING);
    throw new NoSuchRedshiftError(
      `an age of ${ageGyr} Gyr is reached only above z = ${Z_CEILING} (the age there is ${ageAtCeiling.toPrecision(3)} Gyr), beyond the redshifts this background model covers`,
    );
  }
  return Math.expm1(brentRoot(G, 0, xHi, 1e-15));
}

/** Redshift at which the line-of-sight comoving distance equals distanceMpc (must be inside the particle horizon). */
export function redshiftAtComovingDistance(model: BackgroundModel, distanceMpc: number): number {
  const DH = hubbleDistanceMpc(model.H0_km_s_Mpc);
  const { conformal } = integrands(model);
  const DC = (z: number) => DH * integrateScalar(conformal, 1 / Math.sqrt(1 + z), 1, PANEL_REL_TOL).value;
  const horizon = earlyIntegralsConverge(model).conformal
    ? DH * integrateScalar(conformal, 0, 1, PANEL_REL_TOL).value
    : Infinity;
  return solveIncreasing(DC, distanceMpc, "comoving distance (Mpc)", horizon);
}
