// Matter that is mostly massive neutrinos, partly relativistic: the energy integral, the matter-like part rho - 3p
// (its own integral M = F - P, never a difference of two interpolated numbers), Omega_m(z), matter-radiation
// equality and k_eq, against 30-digit mpmath values (test/fixtures/mpmath/neutrinoMatter.py wrote the JSON).
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { lnEnergyRatio, lnMatterRatio } from "../../src/engine/fermiDiracEnergy.js";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { relErr } from "../helpers/modelOf.js";

const f = JSON.parse(readFileSync(new URL("../fixtures/mpmath/neutrinoMatter.json", import.meta.url), "utf8"));

describe("neutrino-dominated matter against mpmath (test/fixtures/mpmath/neutrinoMatter.json)", () => {
  it("F/F(0) and M/F(0) to 1e-10 where a species turns non-relativistic", () => {
    for (const r of f.integrals) {
      const lnY = Math.log(Number(r.y));
      expect(relErr(Math.exp(lnEnergyRatio(lnY)), Number(r.F_over_F0)), `F at y = ${r.y}`).toBeLessThan(1e-10);
      expect(relErr(Math.exp(lnMatterRatio(lnY)), Number(r.M_over_F0)), `M at y = ${r.y}`).toBeLessThan(1e-10);
    }
  });

  it("Omega_m(z) to 1e-10 up to z = 63,096 when matter is mostly 1.5 eV neutrinos", () => {
    const m = f.light_matter;
    const zs = m.Omega_m_z.map((r: { z: string }) => Number(r.z));
    const s = loadScenario(
      `title: t\nid: t\nredshifts: [${zs.join(", ")}]\nmodels:\n  - { id: m, H0: ${m.H0}, Omega_m: ${m.Omega_m}, m_nu_eV: [1.5, 1.5, 1.5] }\n`,
      "t.yaml",
    );
    const rows = buildTablesDocument(s, { chartGrid: false }).models[0].redshifts;
    m.Omega_m_z.forEach((r: { z: string; Omega_m_z: string }, i: number) =>
      expect(relErr(rows[i].Omega_m_z as number, Number(r.Omega_m_z)), `z = ${r.z}`).toBeLessThan(1e-10),
    );
  });

  it("z_eq and k_eq to 1e-10 with three 3 eV species", () => {
    const h = f.heavy;
    const s = loadScenario(
      `title: t\nid: t\nredshifts: [1]\nmodels:\n  - { id: m, H0: ${h.H0}, Omega_m: ${h.Omega_m}, omega_b: 0.022, m_nu_eV: [3, 3, 3] }\n`,
      "t.yaml",
    );
    const summary = buildTablesDocument(s, { chartGrid: false }).models[0].summary;
    expect(relErr(summary.z_matter_radiation_equality as number, Number(h.z_eq))).toBeLessThan(1e-10);
    expect(relErr(summary.k_eq_1_Mpc as number, Number(h.k_eq_1_Mpc))).toBeLessThan(1e-10);
  });
});
