// The versioned data contract. Expected behaviour comes from the schema-evolution rules we follow (Avro and Protocol
// Buffers: a reader resolves a record by the format it was written in; old writers' files are read forever), and
// from the format-1 fixture archive frozen by the released code (test/fixtures/archive-format-1, never regenerated).
import { TABLES_FORMAT, VERSION_FORMAT } from "../../src/contract/formats.js";
import { describe, expect, it, beforeAll } from "vitest";
import { cpSync, existsSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parse as parseCsv } from "csv-parse/sync";
import { parseHTML } from "linkedom";
import { compileProject, ROOT, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { tablesDocumentProblem, versionRecordProblem } from "../../src/contract/validateContract.js";
import { versionHash, type StoredVersionRecord } from "../../src/contract/versionRecord.js";
import { compareWithRecomputed } from "../../src/archive/versionDrift.js";
import { DECLARED_CHANGES, ENGINE_VERSION, explainingChange, type DeclaredChange } from "../../src/engine/index.js";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { inputsSha256, inputsSha256Format1 } from "../../src/contract/inputsHash.js";

const FIXTURE = join(ROOT, "test/fixtures/archive-format-1");
const record = (id: string, n: number): StoredVersionRecord =>
  JSON.parse(readFileSync(join(FIXTURE, `scenarios/archive/${id}/v${n}.json`), "utf8"));

/** A working copy of the fixture (scenarios and archive), so that tests may freeze into it. */
function fixtureCopy(): string {
  const dir = tempDir();
  cpSync(FIXTURE, dir, { recursive: true });
  return dir;
}

beforeAll(() => compileProject());

describe("format 1, as released, stays readable", { timeout: 180_000 }, () => {
  it("every fixture record validates against the schemas of the formats it declares, and not against format 2", () => {
    for (const [id, n] of [
      ["ember-relay", 1],
      ["ember-relay", 2],
      ["cinder-vault", 1],
      ["cinder-vault", 2],
      ["cinder-vault", 3],
    ] as const) {
      const r = record(id, n);
      expect(r.format).toBe("cosmoledger.version/1");
      expect(r.tables.format).toBe("cosmoledger.tables/1");
      expect(versionRecordProblem(r)).toBeNull();
      expect(tablesDocumentProblem(r.tables)).toBeNull();
      expect(versionHash(r)).toBe(r.sha256);
      // Read as if it were format 2, it would be refused: the reader must go by the declared format.
      expect(tablesDocumentProblem({ ...r.tables, format: "cosmoledger.tables/2" })).toMatch(/tables\/2\.schema\.json/);
    }
  });

  it("format-1 inputs hashes are kept under their own rule; format 2 hashes canonical JSON, independent of key order", () => {
    const r = record("ember-relay", 2);
    const doc = buildTablesDocument(loadScenario(r.source.text, r.source.path));
    // Same inputs, hashed with the engine version the record holds: the format-1 rule reproduces the stored hash.
    expect(inputsSha256Format1(r.tables.engine.version, doc.inputs)).toBe(r.tables.scenario.inputs_sha256);
    expect(doc.scenario.inputs_sha256).toBe(inputsSha256(doc.engine.version, doc.inputs));
    // Reversing the key order of every object changes the format-1 hash but not the format-2 one.
    const reversed = (v: unknown): unknown =>
      Array.isArray(v)
        ? v.map(reversed)
        : v && typeof v === "object"
          ? Object.fromEntries(
              Object.entries(v)
                .reverse()
                .map(([k, x]) => [k, reversed(x)]),
            )
          : v;
    const shuffled = reversed(doc.inputs) as typeof doc.inputs;
    expect(inputsSha256(doc.engine.version, shuffled)).toBe(doc.scenario.inputs_sha256);
    expect(inputsSha256Format1(r.tables.engine.version, shuffled)).not.toBe(r.tables.scenario.inputs_sha256);
  });

  it("verify --strict, the site, the diff pages and export read the fixture; freeze continues its chains in the new format", () => {
    const dir = fixtureCopy();
    const v = runCli(["verify", "--archive", "scenarios/archive", "--strict"], dir);
    expect(v.code, v.stderr).toBe(0);
    expect(v.stdout).toMatch(
      /2 scenarios, 5 versions \(5 of cosmoledger\.tables\/1\); every hash and chain link checks out/,
    );

    // Same text under a newer engine (1.1.0 changed the neutrino pressure, a declared change): the numbers moved, so
    // freezing makes a new version of the current format; freezing once more is then a no-op.
    const same = runCli(["freeze", "scenarios/ember-relay.yaml", "-m", "again"], dir);
    expect(same.code, same.stderr).toBe(0);
    expect(same.stdout).toMatch(/froze ember-relay version 3/);
    const v3 = JSON.parse(readFileSync(join(dir, "scenarios/archive/ember-relay/v3.json"), "utf8"));
    expect([v3.format, v3.tables.format, v3.previous_sha256]).toEqual([
      VERSION_FORMAT,
      TABLES_FORMAT,
      record("ember-relay", 2).sha256,
    ]);
    const noop = runCli(["freeze", "scenarios/ember-relay.yaml", "-m", "again"], dir);
    expect(noop.stdout).toMatch(/unchanged: ember-relay version 3 already holds these inputs/);
    // An edit continues the chain.
    const yaml = join(dir, "scenarios/ember-relay.yaml");
    writeFileSync(yaml, readFileSync(yaml, "utf8").replace("H0: 67.7", "H0: 67.8"));
    const f = runCli(["freeze", "scenarios/ember-relay.yaml", "-m", "after the format change"], dir);
    expect(f.code, f.stderr).toBe(0);
    const v4 = JSON.parse(readFileSync(join(dir, "scenarios/archive/ember-relay/v4.json"), "utf8"));
    expect(v4.previous_sha256).toBe(v3.sha256);
    const again = runCli(["verify", "--archive", "scenarios/archive", "--strict"], dir);
    expect(again.code, again.stderr).toBe(0);
    expect(again.stdout).toContain(`7 versions (5 of cosmoledger.tables/1, 2 of ${TABLES_FORMAT})`);

    const b = runCli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], dir);
    expect(b.code, b.stderr).toBe(0);
    for (const p of [
      "ember-relay/v1",
      "ember-relay/v2",
      "ember-relay/v3",
      "ember-relay/v4",
      "cinder-vault/v3",
      "ember-relay/diff/v1-v2",
      "ember-relay/diff/v2-v3",
      "ember-relay/diff/v3-v4",
      "cinder-vault/diff/v2-v3",
    ]) {
      expect(existsSync(join(dir, "site", p, "index.html")), p).toBe(true);
    }
    const { document } = parseHTML(readFileSync(join(dir, "site/ember-relay/diff/v2-v3/index.html"), "utf8"));
    expect(document.querySelector(".format-change")!.textContent).toContain(`cosmoledger.tables/1 → ${TABLES_FORMAT}`);
    // The v1 page shows its stored numbers (never recomputed): the age cell equals the stored age, as the page formats it.
    const v1 = parseHTML(readFileSync(join(dir, "site/ember-relay/v1/index.html"), "utf8")).document;
    expect(v1.querySelector("[data-status=frozen]")).not.toBeNull();
    expect(v1.body.textContent).toContain("cosmoledger.tables/1");

    const e = runCli(
      ["export", "scenarios/ember-relay.yaml", "--version", "1", "--format", "csv", "--out", "exp"],
      dir,
    );
    expect(e.code, e.stderr).toBe(0);
    const glance = parseCsv(readFileSync(join(dir, "exp/ember-relay/v1/glance.csv"), "utf8"), {
      comment: "#",
      relax_column_count: true,
    }) as string[][];
    const age = glance.find((row) => row[0].startsWith("Age today"))!;
    const stored = record("ember-relay", 1).tables.models.map((m) => m.summary.age_Gyr);
    expect(age.slice(1).map(Number)).toEqual(stored);
  });

  it("a record or document of a future format is a clear error naming the file and the format (exit 2)", () => {
    const dir = fixtureCopy();
    const file = join(dir, "scenarios/archive/cinder-vault/v3.json");
    const r = JSON.parse(readFileSync(file, "utf8"));
    r.format = "cosmoledger.version/7";
    r.sha256 = versionHash(r);
    writeFileSync(file, JSON.stringify(r));
    const v = runCli(["verify", "--archive", "scenarios/archive"], dir);
    expect(v.code).toBe(2);
    expect(v.stderr).toMatch(
      /cinder-vault\/v3\.json: not a valid version record: written by a newer cosmoledger \(format cosmoledger\.version\/7; this release reads cosmoledger\.version\/1 to cosmoledger\.version\/\d+\); upgrade/,
    );
    expect(tablesDocumentProblem({ format: "cosmoledger.tables/12" })).toMatch(
      /written by a newer cosmoledger .*upgrade/,
    );
    expect(tablesDocumentProblem({ format: "something else" })).toMatch(/not a cosmoledger tables document/);
  });
});

/**
 * Keys tables format 3 added (README, "Formats and what changes them"): a format-1 or format-2 document lacks them,
 * so comparing it with a recomputation lists those its scenario has as added, never as drift.
 */
const FORMAT_3_ADDITIONS = [
  "label_tex",
  "summary.rip_time_Gyr",
  "summary.time_to_rip_Gyr",
  "surveys[].volume_Mpc3",
  "surveys[].volume_per_deg2_Mpc3",
  "targets[].comoving_size_kpc",
  "targets[].proper_size_kpc",
  "targets[].size_arcsec",
  // Format 5: the light-travel distance in Mpc (beside the Gly of every format).
  "redshifts[].light_travel_distance_Mpc",
  "grid.light_travel_distance_Mpc",
  // Format 6: the linear growth.
  ...["growth_factor", "growth_rate", "sigma8_z", "f_sigma8"].flatMap((k) => [
    `redshifts[].${k}`,
    `grid.${k}`,
    `targets[].${k}`,
  ]),
  "summary.growth_rate_0",
  "summary.S8",
  "surveys[].z_eff",
  "surveys[].growth_rate_z_eff",
  "surveys[].f_sigma8_z_eff",
  "parameters.sigma8",
];
/** Drift the growth release explains in every older version: the cautions name what the growth leaves out. */
const notCautions = (d: { quantity: string }) => !d.quantity.startsWith("cautions");

describe("drift the engine means", () => {
  // A version that imitates one computed by an older engine whose age differed by 1e-6 in neutrino models.
  const r = record("ember-relay", 1);
  const now = buildTablesDocument(loadScenario(r.source.text, r.source.path));
  const old = structuredClone(r.tables);
  old.engine.version = "0.9.0";
  for (const m of old.models)
    if (m.parameters.m_nu_eV.some((x) => x > 0.1)) m.summary.age_Gyr = (m.summary.age_Gyr as number) * (1 + 1e-6);
  const change: DeclaredChange = {
    id: "test-neutrino-age",
    engine_version: "1.0.0",
    quantities: ["summary.age_*"],
    models: "models with a neutrino above 0.1 eV",
    applies: (p) => p.m_nu_eV.some((x) => x > 0.1),
    why: "a test of the mechanism",
  };

  it("without a declared change the drift is unexplained; with one it is explained and named", () => {
    // A scenario without massive neutrinos, which the engine's own declared changes (1.1.0, 1.2.0) leave alone.
    const c = record("cinder-vault", 1);
    const cNow = buildTablesDocument(loadScenario(c.source.text, c.source.path));
    const cOld = structuredClone(c.tables);
    cOld.engine.version = "0.9.0";
    const target = cOld.models[1];
    target.summary.age_Gyr = (target.summary.age_Gyr as number) * (1 + 1e-6);
    const testChange: DeclaredChange = {
      id: "test-age",
      engine_version: "1.0.0",
      quantities: ["summary.age_*"],
      models: "every model",
      applies: () => true,
      why: "a test of the mechanism",
    };
    const bare = compareWithRecomputed(cOld, cNow, DECLARED_CHANGES, ENGINE_VERSION);
    expect(bare.drift.filter(notCautions).map((d) => [d.model, d.quantity, d.explainedBy])).toEqual([
      [target.id, "summary.age_Gyr", null],
    ]);
    // The cautions' new words are explained by a declared change (either release that changed them), never unexplained.
    expect(bare.drift.filter((d) => !notCautions(d)).every((d) => d.explainedBy !== null)).toBe(true);
    expect(bare.drift.filter(notCautions)[0].relative).toBeCloseTo(1e-6, 9);
    const declared = compareWithRecomputed(cOld, cNow, [testChange, ...DECLARED_CHANGES], ENGINE_VERSION);
    expect(declared.drift.filter(notCautions).map((d) => d.explainedBy?.id)).toEqual(["test-age"]);
    expect(bare.added.length).toBeGreaterThan(0);
    expect(bare.added.filter((k) => !FORMAT_3_ADDITIONS.includes(k))).toEqual([]);
    // In a neutrino scenario frozen by engine 1.0.0, the engine's own changes explain every drift they cause.
    const real = compareWithRecomputed(r.tables, now, DECLARED_CHANGES, ENGINE_VERSION);
    expect(real.drift.length).toBeGreaterThan(0);
    expect(new Set(real.drift.map((d) => d.explainedBy?.id))).toEqual(
      new Set(["neutrino-pressure-integral", "neutrino-93.14-ev", "published-set-wording"]),
    );
  });

  it("a change explains only its quantities, its models, and versions frozen before it by an engine that has it", () => {
    const p = old.models[1].parameters;
    expect(explainingChange("summary.age_Gyr", p, "0.9.0", [change], "1.0.0")).toBe(change);
    expect(explainingChange("summary.hubble_time_Gyr", p, "0.9.0", [change], "1.0.0")).toBeNull();
    expect(explainingChange("summary.age_Gyr", old.models[0].parameters, "0.9.0", [change], "1.0.0")).toBeNull();
    expect(explainingChange("summary.age_Gyr", p, "1.0.0", [change], "1.0.0")).toBeNull(); // frozen with the change already
    expect(explainingChange("summary.age_Gyr", p, "0.9.0", [change], "0.9.5")).toBeNull(); // the running engine predates it
  });

  it("a quantity the stored format lacks is listed as added, not as drift", () => {
    const trimmed = structuredClone(r.tables);
    for (const m of trimmed.models) {
      delete (m.summary as Record<string, unknown>).k_eq_1_Mpc;
      for (const row of m.redshifts) delete (row as unknown as Record<string, unknown>).E;
    }
    const c = compareWithRecomputed(trimmed, now, DECLARED_CHANGES, ENGINE_VERSION);
    expect(c.added.filter((k) => !FORMAT_3_ADDITIONS.includes(k))).toEqual(["redshifts[].E", "summary.k_eq_1_Mpc"]);
    expect(c.drift.filter((d) => d.explainedBy === null)).toEqual([]);
  });
});

describe("the contract's TypeScript types", () => {
  it("are what the generator writes from each released schema (so types and schemas cannot drift apart)", async () => {
    const gen = await import("../../src/schema/generateContractTypes.mjs" as string);
    const formats: number[] = gen.releasedTablesFormats();
    expect(formats).toEqual(
      readdirSync(join(ROOT, "src/schema/tables"))
        .map((f) => Number(f.split(".")[0]))
        .sort((a, b) => a - b),
    );
    for (const n of formats) {
      expect(
        await gen.contractTypesSource(n),
        `src/contract/generated/tablesFormat${n}.ts is stale: run npm run contract:types`,
      ).toBe(readFileSync(join(ROOT, `src/contract/generated/tablesFormat${n}.ts`), "utf8"));
    }
  });
});
