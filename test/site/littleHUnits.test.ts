// Lengths in h^-1 Mpc and volumes in h^-3 Mpc^3, chosen per scenario, on pages and in exports, with the h
// used printed beside them. Checked by the identity D[h^-1 Mpc] = h D[Mpc] (and V[h^-3] = h^3 V) against the
// tables document, which stays in Mpc (common practice: each model with its own h = H0/100).
import { describe, expect, it, beforeAll } from "vitest";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseHTML } from "linkedom";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { relErr } from "../helpers/modelOf.js";

const SCENARIO = `title: Little h
id: little-h
h_units: true
redshifts: [0.5, 1]
models:
  - { id: a, H0: 70, Omega_m: 0.3, omega_b: 0.0224 }
  - { id: b, H0: 60, Omega_m: 0.3, omega_b: 0.0224 }
surveys:
  - { name: S, area_deg2: 100, z_min: 0.5, z_max: 1, density_per_Mpc3: 1.0e-4 }
`;

describe("h units", { timeout: 180_000 }, () => {
  let site: string;
  beforeAll(() => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/h.yaml"), SCENARIO);
    site = join(dir, "site");
    const r = runCli(["build", "--scenarios", "scenarios", "--out", site, "--skip-images", "--quiet"], dir);
    if (r.code !== 0) throw new Error(r.stderr);
  });

  it("exports hold h D and h^3 V with h units named; the tables document stays in Mpc", () => {
    const doc = JSON.parse(readFileSync(join(site, "little-h/tables.json"), "utf8"));
    expect(doc.inputs.h_units).toBe(true);
    const exported = JSON.parse(readFileSync(join(site, "little-h/exports/z-comoving_distance_Mpc.json"), "utf8"));
    expect(exported.table.spans[0].unit).toBe("h^-1 Mpc");
    exported.table.rows.forEach((row: { values: number[] }, i: number) => {
      doc.models.forEach((m: { parameters: { H0: number }; redshifts: Record<string, number>[] }, k: number) => {
        const h = m.parameters.H0 / 100;
        expect(relErr(row.values[k], h * m.redshifts[i].comoving_distance_Mpc)).toBeLessThan(1e-15);
      });
    });
    const surveys = JSON.parse(readFileSync(join(site, "little-h/exports/surveys.json"), "utf8"));
    expect(surveys.table.rows[0].label).toMatch(/^S .*: volume$/);
    expect(surveys.table.rows[0].unit).toBe("h^-3 Gpc^3");
    expect(relErr(surveys.table.rows[0].values[0], 0.7 ** 3 * doc.models[0].surveys[0].volume_Gpc3)).toBeLessThan(
      1e-15,
    );
    // Today's quantities convert too: the Hubble distance c/H0 in h^-1 Mpc.
    const diff = JSON.parse(readFileSync(join(site, "little-h/exports/glance.json"), "utf8"));
    const hd = diff.table.rows.find((r: { label: string }) => r.label.startsWith("Hubble distance"));
    expect(relErr(hd.values[0], 0.7 * doc.models[0].summary.hubble_distance_Mpc)).toBeLessThan(1e-15);
    // c/H0 in h^-1 Mpc is the same for every model: 2997.92458 (c = 299792.458 km/s exactly, SI).
    expect(relErr(hd.values[1], 2997.92458)).toBeLessThan(1e-12);
    expect(relErr(hd.values[0], 2997.92458)).toBeLessThan(1e-12);
  });

  it("the page names h units and each model's h beside them", () => {
    const { document } = parseHTML(readFileSync(join(site, "little-h/index.html"), "utf8"));
    expect(document.querySelector(".h-units")!.textContent).toMatch(/a: H0 = 70 km\/s\/Mpc; b: H0 = 60 km\/s\/Mpc/);
    const caption = [...document.querySelectorAll("caption")].find((c) => /Comoving distance D_C/.test(c.textContent!));
    expect(caption!.textContent).toContain("h⁻¹ Mpc");
  });
});
