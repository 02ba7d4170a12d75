// The linear growth factor and growth rate (src/engine/linearGrowth.ts) against closed forms, the Heath (1977)
// integral and mpmath integrations of the growth equation (test/fixtures/mpmath/linearGrowth.py, which writes the
// JSON beside it); the growth index of Linder (2005) as a sanity check; the effective redshift of a shell against
// its definition integrated independently.
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import {
  expansionRateSquared,
  growthRate,
  linearGrowth,
  makeBackgroundModel,
  meszarosGrowthRate,
  pastIntegrals,
  QuadratureError,
  redshiftTable,
  s8Parameter,
  shellEffectiveRedshift,
  type BackgroundModel,
} from "../../src/engine/index.js";
import { ROOT } from "../helpers/buildDemoSite.js";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const RADIATION = { T_cmb_K: 2.7255, N_eff: 3.044 };

/** f(z) of a model at the given redshifts, as the tables give it (f = P (1+z)^2 / (E D)). */
function growthAt(m: BackgroundModel, zs: number[]) {
  const g = linearGrowth(m, zs);
  const e2 = expansionRateSquared(m);
  return {
    D: [...g.D],
    f: zs.map((z, i) => growthRate(g.P[i], g.D[i], z, Math.sqrt(e2(1 / (1 + z))))),
    rateToday: g.rateToday,
  };
}

describe("linear growth", () => {
  it("Einstein-de Sitter: D = a and f = 1 exactly (closed form of the growth equation with Omega_m = 1)", () => {
    const eds = makeBackgroundModel({
      H0_km_s_Mpc: 70,
      Omega_m: 1,
      curvature: { kind: "flat" },
      w0: -1,
      wa: 0,
      radiation: null,
    });
    const zs = [0, 0.1, 0.5, 1, 3, 10, 100, 1000];
    const g = growthAt(eds, zs);
    zs.forEach((z, i) => {
      expect(rel(g.D[i], 1 / (1 + z)), `D at z = ${z}`).toBeLessThan(1e-12);
      expect(Math.abs(g.f[i] - 1), `f at z = ${z}`).toBeLessThan(1e-12);
    });
    expect(Math.abs(g.rateToday - 1)).toBeLessThan(1e-12);
  });

  const fixture = JSON.parse(readFileSync(join(ROOT, "test/fixtures/mpmath/linearGrowth.json"), "utf8")) as {
    redshifts: number[];
    models: {
      name: string;
      route: "heath" | "ode";
      inputs: {
        H0: number;
        Omega_m: number;
        Omega_k: number;
        w0: number;
        wa: number;
        radiation: boolean;
        m_nu_eV: number[];
      };
      D: string[];
      f: string[];
      error_estimate: string;
    }[];
  };

  for (const ref of fixture.models) {
    const source =
      ref.route === "heath"
        ? "the Heath (1977) integral solution, mpmath quadrature at 24 digits"
        : "an mpmath integration of the growth equation at 24 digits";
    it(`${ref.name}: D(z)/D(0) and f(z) to 1e-10 against ${source} (test/fixtures/mpmath/linearGrowth.json)`, () => {
      const i = ref.inputs;
      const m = makeBackgroundModel({
        H0_km_s_Mpc: i.H0,
        Omega_m: i.Omega_m,
        curvature: i.Omega_k === 0 ? { kind: "flat" } : { kind: "Omega_k", Omega_k: i.Omega_k },
        w0: i.w0,
        wa: i.wa,
        radiation: i.radiation ? RADIATION : null,
        m_nu_eV: i.m_nu_eV,
      });
      // The reference's own error estimate must be far below the tolerance, or the comparison means nothing.
      expect(Number(ref.error_estimate)).toBeLessThan(1e-12);
      const g = growthAt(m, fixture.redshifts);
      fixture.redshifts.forEach((z, k) => {
        expect(rel(g.D[k], Number(ref.D[k])), `${ref.name} D at z = ${z}`).toBeLessThan(1e-10);
        expect(rel(g.f[k], Number(ref.f[k])), `${ref.name} f at z = ${z}`).toBeLessThan(1e-10);
      });
    });
  }

  it("flat LambdaCDM: the growth index gamma = ln f / ln Omega_m(z) is close to 0.55 (Linder 2005, PRD 72, 043529; a sanity check, not the method)", () => {
    const m = makeBackgroundModel({
      H0_km_s_Mpc: 70,
      Omega_m: 0.3,
      curvature: { kind: "flat" },
      w0: -1,
      wa: 0,
      radiation: null,
    });
    const zs = [0, 0.5, 1, 2];
    const g = growthAt(m, zs);
    const e2 = expansionRateSquared(m);
    zs.forEach((z, i) => {
      const omz = (0.3 * (1 + z) ** 3) / e2(1 / (1 + z));
      expect(Math.abs(Math.log(g.f[i]) / Math.log(omz) - 0.55), `z = ${z}`).toBeLessThan(0.01);
    });
  });

  it("the growing mode of a radiation-matter universe: f = (3y/2) / (1 + 3y/2) (Meszaros 1974)", () => {
    expect(meszarosGrowthRate(1, 1)).toBeCloseTo(0.6, 15);
    expect(meszarosGrowthRate(2, 1)).toBeCloseTo(0.75, 15);
    expect(meszarosGrowthRate(1, 0)).toBe(1); // no radiation: matter era, f = 1
    expect(meszarosGrowthRate(0, 1)).toBe(0); // no matter: nothing grows
  });

  it("a draw's growth reuses the past integrals' Gauss nodes and gives the same doubles as the growth computed alone", () => {
    const m = makeBackgroundModel({
      H0_km_s_Mpc: 67.4,
      Omega_m: 0.315,
      curvature: { kind: "Omega_k", Omega_k: -0.02 },
      w0: -0.9,
      wa: -0.3,
      radiation: RADIATION,
      m_nu_eV: [0.06],
    });
    // A dense grid (panels for the 4- and 7-point rules) and a few wide gaps (split panels).
    const zs = [
      ...Array.from({ length: 150 }, (_, i) => Math.expm1((Math.log(11) * (i + 1)) / 150)),
      0.0,
      0.35,
      14,
      40,
    ];
    const nodeValues = new Float64Array(7 * zs.length);
    pastIntegrals(m, zs, { narrowPanelsByGauss: true, nodeValues });
    const shared = linearGrowth(m, zs, { nodeValues });
    const alone = linearGrowth(m, zs);
    expect([...shared.D]).toEqual([...alone.D]);
    expect([...shared.P]).toEqual([...alone.P]);
    expect(shared.rateToday).toBe(alone.rateToday);
    // And a corrupted node value shows (the values are used, not recomputed).
    const k = 7 * 50; // a narrow panel in the middle of the grid
    expect(Number.isFinite(nodeValues[k])).toBe(true);
    nodeValues[k] *= 1.001;
    expect(linearGrowth(m, zs, { nodeValues }).D).not.toEqual(alone.D);
    // A panel the growth cannot follow (here: an infinite 1/E) is refused as the engine refuses a quadrature that
    // does not converge, so compute names the model instead of printing NaN or a stack trace.
    nodeValues[k + 1] = Number.POSITIVE_INFINITY;
    expect(() => linearGrowth(m, zs, { nodeValues })).toThrow(QuadratureError);
  });

  it("sigma8(z) = sigma8 D(z) and f sigma8 = f sigma8 D in the redshift table; S8 = sigma8 (Omega_m/0.3)^0.5", () => {
    const m = makeBackgroundModel({
      H0_km_s_Mpc: 68,
      Omega_m: 0.31,
      curvature: { kind: "flat" },
      w0: -1,
      wa: 0,
      radiation: RADIATION,
    });
    const t = redshiftTable(m, [0, 0.5, 1.2], { sigma8: 0.8 });
    for (let i = 0; i < 3; i++) {
      expect(t.sigma8_z[i]).toBe(0.8 * t.growth_factor[i]);
      expect(t.f_sigma8[i]).toBe(t.growth_rate[i] * 0.8 * t.growth_factor[i]);
    }
    expect(t.growth_factor[0]).toBe(1);
    const none = redshiftTable(m, [0.5]);
    expect(Number.isNaN(none.sigma8_z[0]) && Number.isNaN(none.f_sigma8[0])).toBe(true);
    expect(s8Parameter(0.8, 0.3)).toBe(0.8);
    expect(s8Parameter(0.8, 1.2)).toBeCloseTo(1.6, 14);
  });

  it("a shell's effective redshift is its volume-weighted mean redshift (Hogg 1999 eq. 28; Einstein-de Sitter closed forms, Simpson's rule)", () => {
    const eds = makeBackgroundModel({
      H0_km_s_Mpc: 70,
      Omega_m: 1,
      curvature: { kind: "flat" },
      w0: -1,
      wa: 0,
      radiation: null,
    });
    // EdS: D_C proportional to 1 - (1+z)^(-1/2), E = (1+z)^(3/2) (Hogg 1999, eq. 15 with Omega_M = 1).
    const dV = (z: number) => (1 - 1 / Math.sqrt(1 + z)) ** 2 / (1 + z) ** 1.5;
    for (const [lo, hi] of [
      [0.5, 1.0],
      [0, 3],
      [2, 2.1],
    ]) {
      const n = 20_000;
      let num = 0;
      let den = 0;
      for (let i = 0; i <= n; i++) {
        const z = lo + ((hi - lo) * i) / n;
        const w = i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2;
        num += w * z * dV(z);
        den += w * dV(z);
      }
      expect(rel(shellEffectiveRedshift(eds, lo, hi), num / den), `${lo} to ${hi}`).toBeLessThan(1e-10);
    }
    expect(shellEffectiveRedshift(eds, 1, 1)).toBe(1);
  });
});
