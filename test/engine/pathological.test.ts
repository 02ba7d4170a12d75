import { describe, expect, it } from "vitest";
import {
  backgroundSummary,
  bounceScaleFactor,
  NoBigBangError,
  NoSuchRedshiftError,
  redshiftAtAge,
  redshiftAtComovingDistance,
  redshiftAtLookbackTime,
  redshiftTable,
} from "../../src/engine/index.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "../helpers/referenceScales.js";
import { modelOf, relErr } from "../helpers/modelOf.js";

describe("models without a big bang are rejected, naming the turnaround redshift", () => {
  it("Omega_m = 0.1, Omega_Lambda = 1.5: E^2 = 0.1 (1+z)^3 - 0.6 (1+z)^2 + 1.5 has a zero in the past", () => {
    const m = modelOf({ Om: 0.1, Ode: 1.5 });
    const a = bounceScaleFactor(m);
    expect(a).not.toBeNull();
    // Independent check: E^2 vanishes there (Friedmann equation).
    const x = 1 / a!;
    expect(Math.abs(0.1 * x ** 3 - 0.6 * x ** 2 + 1.5)).toBeLessThan(1e-12);
    expect(() => backgroundSummary(m)).toThrow(NoBigBangError);
    try {
      backgroundSummary(m);
    } catch (e) {
      expect((e as Error).message).toMatch(/turned around at z = \d/);
    }
  });
});

describe("recollapse", () => {
  it("negative Omega_de recollapses; event horizon is the distance light covers before the crunch", () => {
    const r = backgroundSummary(modelOf({ Om: 0.3, Ode: -0.2 }));
    expect(r.summary.fate).toBe("recollapses");
    expect(r.summary.event_horizon_Mpc).not.toBeNull();
    expect(r.summary.crunch_time_Gyr!).toBeGreaterThan(r.summary.age_Gyr!);
    expect(r.warnings.join(" ")).toMatch(/recollapses/);
  });
  it("closed matter-only: crunch time is twice the time of maximum expansion (time symmetry of the Friedmann equation)", () => {
    const s = backgroundSummary(modelOf({ Om: 2, Ode: 0 })).summary;
    expect(relErr(s.crunch_time_Gyr!, 2 * s.max_expansion_time_Gyr!)).toBeLessThan(1e-15);
    // Cycloid: light emitted at the big bang covers exactly 2 pi in chi by the crunch (conformal time 2 pi over sqrt(Om - 1)).
    const R = hubbleDistanceMpc(70) / Math.sqrt(1);
    expect(relErr(s.particle_horizon_Mpc! + s.event_horizon_Mpc!, 2 * Math.PI * R)).toBeLessThan(1e-10);
  });
});

describe("closed models beyond the antipode", () => {
  it("D_M changes sign past pi R and the volume inside z stops at 2 pi^2 R^3", () => {
    // A near-loitering closed Lambda model whose past light cone wraps past the antipode.
    const m = modelOf({ Om: 0.2, Ode: 1.25 });
    const s = backgroundSummary(m).summary;
    const zs = [1, 10, 1e3, 1e5, 1e7];
    const t = redshiftTable(m, zs);
    const beyond = zs.findIndex((_, i) => t.comoving_distance_Mpc[i] > s.antipode_distance_Mpc!);
    expect(beyond).toBeGreaterThan(-1);
    expect(t.transverse_comoving_distance_Mpc[beyond]).toBeLessThan(0);
    expect(t.comoving_volume_Gpc3[beyond]).toBeCloseTo(s.closed_volume_Gpc3!, 6);
    expect(s.observable_fraction).toBe(1);
    expect(backgroundSummary(m).warnings.join(" ")).toMatch(/antipode lies inside/);
  });
});

describe("inverse look-ups", () => {
  const m = modelOf({ Om: 0.3, Ok: 0.05, Or: 9e-5, w0: -0.9, wa: 0.2 });
  it("round-trip lookback time, age and comoving distance", () => {
    const zs = [0.01, 0.7, 3, 40];
    const t = redshiftTable(m, zs);
    zs.forEach((z, i) => {
      expect(relErr(redshiftAtLookbackTime(m, t.lookback_time_Gyr[i]), z)).toBeLessThan(1e-9);
      expect(relErr(redshiftAtAge(m, t.age_Gyr[i]), z)).toBeLessThan(1e-8);
      expect(relErr(redshiftAtComovingDistance(m, t.comoving_distance_Mpc[i]), z)).toBeLessThan(1e-9);
    });
  });
  it("a lookback time beyond the age has no redshift: a clear error", () => {
    const age = backgroundSummary(m).summary.age_Gyr!;
    expect(() => redshiftAtLookbackTime(m, age + 0.1)).toThrow(NoSuchRedshiftError);
    expect(() => redshiftAtLookbackTime(m, age + 0.1)).toThrow(/must lie in/);
    expect(() => redshiftAtComovingDistance(modelOf({ Om: 1, Ode: 0 }), 3 * hubbleDistanceMpc(70))).toThrow(
      /must lie in/,
    );
    // The admissible range the message names is (0, age today) for lookback time, (0, 2 D_H) for EdS distance
    // (the EdS comoving horizon 2 c/H0 is a closed form; Hogg 1999).
    expect(() => redshiftAtLookbackTime(m, age + 0.1)).toThrow(`must lie in (0, ${age.toPrecision(10)})`);
    expect(() => redshiftAtComovingDistance(modelOf({ Om: 1, Ode: 0 }), 3 * hubbleDistanceMpc(70))).toThrow(
      `must lie in (0, ${(2 * hubbleDistanceMpc(70)).toPrecision(10)})`,
    );
  });
});

describe("ages near the big bang (target notes must be true)", () => {
  // Flat matter + radiation (Lambda negligible at z > 1e5): t(a) = 4 a_eq^2 / (3 H0 sqrt(Omega_r))
  // [1 - (1 - a / (2 a_eq)) sqrt(1 + a / a_eq)], a_eq = Omega_r / Omega_m (Ryden, Introduction to Cosmology,
  // 2nd ed., eq. 6.31 as recalled from memory; the a << a_eq limit t = a^2 / (2 H0 sqrt(Omega_r)) is eq. 6.33).
  const Om = 0.3;
  const Or = 8.5e-5;
  const m = modelOf({ Om, Or, Ode: 1 - Om - Or });
  const tHGyr = hubbleTimeGyr(70);
  const closedFormAgeGyr = (z: number) => {
    const a = 1 / (1 + z);
    const aEq = Or / Om;
    return ((4 * aEq * aEq) / (3 * Math.sqrt(Or))) * (1 - (1 - a / (2 * aEq)) * Math.sqrt(1 + a / aEq)) * tHGyr;
  };
  it("an age of 1e-9 Gyr is found (near z = 8.7e5), and the closed form gives that age there", () => {
    const z = redshiftAtAge(m, 1e-9);
    expect(z).toBeGreaterThan(1e5);
    expect(relErr(closedFormAgeGyr(z), 1e-9)).toBeLessThan(1e-6);
  });
  it("the same epoch placed by lookback time (age today minus 1e-9 Gyr) is the same redshift", () => {
    const age0 = backgroundSummary(m).summary.age_Gyr!;
    const zAge = redshiftAtAge(m, 1e-9);
    // age0 - 1e-9 is rounded to a double of age0's size: the age left is known to about 1e-15 Gyr only.
    expect(relErr(redshiftAtLookbackTime(m, age0 - 1e-9), zAge)).toBeLessThan(1e-5);
  });
  it("an age reached only above z = 1e9 says so, with the age at z = 1e9 (and does not contradict itself)", () => {
    const ageAtCeiling = closedFormAgeGyr(1e9);
    expect(() => redshiftAtAge(m, 1e-20)).toThrow(NoSuchRedshiftError);
    expect(() => redshiftAtAge(m, 1e-20)).toThrow(
      `an age of 1e-20 Gyr is reached only above z = 1000000000 (the age there is ${ageAtCeiling.toPrecision(3)} Gyr)`,
    );
  });
  it("a comoving distance just inside the particle horizon is reached, above the old bracket's stopping point", () => {
    const horizon = backgroundSummary(m).summary.particle_horizon_Mpc!;
    const z = redshiftAtComovingDistance(m, horizon * (1 - 1e-6));
    expect(z).toBeGreaterThan(1e3);
  });
});

describe("Planck 2018 VI (A&A 641, A6) Table 2, base Lambda-CDM TT,TE,EE+lowE+lensing (values recalled from memory)", () => {
  it("H0 = 67.36, Omega_m = 0.3153 gives an age of 13.797 Gyr within 0.3% (no massive neutrinos in this engine yet)", async () => {
    const { makeBackgroundModel } = await import("../../src/engine/index.js");
    const m = makeBackgroundModel({
      H0_km_s_Mpc: 67.36,
      Omega_m: 0.3153,
      curvature: { kind: "flat" },
      w0: -1,
      wa: 0,
      radiation: { T_cmb_K: 2.7255, N_eff: 3.044 },
    });
    expect(relErr(backgroundSummary(m).summary.age_Gyr!, 13.797)).toBeLessThan(0.003);
  });
});
