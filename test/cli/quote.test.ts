// cosmoledger quote: the numbers are those compute gives for the equivalent scenario (which --save
// writes), closed forms hold through the command, and bad arguments are named with what would be valid (exit 2).
import { describe, expect, it, beforeAll } from "vitest";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { compileProject, runCli, tempDir, ROOT } from "../helpers/buildDemoSite.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "../helpers/referenceScales.js";

beforeAll(() => compileProject());

interface QuoteJson {
  table: { columns: { label: string }[]; rows: { label: string; unit: string; values: (number | null)[] }[] };
}
const quoteJson = (args: string[], cwd = ROOT): QuoteJson => {
  const r = runCli(["quote", ...args, "--format", "json"], cwd);
  expect(r.code, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
};
const value = (q: QuoteJson, label: string, model = 0) => {
  const row = q.table.rows.find((r) => r.label === label);
  expect(row, `no row "${label}" in ${q.table.rows.map((r) => r.label).join("; ")}`).toBeDefined();
  return row!.values[model];
};

describe("quote", { timeout: 180_000 }, () => {
  it("gives exactly what compute gives for the scenario --save writes (several models and placements)", () => {
    const dir = tempDir();
    const args = [
      "--model",
      "id=flat H0=67.7 Omega_m=0.31 m_nu_eV=[0.06]",
      "--model",
      "id=open extends=flat Omega_k=0.05 w0=-0.9 wa=0.2",
      "--model",
      "id=closed H0=72 Omega_m=0.35 Omega_k=-0.03 radiation=none",
      "--z",
      "0.3,2",
      "--age-Gyr",
      "1.5",
      "--lookback-Gyr",
      "9",
      "--distance-Mpc",
      "3000",
      "--size-kpc",
      "10",
      "--quantities",
      "z,D_A,D_L,scale,age,lookback,size,H",
      "--save",
      "quick.yaml",
    ];
    const q = quoteJson(args, dir);
    const c = runCli(["compute", "quick.yaml", "--json"], dir);
    expect(c.code, c.stderr).toBe(0);
    const doc = JSON.parse(c.stdout);
    doc.models.forEach((m: { redshifts: Record<string, number>[]; targets: Record<string, number>[] }, i: number) => {
      // Redshift placements: the table rows of the saved scenario.
      expect(value(q, "z = 2: Angular-diameter distance D_A", i)).toBe(m.redshifts[1].angular_diameter_distance_Mpc);
      expect(value(q, "z = 0.3: Hubble rate H(z)", i)).toBe(m.redshifts[0].H_km_s_Mpc);
      // Every placement is a target here (a size was given): the target rows of the saved scenario.
      const target = (name: string) => m.targets.find((t) => String(t.name) === name)!;
      expect(value(q, "z = 2: Angular size", i)).toBe(target("z = 2").angular_size_arcsec);
      expect(value(q, "age = 1.5 Gyr: Redshift", i)).toBe(target("age = 1.5 Gyr").z);
      expect(value(q, "age = 1.5 Gyr: Luminosity distance D_L", i)).toBe(
        target("age = 1.5 Gyr").luminosity_distance_Mpc,
      );
      expect(value(q, "lookback = 9 Gyr: Proper scale", i)).toBe(target("lookback = 9 Gyr").kpc_per_arcsec_proper);
      expect(value(q, "D_C = 3000 Mpc: Age at z", i)).toBe(target("D_C = 3000 Mpc").age_Gyr);
    });
    // The saved file is a scenario of its own that names how it was made.
    expect(readFileSync(join(dir, "quick.yaml"), "utf8")).toMatch(/^# Written by cosmoledger quote/);
  });

  it("a per-redshift quantity at an age is the table row at the redshift that age was solved to", () => {
    const dir = tempDir();
    const q = quoteJson(
      ["--model", "H0=70 Omega_m=0.3", "--age-Gyr", "2", "--quantities", "z,H,V_C", "--save", "s.yaml"],
      dir,
    );
    const z = value(q, "age = 2 Gyr: Redshift") as number;
    writeFileSync(join(dir, "t.yaml"), `title: t\nredshifts: [${z}]\nmodels:\n  - { id: m1, H0: 70, Omega_m: 0.3 }\n`);
    const doc = JSON.parse(runCli(["compute", "t.yaml", "--json"], dir).stdout);
    expect(value(q, "age = 2 Gyr: Hubble rate H(z)")).toBe(doc.models[0].redshifts[0].H_km_s_Mpc);
    expect(value(q, "age = 2 Gyr: Comoving volume inside z (full sky)")).toBe(
      doc.models[0].redshifts[0].comoving_volume_Gpc3,
    );
  });

  it("closed forms through the command: Einstein-de Sitter D_C and the redshift of a given age (Hogg 1999)", () => {
    // Flat, matter only, no radiation: D_C = 2 D_H (1 - 1/sqrt(1+z)); t(z) = (2/3) t_H (1+z)^(-3/2).
    const q = quoteJson(["--model", "H0=70 Omega_m=1 flat=true radiation=none", "--z", "2", "--age-Gyr", "1"]);
    const dC = value(q, "z = 2: Comoving distance D_C") as number;
    expect(Math.abs(dC / (2 * hubbleDistanceMpc(70) * (1 - 1 / Math.sqrt(3))) - 1)).toBeLessThan(1e-10);
    const z = value(q, "age = 1 Gyr: Redshift") as number;
    const zClosed = ((2 / 3) * hubbleTimeGyr(70)) ** (2 / 3) - 1;
    expect(Math.abs(z / zClosed - 1)).toBeLessThan(1e-9);
  });

  it("a scenario file with some of its models: columns are those models, numbers those of the derived scenario", () => {
    const dir = tempDir();
    const file = join(ROOT, "scenarios/lantern-deep-field.yaml");
    const q = quoteJson(
      [file, "--models", "mildly-closed,reference", "--z", "1", "--quantities", "D_A", "--save", "d.yaml"],
      dir,
    );
    expect(q.table.columns.map((c) => c.label)).toEqual(["Mildly closed", "Flat reference (demo values)"]);
    // The derived scenario keeps the file's models, comments and keys, with the placements as its redshifts.
    const saved = readFileSync(join(dir, "d.yaml"), "utf8");
    expect(saved).toMatch(/^# DEMO DATA/);
    expect(saved).toMatch(/\nredshifts: \[ 1 \]\n/);
    const doc = JSON.parse(runCli(["compute", "d.yaml", "--json"], dir).stdout);
    const atZ1 = (id: string) => doc.models.find((m: { id: string }) => m.id === id).redshifts[0];
    expect(value(q, "z = 1: Angular-diameter distance D_A", 0)).toBe(
      atZ1("mildly-closed").angular_diameter_distance_Mpc,
    );
    expect(value(q, "z = 1: Angular-diameter distance D_A", 1)).toBe(atZ1("reference").angular_diameter_distance_Mpc);
    // And it agrees with the whole file's table at z = 1 to the engine's accuracy (1e-10; the file integrates over
    // more redshifts, so the last bit may differ).
    const full = JSON.parse(runCli(["compute", file, "--json"]).stdout);
    const fullAt = full.models
      .find((m: { id: string }) => m.id === "reference")
      .redshifts.find((r: { z: number }) => r.z === 1);
    expect(
      Math.abs(
        (value(q, "z = 1: Angular-diameter distance D_A", 1) as number) / fullAt.angular_diameter_distance_Mpc - 1,
      ),
    ).toBeLessThan(1e-12);
  });

  it("the terminal table: quantities as rows with units, models as columns, six significant digits", () => {
    const r = runCli(["quote", "--model", "H0=70 Omega_m=0.3", "--model", "H0=67 Omega_m=0.32", "--z", "2"]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/^\s+m1\s+m2\n/);
    expect(r.stdout).toMatch(/\nz = 2\n/);
    expect(r.stdout).toMatch(/\n {2}D_A +\[Mpc\] +\d{4}\.\d{2} +\d{4}\.\d{2}\n/);
    expect(r.stdout).toMatch(/FLRW background and linear growth only/);
  });

  it("bad arguments are named with what would be valid (exit 2), never a stack trace", () => {
    const bad = (args: string[], message: RegExp) => {
      const r = runCli(["quote", ...args]);
      expect(r.code, r.stderr).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(/\n\s+at |unexpected failure/);
    };
    bad(
      ["--model", "H0=70 Omega_M=0.3", "--z", "1"],
      /--model "H0=70 Omega_M=0\.3": Omega_M: .*did you mean Omega_m\?/,
    );
    bad(["--model", "H0=70 Omega_m=0.3", "--z", "1,x"], /--z x: "x" is not a decimal number/);
    bad(
      ["--model", "H0=70 Omega_m=0.3", "--z", "1", "--quantities", "D_a"],
      /unknown quantity "D_a"\. did you mean D_A\?/,
    );
    bad(["--model", "H0=70 Omega_m=0.3", "--z", "1", "--format", "xls"], /--format xls: valid formats are table, csv/);
    bad(["--model", "H0 70", "--z", "1"], /"H0" is not key=value/);
    bad(["--model", "H0=70 Omega_m=0.3"], /say where to quote: --z/);
    bad(["--model", "H0=70 Omega_m=0.3", "--z", "1", "--quantities", "size"], /needs --size-kpc/);
    bad(
      ["--model", "H0=70 Omega_m=0.1 Omega_Lambda=1.5", "--z", "1"],
      /--model "H0=70 Omega_m=0\.1 Omega_Lambda=1\.5".*no big bang/,
    );
    bad(
      [join(ROOT, "scenarios/lantern-deep-field.yaml"), "--models", "refrence", "--z", "1"],
      /did you mean reference\?/,
    );
  });

  it("--save never overwrites a file", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "mine.yaml"), "my own notes\n");
    const r = runCli(["quote", "--model", "H0=70 Omega_m=0.3", "--z", "1", "--save", "mine.yaml"], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--save mine\.yaml: the file exists; quote never overwrites/);
    expect(readFileSync(join(dir, "mine.yaml"), "utf8")).toBe("my own notes\n");
    expect(existsSync(join(dir, "quote.yaml"))).toBe(false);
  });

  it("--help shows examples", () => {
    const r = runCli(["quote", "--help"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Examples:\n {2}cosmoledger quote --model "H0=70 Omega_m=0\.3" --z 2/);
  });
});
