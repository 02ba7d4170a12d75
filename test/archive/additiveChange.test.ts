// A real additive contract change, made the way DEVELOPERS.md ("Adding a quantity end to end") says, in a copy of the
// project: the scale factor a = 1/(1+z) (definition of redshift) becomes a per-redshift quantity of a new tables
// format N + 1, N being the newest released format. The rules under test are the schema-evolution rules we follow (old records read as written, forever):
// the format-1 fixture archive and the demo archive must still build, verify --strict and continue their chains.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { cpSync, existsSync, readFileSync, symlinkSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseHTML } from "linkedom";
import { ROOT, tempDir } from "../helpers/buildDemoSite.js";
import { TABLES_FORMAT_NUMBERS } from "../../src/contract/formats.js";

/** The newest released tables format, and the one this test adds. */
const N = TABLES_FORMAT_NUMBERS.at(-1)!;
const NEXT = N + 1;
const list = (n: number) => Array.from({ length: n }, (_, i) => i + 1);

/** Replaces `from` by `to` in a file of the copy, and fails the test if `from` is not there exactly once. */
function edit(project: string, file: string, from: string, to: string): void {
  const path = join(project, file);
  const text = readFileSync(path, "utf8");
  expect(text.split(from).length - 1, `${file}: ${from}`).toBe(1);
  writeFileSync(path, text.replace(from, to));
}

function run(cmd: string, args: string[], cwd: string) {
  const r = spawnSync(cmd, args, { cwd, encoding: "utf8", maxBuffer: 256 * 1024 * 1024 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("an additive contract change keeps every archive readable", { timeout: 600_000 }, () => {
  it("adds a quantity in a new format; the fixture and demo archives still build, verify --strict and continue", () => {
    const project = tempDir("cosmoledger-additive-");
    for (const f of ["src", "bin", "content", "package.json", "tsconfig.json", ".eleventy.js"])
      cpSync(join(ROOT, f), join(project, f), { recursive: true });
    symlinkSync(join(ROOT, "node_modules"), join(project, "node_modules"), "dir");

    // 1. Engine: the quantity, computed in the per-redshift pass.
    edit(
      project,
      "src/engine/redshiftTable.ts",
      "  f_sigma8: Float64Array;\n}",
      "  f_sigma8: Float64Array;\n  scale_factor: Float64Array;\n}",
    );
    edit(project, "src/engine/redshiftTable.ts", '"f_sigma8",\n] as const', '"f_sigma8", "scale_factor",\n] as const');
    edit(
      project,
      "src/engine/redshiftTable.ts",
      "light_travel_distance_Gly: col(),\n",
      "light_travel_distance_Gly: col(), scale_factor: col(),\n",
    );
    edit(
      project,
      "src/engine/redshiftTable.ts",
      "    out.light_travel_distance_Gly[i] = lookback;\n",
      "    out.light_travel_distance_Gly[i] = lookback;\n    out.scale_factor[i] = a; // a = 1/(1+z), the definition of redshift\n",
    );
    // 2. Contract: a new format whose schema is the previous one plus the key; registered; types regenerated.
    const schema = JSON.parse(readFileSync(join(project, `src/schema/tables/${N}.schema.json`), "utf8"));
    schema.$id = `https://cosmoledger.invalid/schema/tables/${NEXT}.schema.json`;
    schema.title = `cosmoledger tables document, format cosmoledger.tables/${NEXT}`;
    schema.properties.format = { const: `cosmoledger.tables/${NEXT}` };
    schema.definitions.row.required.push("scale_factor");
    schema.definitions.row.properties.scale_factor = { $ref: "#/definitions/num" };
    schema.definitions.gridColumns.required.push("scale_factor");
    schema.definitions.gridColumns.properties.scale_factor = { type: "array", items: { $ref: "#/definitions/num" } };
    writeFileSync(join(project, `src/schema/tables/${NEXT}.schema.json`), `${JSON.stringify(schema, null, 2)}\n`);
    edit(
      project,
      "src/contract/formats.ts",
      `TABLES_FORMAT_NUMBERS = [${list(N).join(", ")}] as const`,
      `TABLES_FORMAT_NUMBERS = [${list(NEXT).join(", ")}] as const`,
    );
    edit(
      project,
      "src/contract/formats.ts",
      `TABLES_FORMAT = \`\${TABLES_FORMAT_PREFIX}${N}\``,
      `TABLES_FORMAT = \`\${TABLES_FORMAT_PREFIX}${NEXT}\``,
    );
    edit(
      project,
      "src/contract/validateContract.ts",
      `import tables${N} from "../schema/tables/${N}.schema.json" with { type: "json" };`,
      `import tables${N} from "../schema/tables/${N}.schema.json" with { type: "json" };\nimport tables${NEXT} from "../schema/tables/${NEXT}.schema.json" with { type: "json" };`,
    );
    edit(
      project,
      "src/contract/validateContract.ts",
      `tables: { ${list(N)
        .map((n) => `${n}: tables${n}`)
        .join(", ")} },`,
      `tables: { ${list(NEXT)
        .map((n) => `${n}: tables${n}`)
        .join(", ")} },`,
    );
    edit(
      project,
      "src/contract/tablesDocument.ts",
      `import type { TablesDocumentFormat${N} } from "./generated/tablesFormat${N}.js";`,
      `import type { TablesDocumentFormat${N} } from "./generated/tablesFormat${N}.js";\nimport type { TablesDocumentFormat${NEXT} } from "./generated/tablesFormat${NEXT}.js";`,
    );
    edit(
      project,
      "src/contract/tablesDocument.ts",
      `export type TablesDocument = TablesDocumentFormat${N};`,
      `export type TablesDocument = TablesDocumentFormat${NEXT};`,
    );
    edit(
      project,
      "src/contract/tablesDocument.ts",
      `  | TablesDocumentFormat${N};`,
      `  | TablesDocumentFormat${N}\n  | TablesDocumentFormat${NEXT};`,
    );
    const types = run(process.execPath, ["src/schema/generateContractTypes.mjs"], project);
    expect(types.code, types.stderr).toBe(0);
    // 3. Pages: the catalogue entry (label, unit, group).
    edit(
      project,
      "src/contract/quantityCatalog.ts",
      '{ key: "E", label: "E(z) = H/H0", unit: "" },',
      '{ key: "E", label: "E(z) = H/H0", unit: "" },\n      { key: "scale_factor", label: "Scale factor a", unit: "" },',
    );
    const build = run("npm", ["run", "build:ts"], project);
    expect(build.code, build.stdout + build.stderr).toBe(0);

    const cli = (args: string[], cwd: string) =>
      run(process.execPath, [join(project, "bin/cosmoledger.js"), ...args], cwd);
    // The format-1 fixture: verify --strict lists the new quantity once as added, never as drift.
    const fixture = tempDir();
    cpSync(join(ROOT, "test/fixtures/archive-format-1"), fixture, { recursive: true });
    const v = cli(["verify", "--archive", "scenarios/archive", "--strict"], fixture);
    expect(v.code, v.stderr).toBe(0);
    expect(v.stdout).toMatch(
      /added since frozen \(not drift\): redshifts\[\]\.scale_factor \(not computed in 5 versions\)/,
    );
    expect(v.stdout).toMatch(/added since frozen \(not drift\): grid\.scale_factor/);
    // It continues its chain with the new format.
    const yaml = join(fixture, "scenarios/cinder-vault.yaml");
    writeFileSync(yaml, readFileSync(yaml, "utf8").replace("H0: 70", "H0: 69"));
    expect(cli(["freeze", "scenarios/cinder-vault.yaml", "-m", `format ${NEXT}`], fixture).code).toBe(0);
    const v4 = JSON.parse(readFileSync(join(fixture, "scenarios/archive/cinder-vault/v4.json"), "utf8"));
    expect(v4.tables.format).toBe(`cosmoledger.tables/${NEXT}`);
    expect(
      v4.tables.models[0].redshifts.map((r: { z: number; scale_factor: number }) => r.scale_factor * (1 + r.z)),
    ).toEqual([1, 1]);
    const again = cli(["verify", "--archive", "scenarios/archive", "--strict"], fixture);
    expect(again.code, again.stderr).toBe(0);
    // Pages of every format: old versions say what they did not compute; the diff across formats lists the addition.
    const site = cli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], fixture);
    expect(site.code, site.stderr).toBe(0);
    const v1 = parseHTML(readFileSync(join(fixture, "site/cinder-vault/v1/index.html"), "utf8")).document;
    expect(v1.querySelector(".not-computed")!.textContent).toMatch(/not computed in version 1 .*Scale factor a/);
    expect(v1.querySelector('[data-quantity="scale_factor"]')).toBeNull();
    const v4page = parseHTML(readFileSync(join(fixture, "site/cinder-vault/v4/index.html"), "utf8")).document;
    expect(v4page.querySelector('[data-quantity="scale_factor"]')).not.toBeNull();
    const diff = parseHTML(readFileSync(join(fixture, "site/cinder-vault/diff/v3-v4/index.html"), "utf8")).document;
    expect(diff.querySelector(".format-change")!.textContent).toMatch(
      new RegExp(
        `cosmoledger\\.tables\\/1 → cosmoledger\\.tables\\/${NEXT}; quantities added: .*redshifts\\[\\]\\.scale_factor`,
      ),
    );
    expect(diff.querySelector('tr[data-quantity="scale_factor"]')!.textContent).toMatch(/not computed in version 3/);
    // Exports of an old version leave the quantity out; of the new one, include it.
    expect(
      cli(["export", "scenarios/cinder-vault.yaml", "--version", "1", "--format", "csv", "--out", "exp"], fixture).code,
    ).toBe(0);
    expect(existsSync(join(fixture, "exp/cinder-vault/v1/z-scale_factor.csv"))).toBe(false);
    expect(
      cli(["export", "scenarios/cinder-vault.yaml", "--version", "4", "--format", "csv", "--out", "exp"], fixture).code,
    ).toBe(0);
    expect(existsSync(join(fixture, "exp/cinder-vault/v4/z-scale_factor.csv"))).toBe(true);

    // The demo archive (format 2) too.
    const demo = tempDir();
    cpSync(join(ROOT, "scenarios"), join(demo, "scenarios"), { recursive: true });
    const d = cli(["verify", "--archive", "scenarios/archive", "--strict"], demo);
    expect(d.code, d.stderr).toBe(0);
    expect(d.stdout).toMatch(/added since frozen \(not drift\): redshifts\[\]\.scale_factor/);
    expect(cli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], demo).code).toBe(0);
    expect(
      cli(["freeze", "scenarios/tidewater-geometry.yaml", "-m", `DEMO: first version under format ${NEXT}`], demo).code,
    ).toBe(0);
  });
});

describe("the quantity catalogue is checked against the contract", { timeout: 300_000 }, () => {
  it("a misspelled key in the catalogue fails the type check (it used to show a dash on every page)", () => {
    const project = tempDir("cosmoledger-typo-");
    for (const f of ["src", "package.json", "tsconfig.json"])
      cpSync(join(ROOT, f), join(project, f), { recursive: true });
    symlinkSync(join(ROOT, "node_modules"), join(project, "node_modules"), "dir");
    const tsc = join(ROOT, "node_modules/typescript/bin/tsc");
    const clean = run(process.execPath, [tsc, "--noEmit", "-p", "tsconfig.json"], project);
    expect(clean.code, clean.stdout).toBe(0);
    edit(
      project,
      "src/contract/quantityCatalog.ts",
      '{ key: "hubble_radius_Mpc", label: "Hubble radius c/H(z)"',
      '{ key: "hubble_radius_Mpx", label: "Hubble radius c/H(z)"',
    );
    const typo = run(process.execPath, [tsc, "--noEmit", "-p", "tsconfig.json"], project);
    expect(typo.code).not.toBe(0);
    expect(typo.stdout).toMatch(
      /src\/contract\/quantityCatalog\.ts\(\d+,\d+\): error TS(2322|2820): Type '"hubble_radius_Mpx"' is not assignable/,
    );
  });
});
