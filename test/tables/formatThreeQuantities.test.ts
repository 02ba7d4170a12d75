// Quantities added in tables format 3: sizes from an angular size, survey volumes per square degree and
// in Mpc^3, LaTeX labels, and the fate with the time to a big rip. Each is checked against an identity of the
// definitions (Hogg 1999, astro-ph/9905116), never against our own output.
import { describe, expect, it } from "vitest";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { ScenarioInputError } from "../../src/scenario/scenarioIssue.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { tablesDocumentProblem } from "../../src/contract/validateContract.js";
import { presentationTables } from "../../src/presentation/presentTables.js";
import { presentDocument } from "../../src/presentation/presentDocument.js";
import { tableLatex } from "../../src/exports/exportFormats.js";
import { relErr } from "../helpers/modelOf.js";

const FULL_SKY_DEG2 = 4 * Math.PI * (180 / Math.PI) ** 2; // 41252.96 deg^2 (common practice)

const doc = (yaml: string) => buildTablesDocument(loadScenario(yaml, "t.yaml"));

describe("tables format 3 quantities", () => {
  it("a target given an angular size: proper size = theta x proper scale, comoving = (1+z) x proper (Hogg eqs 16, 18)", () => {
    const d = doc(
      "title: t\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\ntargets:\n  - { name: arc, z: 2, size_arcsec: 1.5 }\n  - { name: none, z: 1 }\n",
    );
    expect(tablesDocumentProblem(d)).toBeNull();
    const t = d.models[0].targets[0];
    expect(t.size_arcsec).toBe(1.5);
    expect(relErr(t.proper_size_kpc!, 1.5 * t.kpc_per_arcsec_proper!)).toBeLessThan(1e-15);
    expect(relErr(t.comoving_size_kpc!, 3 * t.proper_size_kpc!)).toBeLessThan(1e-14);
    // Consistency with the angular size of a proper size: theta(l(theta)) = theta.
    expect(d.models[0].targets[1].proper_size_kpc).toBeNull();
  });

  it("a full-sky survey shell: volume = V_C(z_max) - V_C(z_min), per deg^2 = volume / 41252.96 (Hogg eq. 29)", () => {
    const d = doc(
      `title: t\nredshifts: [0.5, 1]\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\nsurveys:\n  - { name: all, area_deg2: ${FULL_SKY_DEG2}, z_min: 0.5, z_max: 1 }\n`,
    );
    const s = d.models[0].surveys[0];
    const rows = d.models[0].redshifts;
    const shellGpc3 = rows[1].comoving_volume_Gpc3! - rows[0].comoving_volume_Gpc3!;
    expect(relErr(s.volume_Mpc3!, shellGpc3 * 1e9)).toBeLessThan(1e-9);
    expect(relErr(s.volume_Mpc3!, s.volume_Gpc3 * 1e9)).toBeLessThan(1e-15);
    expect(relErr(s.volume_per_deg2_Mpc3! * FULL_SKY_DEG2, s.volume_Mpc3!)).toBeLessThan(1e-15);
  });

  it("label_tex is carried to the document and set in math mode in LaTeX exports; the plain label elsewhere", () => {
    const d = doc(
      "title: t\nmodels:\n  - { id: a, label: LCDM, label_tex: '\\Lambda\\mathrm{CDM}', H0: 70, Omega_m: 0.3 }\n  - { id: b, extends: a, w0: -0.9 }\n",
    );
    expect(d.models[0].label_tex).toBe("\\Lambda\\mathrm{CDM}");
    expect(d.models[1].label_tex).toBeNull(); // not inherited, like label
    const models = presentationTables(presentDocument(d)).find((t) => t.id === "models")!;
    const provenance = {
      tool: "cosmoledger",
      tool_version: "0",
      scenario_id: "t",
      scenario_title: "t",
      version: null,
      version_sha256: null,
      inputs_sha256: "0",
      engine_version: "0",
      page: "p",
    };
    expect(tableLatex(models, provenance)).toContain("& $\\Lambda\\mathrm{CDM}$ & b \\\\");
  });

  it.each([
    ["\\input{/etc/passwd}", /may not use \\input/],
    ["\\write18{ls}", /may not use \\write/],
    ["a % comment", /may not contain %/],
    ["^^5cinput", /\^\^/],
    ["\\mathrm{CDM", /\{ without its \}/],
    ["x\\\\y", /may not contain \\\\/],
  ])("label_tex %s is refused where it is written", (tex, message) => {
    const yaml = `title: t\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3, label_tex: ${JSON.stringify(tex)} }\n`;
    try {
      loadScenario(yaml, "t.yaml");
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ScenarioInputError);
      const issue = (e as ScenarioInputError).issues[0];
      expect(issue.path).toBe("models[0].label_tex");
      expect([issue.line, issue.column]).toEqual([3, expect.any(Number)]);
      expect(issue.message).toMatch(message);
    }
  });
});
