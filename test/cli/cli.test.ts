import { describe, expect, it, beforeAll } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync, existsSync, readdirSync, mkdirSync, copyFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { Ajv } from "ajv";
import { parse as parseCsv } from "csv-parse/sync";
import tablesSchema from "../../src/schema/tables/6.schema.json" with { type: "json" };
import { TABLES_FORMAT } from "../../src/contract/formats.js";
import { compileProject } from "../helpers/buildDemoSite.js";
import { MPC_CM, FULL_SKY_DEG2, REDSHIFT_COLUMN_KEYS } from "../../src/engine/index.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "../helpers/referenceScales.js";

const ROOT = resolve(import.meta.dirname, "../..");
const BIN = join(ROOT, "bin/cosmoledger.js");
const DEMO = readdirSync(join(ROOT, "scenarios"))
  .filter((f) => f.endsWith(".yaml"))
  .map((f) => join(ROOT, "scenarios", f));

function run(args: string[], cwd = ROOT) {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: "utf8", maxBuffer: 256 * 1024 * 1024 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}
const tmp = () => mkdtempSync(join(tmpdir(), "cosmoledger-test-"));

beforeAll(() => compileProject());

describe("cosmoledger CLI on the demo scenarios", () => {
  it("check accepts every demo file", () => {
    const r = run(["check", ...DEMO]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout.match(/^ok: /gm)?.length).toBe(DEMO.length);
  });

  it("compute writes tables.json and CSVs that validate against the published schema, byte-identically twice", () => {
    const a = tmp();
    const b = tmp();
    expect(run(["compute", ...DEMO, "--out", a]).code).toBe(0);
    expect(run(["compute", ...DEMO, "--out", b]).code).toBe(0);
    const validate = new Ajv({ allErrors: true, strict: true, allowUnionTypes: true }).compile(tablesSchema);
    for (const f of DEMO) {
      const id = f.split("/").pop()!.replace(".yaml", "");
      const docText = readFileSync(join(a, id, "tables.json"), "utf8");
      expect(docText).toBe(readFileSync(join(b, id, "tables.json"), "utf8"));
      const doc = JSON.parse(docText);
      expect(doc.format).toBe(TABLES_FORMAT);
      expect(validate(doc), JSON.stringify(validate.errors?.slice(0, 3))).toBe(true);
      for (const csv of ["parameters.csv", "summary.csv", "redshifts.csv", "differences.csv"])
        expect(existsSync(join(a, id, csv))).toBe(true);
      // CSV parsed back (csv-parse) gives the document's numbers.
      const rows = parseCsv(readFileSync(join(a, id, "redshifts.csv"), "utf8"), { columns: true }) as Record<
        string,
        string
      >[];
      const first = doc.models[0];
      first.redshifts.forEach((row: Record<string, number | null>, i: number) => {
        for (const k of REDSHIFT_COLUMN_KEYS) expect(rows[i][k]).toBe(row[k] === null ? "" : String(row[k]));
      });
    }
  });

  it("tables.json holds the closed-form values through the whole pipeline (YAML, resolver, engine, JSON)", () => {
    // Closed forms without radiation (Hogg 1999; textbook): Einstein-de Sitter D_L = 2 D_H (1+z)(1 - (1+z)^-1/2),
    // age(z) = (2/3) t_H (1+z)^-3/2; flat Lambda with matter, age today = (2/3) t_H asinh(sqrt(OL/Om)) / sqrt(OL).
    const dir = tmp();
    const file = join(dir, "closed-forms.yaml");
    writeFileSync(
      file,
      [
        "id: closed-forms",
        "title: Closed forms",
        "redshifts: [0.5, 1, 3]",
        "models:",
        "  - { id: eds, H0: 70, Omega_m: 1, radiation: none }",
        "  - { id: lcdm, H0: 67, Omega_m: 0.3, radiation: none }",
        "",
      ].join("\n"),
    );
    const r = run(["compute", file, "--json"]);
    expect(r.code, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout);
    const [eds, lcdm] = doc.models;
    const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
    eds.redshifts.forEach((row: Record<string, number>) => {
      const z = row.z;
      expect(
        rel(row.luminosity_distance_Mpc, 2 * hubbleDistanceMpc(70) * (1 + z) * (1 - 1 / Math.sqrt(1 + z))),
      ).toBeLessThan(1e-10);
      expect(rel(row.age_Gyr, (2 / 3) * hubbleTimeGyr(70) * (1 + z) ** -1.5)).toBeLessThan(1e-10);
    });
    const OL = 0.7;
    expect(
      rel(lcdm.summary.age_Gyr, ((2 / 3) * hubbleTimeGyr(67) * Math.asinh(Math.sqrt(OL / 0.3))) / Math.sqrt(OL)),
    ).toBeLessThan(1e-10);
  });

  it("--help answers on every command", () => {
    for (const args of [["--help"], ["check", "--help"], ["compute", "--help"]]) {
      const r = run(args);
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/Usage: cosmoledger/);
    }
  });
});

describe("targets and surveys in tables.json against closed forms (Einstein-de Sitter, Hogg 1999)", () => {
  it("angular size, apparent magnitude, bolometric flux, lookback placement and shell volume", () => {
    const dir = tmp();
    const file = join(dir, "eds.yaml");
    writeFileSync(
      file,
      [
        "title: Einstein-de Sitter check",
        "models:",
        "  - { id: eds, H0: 70, Omega_m: 1, Omega_de: 0, radiation: none }",
        "targets:",
        "  - { name: arc, z: 2, size_kpc: 5, absolute_magnitude: -21, luminosity_erg_s: 1.0e+44 }",
        "  - { name: old, lookback_Gyr: 5 }",
        "surveys:",
        "  - { name: shell, area_deg2: 100, z_min: 0.5, z_max: 1, density_per_Mpc3: 1.0e-3 }",
        "",
      ].join("\n"),
    );
    const r = run(["compute", file, "--json"]);
    expect(r.code, r.stderr).toBe(0);
    const m = JSON.parse(r.stdout).models[0];
    const DH = hubbleDistanceMpc(70);
    const DC = (z: number) => 2 * DH * (1 - 1 / Math.sqrt(1 + z)); // EdS closed form
    const arc = m.targets[0];
    const DA = DC(2) / 3;
    const DL = DC(2) * 3;
    const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
    // theta = size / D_A; 1 arcsec = pi / 648000 rad
    expect(rel(arc.angular_size_arcsec, (5e-3 / DA) * (648000 / Math.PI))).toBeLessThan(1e-10);
    // m = M + 5 log10(D_L / 10 pc)
    expect(Math.abs(arc.apparent_magnitude - (-21 + 5 * Math.log10(DL * 1e5)))).toBeLessThan(1e-9);
    // F = L / (4 pi D_L^2); 1 Mpc = 3.0856775814913673e24 cm (IAU 2015 B2 parsec; value recalled from memory)
    expect(rel(arc.bolometric_flux_erg_s_cm2, 1e44 / (4 * Math.PI * (DL * 3.0856775814913673e24) ** 2))).toBeLessThan(
      1e-10,
    );
    expect(rel(MPC_CM, 3.0856775814913673e24)).toBeLessThan(1e-15);
    // EdS lookback: t_L = (2/3) t_H (1 - (1+z)^-1.5) -> z = (1 - 1.5 t_L / t_H)^(-2/3) - 1
    const tH = 977.792221 / 70; // t_H in Gyr = 977.792221 / H0 (common practice; recalled from memory)
    expect(rel(m.targets[1].z, (1 - (1.5 * 5) / tH) ** (-2 / 3) - 1)).toBeLessThan(1e-6);
    // shell: (4 pi / 3) (D_C2^3 - D_C1^3) * area / full sky (41252.96 deg^2)
    const shellMpc3 = ((4 * Math.PI) / 3) * (DC(1) ** 3 - DC(0.5) ** 3) * (100 / 41252.96124941928);
    expect(rel(m.surveys[0].volume_Gpc3, shellMpc3 * 1e-9)).toBeLessThan(1e-10);
    expect(rel(m.surveys[0].expected_count, shellMpc3 * 1e-3)).toBeLessThan(1e-10);
    expect(rel(FULL_SKY_DEG2, 41252.96124941928)).toBeLessThan(1e-15);
  });
});

describe("bad input through the CLI: exit 2, a located message, no stack trace, nothing written", () => {
  it("an invalid file among valid ones writes none of them", () => {
    const dir = tmp();
    const bad = join(dir, "bad.yaml");
    writeFileSync(bad, "title: t\nmodels:\n  - id: a\n    H0: seventy\n    Omega_m: 0.3\n");
    const out = join(dir, "out");
    const r = run(["compute", ...DEMO, bad, "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/bad\.yaml:4:9: models\[0\]\.H0: must be a number \(got "seventy"\)/);
    expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
    expect(existsSync(out)).toBe(false);
  });

  it("a missing file and an unknown option are input errors (exit 2)", () => {
    expect(run(["check", "/nonexistent/x.yaml"]).code).toBe(2);
    expect(run(["check", "/nonexistent/x.yaml"]).stderr).toMatch(/x\.yaml:1:1: the path does not exist/);
    expect(run(["compute", "--frobnicate", DEMO[0]]).code).toBe(2);
  });

  it("never overwrites a folder it did not create", () => {
    const dir = tmp();
    const out = join(dir, "out");
    mkdirSync(join(out, "lantern-deep-field"), { recursive: true });
    writeFileSync(join(out, "lantern-deep-field", "my-notes.txt"), "mine");
    const r = run(["compute", join(ROOT, "scenarios/lantern-deep-field.yaml"), "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/refusing to write/);
    expect(readFileSync(join(out, "lantern-deep-field", "my-notes.txt"), "utf8")).toBe("mine");
    expect(existsSync(join(out, "lantern-deep-field", "tables.json"))).toBe(false);
  });

  it("two files with the same id are refused", () => {
    const dir = tmp();
    copyFileSync(DEMO[0], join(dir, "copy.yaml"));
    const r = run(["compute", DEMO[0], join(dir, "copy.yaml"), "--out", join(dir, "out")]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/is also used by/);
  });

  it("prints progress on stderr when more than three files are computed", () => {
    const dir = tmp();
    const files = [0, 1, 2, 3].map((i) => {
      const f = join(dir, `s${i}.yaml`);
      writeFileSync(f, `title: s${i}\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\n`);
      return f;
    });
    const r = run(["compute", ...files, "--out", join(dir, "out")]);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/\[4\/4\] computing/);
  });
});
