import type { BackgroundModel } from "./backgroundModel.js";
import { ARCSEC_RAD, GLY_MPC } from "./constants.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "./hubbleScales.js";
import { curvatureRadiusMpc } from "./curvatureRadius.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { asFloat64Array, pastIntegrals, type PastIntegralOptions, type PastIntegrals } from "./pastIntegrals.js";
import { transverseComovingDistance } from "./transverseComovingDistance.js";
import { comovingVolumeWithin } from "./comovingVolume.js";
import { massiveNeutrinoParts } from "./massiveNeutrinoDensity.js";
import { growthRate, linearGrowth, type LinearGrowth } from "./linearGrowth.js";

/** Per-redshift quantities as columns aligned with the input redshifts. NaN marks a value that is undefined. */
export interface RedshiftColumns {
  z: Float64Array;
  H_km_s_Mpc: Float64Array;
  /** H(z)/(1+z) = a' (the expansion speed of a comoving separation of 1 Mpc today), km/s/Mpc. */
  H_over_1pz_km_s_Mpc: Float64Array;
  E: Float64Array;
  Omega_m_z: Float64Array;
  comoving_distance_Mpc: Float64Array;
  transverse_comoving_distance_Mpc: Float64Array;
  angular_diameter_distance_Mpc: Float64Array;
  luminosity_distance_Mpc: Float64Array;
  distance_modulus_mag: Float64Array;
  lookback_time_Gyr: Float64Array;
  age_Gyr: Float64Array;
  comoving_volume_Gpc3: Float64Array;
  comoving_volume_element_Mpc3_sr: Float64Array;
  kpc_per_arcsec_proper: Float64Array;
  kpc_per_arcsec_comoving: Float64Array;
  hubble_radius_Mpc: Float64Array;
  particle_horizon_Mpc: Float64Array;
  light_travel_distance_Mpc: Float64Array;
  light_travel_distance_Gly: Float64Array;
  /** Linear growth factor D(z)/D(0) of cold dark matter plus baryons (linearGrowth.ts). */
  growth_factor: Float64Array;
  /** Linear growth rate f = dln D/dln a. */
  growth_rate: Float64Array;
  /** sigma8(z) = sigma8 D(z): NaN when the model gives no sigma8 today. */
  sigma8_z: Float64Array;
  /** f sigma8(z) = f(z) sigma8 D(z): NaN when the model gives no sigma8 today. */
  f_sigma8: Float64Array;
}

export const REDSHIFT_COLUMN_KEYS = [
  "z",
  "H_km_s_Mpc",
  "H_over_1pz_km_s_Mpc",
  "E",
  "Omega_m_z",
  "comoving_distance_Mpc",
  "transverse_comoving_distance_Mpc",
  "angular_diameter_distance_Mpc",
  "luminosity_distance_Mpc",
  "distance_modulus_mag",
  "lookback_time_Gyr",
  "age_Gyr",
  "comoving_volume_Gpc3",
  "comoving_volume_element_Mpc3_sr",
  "kpc_per_arcsec_proper",
  "kpc_per_arcsec_comoving",
  "hubble_radius_Mpc",
  "particle_horizon_Mpc",
  "light_travel_distance_Mpc",
  "light_travel_distance_Gly",
  "growth_factor",
  "growth_rate",
  "sigma8_z",
  "f_sigma8",
] as const satisfies readonly (keyof RedshiftColumns)[];

/**
 * Every per-redshift quantity for an array of redshifts in one cumulative pass (definitions: Hogg 1999,
 * astro-ph/9905116): D_M eq. 16, D_A eq. 18, D_L eq. 21, distance modulus eq. 24, dV_C/dz/dOmega eq. 28,
 * V_C eq. 29 (geodesic-ball form), lookback time eq. 30. The light-travel distance is c times the lookback time,
 * so in Gly it equals the lookback time in Gyr (light year of Julian years).
 * The model must have a big bang (see assertBigBang); redshifts finite and >= 0, in any order.
 */
export function redshiftTable(
  model: BackgroundModel,
  redshifts: ArrayLike<number>,
  options: PastIntegralOptions & {
    /** The past integrals at these redshifts (the first redshifts.length of them), when computed already. */
    past?: PastIntegrals;
    /** Columns to write into (each redshifts.length long), for a caller that reuses them from model to model. */
    into?: RedshiftColumns;
    /**
     * The linear growth at these redshifts (the first redshifts.length of them), when computed already; false
     * when the caller needs no growth (its two columns are then NaN).
     */
    growth?: LinearGrowth | false;
    /** sigma8 today (rms linear matter fluctuation in spheres of 8 h^-1 Mpc), or null when the model gives none. */
    sigma8?: number | null;
  } = {},
): RedshiftColumns {
  redshifts = asFloat64Array(redshifts); // one kind of array for the optimised code (see pastIntegrals)
  const n = redshifts.length;
  const DH = hubbleDistanceMpc(model.H0_km_s_Mpc);
  const tH = hubbleTimeGyr(model.H0_km_s_Mpc);
  const R = curvatureRadiusMpc(model);
  const e2 = expansionRateSquared(model);
  const past = options.past ?? pastIntegrals(model, redshifts, options);
  const growth = options.growth === false ? null : (options.growth ?? linearGrowth(model, redshifts, options));
  const col = () => new Float64Array(n);
  const out: RedshiftColumns = options.into ?? {
    z: col(),
    H_km_s_Mpc: col(),
    H_over_1pz_km_s_Mpc: col(),
    E: col(),
    Omega_m_z: col(),
    comoving_distance_Mpc: col(),
    transverse_comoving_distance_Mpc: col(),
    angular_diameter_distance_Mpc: col(),
    luminosity_distance_Mpc: col(),
    distance_modulus_mag: col(),
    lookback_time_Gyr: col(),
    age_Gyr: col(),
    comoving_volume_Gpc3: col(),
    comoving_volume_element_Mpc3_sr: col(),
    kpc_per_arcsec_proper: col(),
    kpc_per_arcsec_comoving: col(),
    hubble_radius_Mpc: col(),
    particle_horizon_Mpc: col(),
    light_travel_distance_Mpc: col(),
    light_travel_distance_Gly: col(),
    growth_factor: col(),
    growth_rate: col(),
    sigma8_z: col(),
    f_sigma8: col(),
  };
  const sigma8 = options.sigma8 ?? Number.NaN;
  const kpcPerMpcArcsec = 1000 * ARCSEC_RAD;
  const hasNu = model.massiveNeutrinos.length > 0;
  for (let i = 0; i < n; i++) {
    const z = redshifts[i];
    const a = 1 / (1 + z);
    const E2 = e2(a);
    const E = Math.sqrt(E2);
    const DC = DH * past.comoving[i];
    const DM = transverseComovingDistance(DC, model.geometry, R);
    const DA = DM * a;
    const DL = DM * (1 + z);
    const lookback = tH * past.lookback[i];
    out.z[i] = z;
    out.H_km_s_Mpc[i] = model.H0_km_s_Mpc * E;
    out.H_over_1pz_km_s_Mpc[i] = model.H0_km_s_Mpc * E * a;
    out.E[i] = E;
    const zp1 = 1 + z;
    // Matter: cold matter and baryons plus the non-relativistic part rho - 3p of massive neutrinos.
    const nu = hasNu ? massiveNeutrinoParts(model, a) : null;
    out.Omega_m_z[i] = (model.Omega_cb * zp1 * zp1 * zp1 + (nu ? nu.matter : 0)) / E2;
    out.comoving_distance_Mpc[i] = DC;
    out.transverse_comoving_distance_Mpc[i] = DM;
    out.angular_diameter_distance_Mpc[i] = DA;
    out.luminosity_distance_Mpc[i] = DL;
    out.distance_modulus_mag[i] = DL === 0 ? NaN : 5 * Math.log10(Math.abs(DL)) + 25;
    out.lookback_time_Gyr[i] = lookback;
    out.age_Gyr[i] = Number.isFinite(past.age[i]) ? tH * past.age[i] : NaN;
    out.comoving_volume_Gpc3[i] = comovingVolumeWithin(DC, model.geometry, R) * 1e-9;
    out.comoving_volume_element_Mpc3_sr[i] = (DH * DM * DM) / E;
    out.kpc_per_arcsec_proper[i] = DA * kpcPerMpcArcsec;
    out.kpc_per_arcsec_comoving[i] = DM * kpcPerMpcArcsec;
    out.hubble_radius_Mpc[i] = DH / E;
    out.particle_horizon_Mpc[i] = Number.isFinite(past.conformalAge[i]) ? DH * past.conformalAge[i] : NaN;
    // c times the lookback time, in Mpc like every other distance (and in Gly, as older formats give it).
    out.light_travel_distance_Mpc[i] = lookback * GLY_MPC;
    out.light_travel_distance_Gly[i] = lookback;
    const D = growth ? growth.D[i] : Number.NaN;
    const f = growth ? growthRate(growth.P[i], D, z, E) : Number.NaN;
    out.growth_factor[i] = D;
    out.growth_rate[i] = f;
    // Linear theory: sigma8 scales with D (scale-independent growth).
    out.sigma8_z[i] = sigma8 * D;
    out.f_sigma8[i] = f * sigma8 * D;
  }
  return out;
}
