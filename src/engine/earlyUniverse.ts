import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { hubbleDistanceMpc } from "./hubbleScales.js";
import { integrateScalar } from "./gaussKronrod.js";
import { GAUSS4, PANEL_REL_TOL, VERY_NARROW_PANEL } from "./pastIntegrals.js";
import { redshiftTable } from "./redshiftTable.js";
import { matterRadiationEqualityRedshift } from "./equalityRedshifts.js";

/** Decoupling redshift z*: Hu & Sugiyama 1996 (ApJ 471, 542), eq. E-1 fitting formula. */
export function recombinationRedshiftHuSugiyama(omega_b: number, omega_m: number): number {
  const g1 = (0.0783 * omega_b ** -0.238) / (1 + 39.5 * omega_b ** 0.763);
  const g2 = 0.56 / (1 + 21.1 * omega_b ** 1.81);
  return 1048 * (1 + 0.00124 * omega_b ** -0.738) * (1 + g1 * omega_m ** g2);
}

/** Drag-epoch redshift: Eisenstein & Hu 1998 (ApJ 496, 605), eq. 4 fitting formula (approximate: a few percent low). */
export function dragRedshiftEisensteinHu(omega_b: number, omega_m: number): number {
  const b1 = 0.313 * omega_m ** -0.419 * (1 + 0.607 * omega_m ** 0.674);
  const b2 = 0.238 * omega_m ** 0.223;
  return ((1291 * omega_m ** 0.251) / (1 + 0.659 * omega_m ** 0.828)) * (1 + b1 * omega_b ** b2);
}

/**
 * Drag-epoch sound horizon in Mpc: Aubourg et al. 2015 (PRD 92, 123516), eq. 16, calibrated on Boltzmann-code
 * results for N_eff = 3.046 near the Planck best fit (quoted accuracy about 0.02 % there; recalled from memory).
 * omega_nu is the massive-neutrino physical density.
 */
export function dragSoundHorizonAubourgMpc(omega_cb: number, omega_b: number, omega_nu: number): number {
  return (55.154 * Math.exp(-72.3 * (omega_nu + 0.0006) ** 2)) / (omega_cb ** 0.25351 * omega_b ** 0.12807);
}

/**
 * Comoving sound horizon at redshift z in Mpc: int_z^inf c_s dz / H with c_s = c / sqrt(3 (1 + R)),
 * R = 3 rho_b / (4 rho_gamma) = (3 Omega_b / 4 Omega_gamma) a (e.g. Eisenstein & Hu 1998, eq. 6), integrated in
 * s = sqrt(a) from the big bang.
 */
export function soundHorizonMpc(model: BackgroundModel, z: number): number {
  const integrand = soundHorizonIntegrand(model);
  const value = integrateScalar(integrand, 0, 1 / Math.sqrt(1 + z), PANEL_REL_TOL).value;
  return hubbleDistanceMpc(model.H0_km_s_Mpc) * value;
}

/** The integrand of soundHorizonMpc in s = sqrt(a), in units of D_H. */
function soundHorizonIntegrand(model: BackgroundModel): (s: number) => number {
  if (model.Omega_b === null || model.Omega_gamma === 0)
    throw new RangeError("the sound horizon needs baryons and photons");
  const e2 = expansionRateSquared(model);
  const k = (3 * model.Omega_b) / (4 * model.Omega_gamma);
  return (s) => {
    const a = s * s;
    return 2 / (s * a * Math.sqrt(e2(a)) * Math.sqrt(3 * (1 + k * a)));
  };
}

/**
 * The sound horizon at z2 < z1 from the one at z1: r(z2) = r(z1) + int_{s1}^{s2} (soundHorizonMpc's integrand), the
 * panel by the 4-point Gauss rule when at most VERY_NARROW_PANEL wide (relative), else adaptive (for spreads' draws).
 */
function soundHorizonOnwardMpc(model: BackgroundModel, r1Mpc: number, z1: number, z2: number): number {
  const f = soundHorizonIntegrand(model);
  const s1 = 1 / Math.sqrt(1 + z1);
  const s2 = 1 / Math.sqrt(1 + z2);
  let panel = 0;
  if (s2 - s1 <= VERY_NARROW_PANEL * s1) {
    const half = (s2 - s1) / 2;
    const mid = (s2 + s1) / 2;
    for (let j = 0; j < 4; j++) panel += GAUSS4.weights[j] * f(mid + half * GAUSS4.nodes[j]);
    panel *= half;
  } else panel = integrateScalar(f, s1, s2, PANEL_REL_TOL).value;
  return r1Mpc + hubbleDistanceMpc(model.H0_km_s_Mpc) * panel;
}

export interface EarlyUniverse {
  z_recombination: number | null;
  z_drag: number | null;
  sound_horizon_recombination_Mpc: number | null;
  sound_horizon_drag_Mpc: number | null;
  sound_horizon_drag_integral_Mpc: number | null;
  theta_star_100: number | null;
  transverse_comoving_distance_recombination_Mpc: number | null;
  k_eq_1_Mpc: number | null;
}

/**
 * Standard rulers of the early universe. They need baryons (Omega_b or omega_b) and radiation; without them each
 * is null and `note` says why. z* and z_drag come from fitting formulas, r_drag from a calibrated formula (named
 * on the pages); r* and the integral r_drag are integrals of the background. theta* = r* / D_M(z*).
 */
export function earlyUniverse(
  model: BackgroundModel,
  options: {
    /** D_M at a redshift in Mpc, when the caller computes it with other redshifts in one pass (a spread's draws). */
    transverseComovingDistanceMpc?: (z: number) => number;
    /** The integral r_drag as r* plus the stretch from z* to z_drag (soundHorizonOnwardMpc), for spreads' draws. */
    onwardFromRecombination?: boolean;
  } = {},
): { values: EarlyUniverse; note: string | null } {
  const DH = hubbleDistanceMpc(model.H0_km_s_Mpc);
  const zEq = matterRadiationEqualityRedshift(model);
  let kEq: number | null = null;
  if (zEq !== null && zEq > 0) {
    const aEq = 1 / (1 + zEq);
    kEq = (aEq * Math.sqrt(expansionRateSquared(model)(aEq))) / DH; // k_eq = a_eq H(a_eq) / c
  }
  const empty: EarlyUniverse = {
    z_recombination: null,
    z_drag: null,
    sound_horizon_recombination_Mpc: null,
    sound_horizon_drag_Mpc: null,
    sound_horizon_drag_integral_Mpc: null,
    theta_star_100: null,
    transverse_comoving_distance_recombination_Mpc: null,
    k_eq_1_Mpc: kEq,
  };
  if (model.Omega_b === null)
    return {
      values: empty,
      note: "no baryon density given (Omega_b or omega_b): sound horizons and recombination are not computed",
    };
  if (model.Omega_gamma === 0)
    return { values: empty, note: "no radiation: sound horizons and recombination are not computed" };
  const h2 = (model.H0_km_s_Mpc / 100) ** 2;
  const omega_b = model.Omega_b * h2;
  const omega_m = model.Omega_m * h2;
  const zStar = recombinationRedshiftHuSugiyama(omega_b, omega_m);
  const zDrag = dragRedshiftEisensteinHu(omega_b, omega_m);
  const rStar = soundHorizonMpc(model, zStar);
  const DMstar = options.transverseComovingDistanceMpc
    ? options.transverseComovingDistanceMpc(zStar)
    : redshiftTable(model, [zStar], { growth: false }).transverse_comoving_distance_Mpc[0];
  return {
    values: {
      z_recombination: zStar,
      z_drag: zDrag,
      sound_horizon_recombination_Mpc: rStar,
      sound_horizon_drag_Mpc: dragSoundHorizonAubourgMpc(model.Omega_cb * h2, omega_b, model.Omega_nu_massive * h2),
      sound_horizon_drag_integral_Mpc:
        options.onwardFromRecombination && zDrag < zStar
          ? soundHorizonOnwardMpc(model, rStar, zStar, zDrag)
          : soundHorizonMpc(model, zDrag),
      theta_star_100: (100 * rStar) / DMstar,
      transverse_comoving_distance_recombination_Mpc: DMstar,
      k_eq_1_Mpc: kEq,
    },
    note: null,
  };
}
