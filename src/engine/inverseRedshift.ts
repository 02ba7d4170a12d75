import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "./hubbleScales.js";
import { integrateScalar } from "./gaussKronrod.js";
import { brentRoot } from "./brentRoot.js";
import { PANEL_REL_TOL, earlyIntegralsConverge } from "./pastIntegrals.js";

/** Raised when no redshift has the requested lookback time, age or comoving distance. */
export class NoSuchRedshiftError extends RangeError {}

const Z_CEILING = 1e9;

/**
 * Solves F(z) = target for z >= 0 where F increases with z (Brent 1973 on x = ln(1 + z)), bracketing by doubling
 * x up to z = 1e9. `limit` is sup F, used only to phrase the error.
 */
function solveIncreasing(F: (z: number) => number, target: number, what: string, limit: number): number {
  if (target === 0) return 0;
  if (!(target > 0) || !(target < limit)) {
    throw new NoSuchRedshiftError(`no redshift has ${what} ${target}: it must lie in (0, ${limit.toPrecision(10)})`);
  }
  let xHi = Math.log(2);
  while (F(Math.expm1(xHi)) < target) {
    xHi *= 2;
    if (Math.expm1(xHi) > Z_CEILING)
      throw new NoSuchRedshiftError(`no redshift below ${Z_CEILING} has ${what} ${target}`);
  }
  const x = brentRoot((x) => F(Math.expm1(x)) - target, 0, xHi, 1e-15);
  return Math.expm1(x);
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
  const sTop = 1;
  const lookback = (z: number) => tH * integrateScalar(time, 1 / Math.sqrt(1 + z), sTop, PANEL_REL_TOL).value;
  const age = earlyIntegralsConverge(model).age ? tH * integrateScalar(time, 0, 1, PANEL_REL_TOL).value : Infinity;
  return solveIncreasing(lookback, lookbackGyr, "lookback time (Gyr)", age);
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
  // age decreases with z; solve lookback = age0 - age on the increasing side with the direct age for precision.
  return solveIncreasing((z) => age0 - ageAt(z), age0 - ageGyr, "lookback time (Gyr)", age0);
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
