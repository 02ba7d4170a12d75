import type { BackgroundModel, Geometry } from "./backgroundModel.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "./hubbleScales.js";
import { curvatureRadiusMpc } from "./curvatureRadius.js";
import { bounceScaleFactor, maximumScaleFactor } from "./turningPoints.js";
import { NoBigBangError } from "./noBigBangError.js";
import { pastIntegrals, type PastIntegrals } from "./pastIntegrals.js";
import { futureIntegrals } from "./futureIntegrals.js";
import { comovingVolumeWithin } from "./comovingVolume.js";
import { decelerationParameter } from "./decelerationParameter.js";
import { accelerationOnsetRedshift } from "./accelerationOnsetRedshift.js";
import { matterDarkEnergyEqualityRedshift, matterRadiationEqualityRedshift } from "./equalityRedshifts.js";
import { dominantTermLate } from "./dominantTerm.js";

/**
 * The fate of a model, one of a complete set decided from E^2 ~ c a^-p, the dominant term as a -> infinity
 * (Friedmann equation; acceleration iff p < 2 since d^2a/dt^2 / a = -H^2 (p - 2) / 2 when one term dominates):
 * - recollapses: H^2 reaches zero at a finite a_max ahead and the expansion reverses (crunch at a finite time);
 * - big_rip: the dark-energy density grows without bound (p < 0, or CPL with wa > 0) so fast that the scale factor
 *   diverges at a finite time (Caldwell, Kamionkowski & Weinberg 2003);
 * - expands_accelerating: 0 <= p < 2 (a cosmological constant, or w between -1 and -1/3);
 * - coasts: p = 2 (curvature, or w = -1/3, dominates): the expansion speed of a comoving separation tends to a constant;
 * - expands_decelerating: p > 2 (matter or radiation dominates forever), H -> 0.
 * A model exactly at the boundary between recollapse and expansion (approaching an Einstein static state forever)
 * is not representable in floating point; models next to it are refused with how close they are.
 */
export type Fate = "expands_decelerating" | "coasts" | "expands_accelerating" | "big_rip" | "recollapses";

/** Quantities of a model today. null marks a quantity that is infinite or does not apply. */
export interface BackgroundSummary {
  geometry: Geometry;
  age_Gyr: number | null;
  hubble_time_Gyr: number;
  hubble_distance_Mpc: number;
  particle_horizon_Mpc: number | null;
  event_horizon_Mpc: number | null;
  curvature_radius_Mpc: number | null;
  closed_volume_Gpc3: number | null;
  identified_antipodes_volume_Gpc3: number | null;
  antipode_distance_Mpc: number | null;
  observable_fraction: number | null;
  deceleration_q0: number;
  z_acceleration: number | null;
  z_matter_radiation_equality: number | null;
  z_matter_de_equality: number | null;
  fate: Fate;
  max_scale_factor: number | null;
  max_expansion_time_Gyr: number | null;
  crunch_time_Gyr: number | null;
  /** Big rip only: time from today until the scale factor diverges, and the cosmic time (age) at the rip. */
  time_to_rip_Gyr: number | null;
  rip_time_Gyr: number | null;
}

export interface SummaryResult {
  summary: BackgroundSummary;
  warnings: string[];
}

const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null);

/** The fate of a model that never stops expanding, from the dominant term of E^2 as a -> infinity. */
function expandingFate(model: BackgroundModel, timeToRip: number): Fate {
  if (Number.isFinite(timeToRip)) return "big_rip";
  const p = dominantTermLate(model).power;
  if (p < 2) return "expands_accelerating";
  return p === 2 ? "coasts" : "expands_decelerating";
}

/** Throws NoBigBangError when E^2 <= 0 somewhere in 0 < a < 1 (Friedmann equation). */
export function assertBigBang(model: BackgroundModel): void {
  const a = bounceScaleFactor(model);
  if (a !== null) throw new NoBigBangError(1 / a - 1);
}

/**
 * Today's background quantities (definitions as in Hogg 1999, astro-ph/9905116). Closed models: total volume
 * 2 pi^2 R^3, antipode at pi R, the space with antipodal points identified has half the volume, and the observable
 * fraction is the geodesic-ball volume of the particle horizon over the total.
 */
export function backgroundSummary(model: BackgroundModel, options: { past?: PastIntegrals } = {}): SummaryResult {
  assertBigBang(model);
  const warnings: string[] = [];
  const DH = hubbleDistanceMpc(model.H0_km_s_Mpc);
  const tH = hubbleTimeGyr(model.H0_km_s_Mpc);
  // Only age0 and conformalAge0 are used: any redshifts' integrals of this model serve (a spread's draws pass theirs).
  const past = options.past ?? pastIntegrals(model, [0]);
  const aMax = maximumScaleFactor(model);
  const future = futureIntegrals(model, aMax);
  const R = curvatureRadiusMpc(model);
  const age = past.age0 * tH;
  const particle = past.conformalAge0 * DH;
  let event: number;
  if (aMax === null) event = future.conformalToTurnaround * DH;
  else event = (past.conformalAge0 + 2 * future.conformalToTurnaround) * DH;
  if (!Number.isFinite(age))
    warnings.push(
      "infinite age: the scale factor reaches zero only as t -> -infinity, so age, lookback-free ages and the particle horizon are not defined",
    );
  else if (!Number.isFinite(particle))
    warnings.push("the particle horizon is infinite: light from every comoving distance has had time to arrive");

  let closedVolume: number | null = null;
  let identified: number | null = null;
  let antipode: number | null = null;
  let fraction: number | null = null;
  if (model.geometry === "closed" && R !== null) {
    closedVolume = comovingVolumeWithin(Math.PI * R, "closed", R) * 1e-9; // 2 pi^2 R^3
    identified = closedVolume / 2;
    antipode = Math.PI * R;
    if (Number.isFinite(particle)) {
      fraction =
        particle >= antipode ? 1 : Math.min(1, (comovingVolumeWithin(particle, "closed", R) * 1e-9) / closedVolume);
      if (particle >= antipode)
        warnings.push(
          "the antipode lies inside today's particle horizon: light has had time to cross the whole 3-sphere",
        );
    }
  }
  // An epoch beyond the turnaround is never reached: null, with a note when the densities would cross there.
  const equalityDe = matterDarkEnergyEqualityRedshift(model, aMax);
  if (aMax !== null && equalityDe === null) {
    const unbounded = matterDarkEnergyEqualityRedshift(model);
    if (unbounded !== null && unbounded < 0 && 1 / (1 + unbounded) > aMax)
      warnings.push(
        `matter and dark energy would have equal densities only at a = ${(1 / (1 + unbounded)).toPrecision(6)}, beyond the turnaround at a = ${aMax.toPrecision(6)}: the model never reaches it, so that equality is not given`,
      );
  }
  let fate: Fate = expandingFate(model, future.timeToRip);
  let maxExpansionTime: number | null = null;
  let crunch: number | null = null;
  const timeToRip = fate === "big_rip" ? future.timeToRip * tH : null;
  if (aMax !== null) {
    fate = "recollapses";
    maxExpansionTime = finiteOrNull((past.age0 + future.timeToTurnaround) * tH);
    crunch = maxExpansionTime === null ? null : 2 * maxExpansionTime;
    warnings.push(
      `recollapses: expansion stops at a = ${aMax.toPrecision(6)} and reverses (Friedmann equation is symmetric in time about the turnaround)`,
    );
  }
  return {
    summary: {
      geometry: model.geometry,
      age_Gyr: finiteOrNull(age),
      hubble_time_Gyr: tH,
      hubble_distance_Mpc: DH,
      particle_horizon_Mpc: finiteOrNull(particle),
      event_horizon_Mpc: finiteOrNull(event),
      curvature_radius_Mpc: R,
      closed_volume_Gpc3: closedVolume,
      identified_antipodes_volume_Gpc3: identified,
      antipode_distance_Mpc: antipode,
      observable_fraction: fraction,
      deceleration_q0: decelerationParameter(model, 1),
      z_acceleration: accelerationOnsetRedshift(model),
      z_matter_radiation_equality: matterRadiationEqualityRedshift(model),
      z_matter_de_equality: equalityDe,
      fate,
      max_scale_factor: aMax,
      max_expansion_time_Gyr: maxExpansionTime,
      crunch_time_Gyr: crunch,
      time_to_rip_Gyr: timeToRip,
      rip_time_Gyr: timeToRip === null || !Number.isFinite(age) ? null : age + timeToRip,
    },
    warnings,
  };
}
