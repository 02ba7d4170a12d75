import { describe, expect, it } from "vitest";
import {
  FD_ENERGY_MASSLESS,
  FD_NUMBER,
  backgroundSummary,
  earlyUniverse,
  fermiDiracEnergyIntegral,
  lnEnergyRatio,
  makeBackgroundModel,
  massiveNeutrinoDensity,
  masslessNeutrinoDensityParameter,
} from "../../src/engine/index.js";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { relErr } from "../helpers/modelOf.js";

describe("Fermi-Dirac energy integral", () => {
  it("massless closed form 7 pi^4 / 120 and the non-relativistic number-density limit 3 zeta(3) / 2 (Kolb & Turner 1990)", () => {
    expect(relErr(fermiDiracEnergyIntegral(0), (7 * Math.PI ** 4) / 120)).toBeLessThan(1e-11);
    expect(relErr(FD_ENERGY_MASSLESS, (7 * Math.PI ** 4) / 120)).toBeLessThan(1e-15);
    // zeta(3) = 1.2020569031595942 (recalled from memory)
    expect(relErr(fermiDiracEnergyIntegral(1e4) / 1e4, 1.5 * 1.2020569031595942)).toBeLessThan(1e-6);
    expect(relErr(FD_NUMBER, 1.5 * 1.2020569031595942)).toBeLessThan(1e-15);
  });
  it("the interpolated ratio matches the direct integral to 1e-8 across y = 1e-4 .. 1e4", () => {
    for (let i = 0; i <= 400; i++) {
      const lnY = Math.log(1e-4) + (i / 400) * Math.log(1e8) + 0.0037; // off the table nodes
      const direct = fermiDiracEnergyIntegral(Math.exp(lnY)) / FD_ENERGY_MASSLESS;
      expect(relErr(Math.exp(lnEnergyRatio(lnY)), direct)).toBeLessThan(1e-8);
    }
  });
});

const planck = (N_eff = 3.046, m = [0.06]) => {
  // Planck 2018 VI (A&A 641, A6) Table 2, TT,TE,EE+lowE+lensing (values recalled from memory):
  // omega_b = 0.02237, omega_c = 0.1200, H0 = 67.36, one massive neutrino of 0.06 eV.
  const h = 0.6736;
  const probe = makeBackgroundModel({
    H0_km_s_Mpc: 67.36,
    Omega_m: 0.5,
    curvature: { kind: "flat" },
    w0: -1,
    wa: 0,
    radiation: { T_cmb_K: 2.7255, N_eff },
    m_nu_eV: m,
  });
  const Omega_m = (0.02237 + 0.12) / h ** 2 + probe.Omega_nu_massive;
  return makeBackgroundModel({
    H0_km_s_Mpc: 67.36,
    Omega_m,
    curvature: { kind: "flat" },
    w0: -1,
    wa: 0,
    radiation: { T_cmb_K: 2.7255, N_eff },
    baryons: { omega_b: 0.02237 },
    m_nu_eV: m,
  });
};

describe("massive neutrinos in the background", () => {
  it("relativistic limit: at a = 1e-8 a massive species has the massless density to 1e-6", () => {
    const m = planck();
    const a = 1e-8;
    const massless = masslessNeutrinoDensityParameter(m.N_eff / 3, m.Omega_gamma) / a ** 4;
    expect(relErr(massiveNeutrinoDensity(m, a), massless)).toBeLessThan(1e-6);
  });
  it("non-relativistic limit: Omega_nu h^2 = sum m / 93.14 eV to 1e-4 (Mangano et al. 2005; Lesgourgues & Pastor 2006, the value recalled from memory)", () => {
    // The default convention reproduces 93.14 eV at T_cmb = 2.7255 K whatever N_eff; 0.3 eV is far enough from
    // relativistic today (y ~ 1800) that the remaining correction is below 1e-6.
    for (const N_eff of [3.044, 3.5]) {
      const m = planck(N_eff, [0.3, 0.3, 0.3]);
      expect(relErr(m.Omega_nu_massive * 0.6736 ** 2, 0.9 / 93.14)).toBeLessThan(1e-4);
    }
  });
  it("Planck 2018 VI base Lambda-CDM: age, z*, r*, 100 theta*, r_drag and z_eq within the stated tolerances", () => {
    const m = planck();
    const s = backgroundSummary(m).summary;
    const e = earlyUniverse(m).values;
    expect(relErr(s.age_Gyr!, 13.797)).toBeLessThan(0.001);
    expect(relErr(e.z_recombination!, 1089.92)).toBeLessThan(0.003);
    expect(relErr(e.sound_horizon_recombination_Mpc!, 144.43)).toBeLessThan(0.005);
    expect(relErr(e.theta_star_100!, 1.0411)).toBeLessThan(0.003);
    expect(relErr(e.sound_horizon_drag_Mpc!, 147.09)).toBeLessThan(0.001);
    expect(relErr(s.z_matter_radiation_equality!, 3402)).toBeLessThan(0.002);
  });
  it("the draws' shortcuts (r_drag onward from z*, D_M(z*) given) agree with the direct integrals to 1e-12", () => {
    // The draws of a spread take r_drag's integral as r* plus the stretch z* -> z_drag, and D_M(z*) from their own
    // pass of past integrals; here D_M(z*) is handed the direct value, so only the onward integral is new.
    for (const masses of [[], [0.06], [0.3, 0.3, 0.3]]) {
      const m = planck(3.044, masses);
      const direct = earlyUniverse(m).values;
      let asked = 0;
      const shortcut = earlyUniverse(m, {
        onwardFromRecombination: true,
        transverseComovingDistanceMpc: (z) => {
          asked = z;
          return direct.transverse_comoving_distance_recombination_Mpc!;
        },
      }).values;
      expect(asked).toBe(direct.z_recombination);
      expect(relErr(shortcut.sound_horizon_drag_integral_Mpc!, direct.sound_horizon_drag_integral_Mpc!)).toBeLessThan(
        1e-12,
      );
      expect(shortcut.theta_star_100).toBe(direct.theta_star_100);
    }
  });
  it("without baryons the early-universe quantities are null with a note", () => {
    const m = makeBackgroundModel({
      H0_km_s_Mpc: 70,
      Omega_m: 0.3,
      curvature: { kind: "flat" },
      w0: -1,
      wa: 0,
      radiation: { T_cmb_K: 2.7255, N_eff: 3.044 },
    });
    const r = earlyUniverse(m);
    expect(r.values.sound_horizon_drag_Mpc).toBeNull();
    expect(r.note).toMatch(/no baryon density/);
  });
});

describe("scenario rules for baryons and neutrinos", () => {
  const base = "title: t\nmodels:\n  - id: a\n    H0: 70\n    Omega_m: 0.3\n";
  it("Omega_b and omega_b together are over-determined", () => {
    expect(() => loadScenario(`${base}    Omega_b: 0.05\n    omega_b: 0.02\n`, "x.yaml")).toThrow(
      /x\.yaml:7:5: models\[0\]\.omega_b: baryons are over-determined/,
    );
  });
  it("massive neutrinos without radiation are refused", () => {
    expect(() => loadScenario(`${base}    radiation: none\n    m_nu_eV: [0.06]\n`, "x.yaml")).toThrow(
      /massive neutrinos need thermal radiation/,
    );
  });
  it("more than three massive species are refused by the schema", () => {
    expect(() => loadScenario(`${base}    m_nu_eV: [0.1, 0.1, 0.1, 0.1]\n`, "x.yaml")).toThrow(/at most 3 items/);
  });
});

describe("massive-neutrino model against mpmath fixtures (test/fixtures/mpmath/neutrinos.py wrote neutrinos.json)", async () => {
  const { readFileSync } = await import("node:fs");
  const { redshiftTable, photonDensityParameter } = await import("../../src/engine/index.js");
  const f = JSON.parse(readFileSync(new URL("../fixtures/mpmath/neutrinos.json", import.meta.url), "utf8"));
  const m = makeBackgroundModel({
    H0_km_s_Mpc: f.model.H0,
    Omega_m: f.model.Omega_m,
    curvature: { kind: "Omega_k", Omega_k: f.model.Omega_k },
    w0: -1,
    wa: 0,
    radiation: { T_cmb_K: f.model.T_cmb, N_eff: f.model.N_eff },
    m_nu_eV: f.model.m_nu_eV,
  });
  it("uses the same photon density as the fixture's input", () => {
    expect(relErr(photonDensityParameter(f.model.T_cmb, f.model.H0), Number(f.model.Omega_gamma))).toBeLessThan(1e-15);
  });
  it("Omega_nu today, the age, D_C, lookback time and E(z) agree to 1e-10", () => {
    expect(relErr(m.Omega_nu_massive, Number(f.Omega_nu_massive))).toBeLessThan(1e-9); // interpolated Fermi-Dirac ratio
    expect(relErr(backgroundSummary(m).summary.age_Gyr!, Number(f.age_Gyr))).toBeLessThan(1e-10);
    const zs = f.redshifts.map((r: { z: string }) => Number(r.z));
    const t = redshiftTable(m, zs);
    f.redshifts.forEach((r: Record<string, string>, i: number) => {
      expect(relErr(t.comoving_distance_Mpc[i], Number(r.comoving_distance_Mpc)), `D_C z=${r.z}`).toBeLessThan(1e-10);
      expect(relErr(t.lookback_time_Gyr[i], Number(r.lookback_time_Gyr)), `lookback z=${r.z}`).toBeLessThan(1e-10);
      expect(relErr(t.E[i], Number(r.E)), `E z=${r.z}`).toBeLessThan(1e-10);
    });
  });
});
