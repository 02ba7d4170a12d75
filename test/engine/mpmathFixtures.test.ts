import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import {
  backgroundSummary,
  photonDensityParameter,
  redshiftTable,
  type BackgroundModel,
} from "../../src/engine/index.js";
import { relErr } from "../helpers/modelOf.js";

// Reference values from mpmath at 30 digits: test/fixtures/mpmath/background.py wrote background.json.
const fixture = JSON.parse(readFileSync(new URL("../fixtures/mpmath/background.json", import.meta.url), "utf8"));
const TOL = 1e-10;

function modelFrom(f: any): BackgroundModel {
  const Ok = Number(f.Omega_k);
  return {
    H0_km_s_Mpc: f.H0,
    Omega_m: Number(f.Omega_m),
    Omega_cb: Number(f.Omega_m),
    Omega_b: null,
    Omega_gamma: Number(f.Omega_r),
    Omega_nu: 0,
    Omega_nu_massive: 0,
    massiveNeutrinos: [],
    T_nu_K: null,
    Omega_r: Number(f.Omega_r),
    Omega_de: Number(f.Omega_de),
    Omega_k: Ok,
    w0: f.w0,
    wa: f.wa,
    T_cmb_K: null,
    N_eff: 0,
    geometry: Ok === 0 ? "flat" : Ok > 0 ? "open" : "closed",
  };
}

const ROW_KEYS = [
  "comoving_distance_Mpc",
  "transverse_comoving_distance_Mpc",
  "luminosity_distance_Mpc",
  "lookback_time_Gyr",
  "age_Gyr",
  "particle_horizon_Mpc",
  "E",
] as const;

describe("engine against mpmath 30-digit fixtures (curved, w0-wa, negative Omega_de, recollapsing)", () => {
  for (const f of fixture.models) {
    describe(f.id, () => {
      const model = modelFrom(f);
      const zs = f.redshifts.map((r: any) => Number(r.z));
      it("per-redshift quantities agree to 1e-10", () => {
        expect(model.geometry).toBe(f.geometry);
        const t = redshiftTable(model, zs);
        f.redshifts.forEach((row: any, i: number) => {
          for (const key of ROW_KEYS) {
            if (row[key] === null) continue;
            const err = relErr(t[key][i], Number(row[key]));
            expect(err, `${key} at z = ${row.z}`).toBeLessThan(TOL);
          }
        });
      });
      it("with narrow panels by one 7-point Gauss rule (spreads' draws) on a dense grid: still 1e-10", () => {
        // 400 points evenly in ln(1+z) to the largest fixture redshift make every panel narrow, so the fixture's
        // redshifts, placed among them, are reached through Gauss-rule panels only.
        const zMax = Math.max(...zs);
        const dense = Array.from({ length: 400 }, (_, i) => Math.expm1((Math.log1p(zMax) * (i + 1)) / 401));
        const all = [...zs, ...dense];
        const t = redshiftTable(model, all, { narrowPanelsByGauss: true });
        f.redshifts.forEach((row: any, i: number) => {
          for (const key of ROW_KEYS) {
            if (row[key] === null) continue;
            expect(relErr(t[key][i], Number(row[key])), `${key} at z = ${row.z}`).toBeLessThan(TOL);
          }
        });
      });
      it("summary quantities agree to 1e-10", () => {
        const s = backgroundSummary(model).summary as any;
        for (const [key, value] of Object.entries(f.summary)) {
          if (value === null) expect(s[key], key).toBeNull();
          else expect(relErr(s[key], Number(value)), key).toBeLessThan(TOL);
        }
      });
    });
  }
  it("the fixtures exercise every kind of model the engine claims", () => {
    const ids = fixture.models.map((m: any) => m.geometry);
    expect(ids).toContain("open");
    expect(ids).toContain("closed");
    expect(fixture.models.some((m: any) => m.summary.max_scale_factor !== null)).toBe(true);
    expect(fixture.models.some((m: any) => Number(m.Omega_de) < 0)).toBe(true);
    expect(fixture.models.some((m: any) => m.wa !== 0)).toBe(true);
  });
});

describe("photon density from CODATA 2018 constants", () => {
  it("Omega_gamma h^2 at 2.7255 K equals the mpmath value to 1e-12 (about 2.473e-5, as usually quoted)", () => {
    const ours = photonDensityParameter(2.7255, 100);
    expect(relErr(ours, Number(fixture.Omega_gamma_h2_at_2_7255_K))).toBeLessThan(1e-12);
    expect(ours).toBeCloseTo(2.473e-5, 8);
  });
});
