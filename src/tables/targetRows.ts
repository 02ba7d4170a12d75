import {
  NoSuchRedshiftError,
  angularSizeArcsec,
  sizeKpcOfArcsec,
  apparentMagnitude,
  bolometricFluxErgSCm2,
  redshiftAtAge,
  redshiftAtComovingDistance,
  redshiftAtLookbackTime,
  redshiftTable,
  type BackgroundModel,
} from "../engine/index.js";
import type { ResolvedTarget } from "../scenario/resolvedScenario.js";
import type { Num, TargetRow } from "../contract/tablesDocument.js";

const num = (x: number): Num => (Number.isFinite(x) ? x : null);

/**
 * Each target under one model: its redshift (given, or solved from lookback time, age or comoving distance),
 * then its angular size, apparent magnitude (no K-correction), bolometric flux and linear growth (sigma8(z) and
 * f sigma8 when the model gives sigma8 today), all from the engine.
 */
export function targetRows(
  model: BackgroundModel,
  targets: readonly ResolvedTarget[],
  sigma8: number | null = null,
): TargetRow[] {
  return targets.map((t) => {
    const empty: TargetRow = {
      name: t.name,
      placed_by: t.placement.by,
      z: null,
      lookback_time_Gyr: null,
      age_Gyr: null,
      comoving_distance_Mpc: null,
      angular_diameter_distance_Mpc: null,
      luminosity_distance_Mpc: null,
      distance_modulus_mag: null,
      kpc_per_arcsec_proper: null,
      angular_size_arcsec: null,
      apparent_magnitude: null,
      bolometric_flux_erg_s_cm2: null,
      size_arcsec: t.size_arcsec ?? null,
      proper_size_kpc: null,
      comoving_size_kpc: null,
      growth_factor: null,
      growth_rate: null,
      sigma8_z: null,
      f_sigma8: null,
      note: null,
    };
    let z: number;
    try {
      const p = t.placement;
      z =
        p.by === "z"
          ? p.z
          : p.by === "lookback_Gyr"
            ? redshiftAtLookbackTime(model, p.value)
            : p.by === "age_Gyr"
              ? redshiftAtAge(model, p.value)
              : redshiftAtComovingDistance(model, p.value);
    } catch (e) {
      if (e instanceof NoSuchRedshiftError) return { ...empty, note: `not reached in this model: ${e.message}` };
      throw e;
    }
    const r = redshiftTable(model, [z], { sigma8 });
    const DA = r.angular_diameter_distance_Mpc[0];
    const DL = r.luminosity_distance_Mpc[0];
    const mu = r.distance_modulus_mag[0];
    const kpc = r.kpc_per_arcsec_proper[0];
    return {
      ...empty,
      z,
      lookback_time_Gyr: r.lookback_time_Gyr[0],
      age_Gyr: num(r.age_Gyr[0]),
      comoving_distance_Mpc: r.comoving_distance_Mpc[0],
      angular_diameter_distance_Mpc: DA,
      luminosity_distance_Mpc: DL,
      distance_modulus_mag: num(mu),
      kpc_per_arcsec_proper: kpc,
      angular_size_arcsec: t.size_kpc !== null ? angularSizeArcsec(t.size_kpc, kpc) : null,
      apparent_magnitude: t.absolute_magnitude !== null ? apparentMagnitude(t.absolute_magnitude, mu) : null,
      bolometric_flux_erg_s_cm2: t.luminosity_erg_s !== null ? bolometricFluxErgSCm2(t.luminosity_erg_s, DL) : null,
      proper_size_kpc: t.size_arcsec !== undefined ? sizeKpcOfArcsec(t.size_arcsec, kpc) : null,
      comoving_size_kpc:
        t.size_arcsec !== undefined ? sizeKpcOfArcsec(t.size_arcsec, r.kpc_per_arcsec_comoving[0]) : null,
      growth_factor: r.growth_factor[0],
      growth_rate: r.growth_rate[0],
      sigma8_z: num(r.sigma8_z[0]),
      f_sigma8: num(r.f_sigma8[0]),
      note: t.absolute_magnitude !== null ? "apparent magnitude without K-correction" : null,
    };
  });
}
