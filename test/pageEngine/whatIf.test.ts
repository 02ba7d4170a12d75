// The what-if panel's pipeline (src/pageEngine): a reader's model, computed from a page's scenario cut down to what it
// needs, must carry the numbers `cosmoledger compute` gives the same model in the full scenario file. The
// expectations come from the command line run on the demo scenarios and on those files with the copied block pasted
// in (an independent path: whole files, the bundled CLI, every model), never from the panel's own output.
import { describe, expect, it } from "vitest";
import { readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { parse, parseDocument, type YAMLSeq } from "yaml";
import { whatIf, type WhatIfResult } from "../../src/pageEngine/whatIfEngine.js";
import { whatIfScenario } from "../../src/pageEngine/whatIfScenario.js";
import { presentDocument } from "../../src/presentation/presentDocument.js";
import {
  chartDataTables,
  geometryCards,
  presentationTables,
  rowKeys,
  type PresentationTable,
} from "../../src/presentation/presentTables.js";
import type { StoredTablesDocument } from "../../src/contract/tablesDocument.js";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

const SCENARIOS = join(ROOT, "scenarios");
const demoFiles = readdirSync(SCENARIOS).filter((f) => f.endsWith(".yaml"));
const read = (f: string) => readFileSync(join(SCENARIOS, f), "utf8");

/** A folder of its own holding a scenario text, with the demo's samples files beside it. */
function folderWith(text: string, name: string): string {
  const dir = tempDir();
  for (const f of readdirSync(SCENARIOS).filter((x) => x.endsWith(".csv")))
    writeFileSync(join(dir, f), readFileSync(join(SCENARIOS, f)));
  writeFileSync(join(dir, name), text);
  return dir;
}

/** compute --json of a scenario text. */
function computeCli(text: string, name: string): StoredTablesDocument {
  const r = runCli(["compute", name, "--json"], folderWith(text, name));
  if (r.code !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout) as StoredTablesDocument;
}

/** The cells of model `id` in every presented table of a document, by table id and row key. */
function cellsOf(doc: StoredTablesDocument, id: string) {
  const p = presentDocument(doc);
  const index = doc.models.findIndex((m) => m.id === id);
  const out: Record<string, Record<string, { text: string; difference?: string }[]>> = {};
  const kinds: Record<string, Record<string, string>> = {};
  const n = doc.models.length;
  const tables: PresentationTable[] = [...presentationTables(p), ...Object.values(chartDataTables(p))];
  for (const t of tables) {
    if (t.spans && t.spans.length > 1) continue;
    const lead = t.columns.length % n;
    const per = (t.columns.length - lead) / n;
    const keys = rowKeys(t.rows);
    out[t.id] = Object.fromEntries(
      t.rows.map((r, i) => [
        keys[i],
        r.cells
          .slice(lead + index * per, lead + (index + 1) * per)
          .map((c) => ({ text: c.text, ...(c.difference ? { difference: c.difference.text } : {}) })),
      ]),
    );
    kinds[t.id] = Object.fromEntries(t.rows.map((r, i) => [keys[i], r.cells[lead + index * per]?.kind ?? "text"]));
  }
  return { tables: out, kinds, geometry: geometryCards(p)[index].entries };
}

const ok = (r: WhatIfResult) => {
  if (!r.ok) throw new Error(r.problems.join("\n"));
  return r;
};
const shown = (r: ReturnType<typeof ok>) =>
  Object.fromEntries(
    Object.entries(r.tables).map(([id, t]) => [
      id,
      Object.fromEntries(
        t.rows.map((row) => [
          row.key,
          row.cells.map((c) => ({ text: c.text, ...(c.difference ? { difference: c.difference.text } : {}) })),
        ]),
      ),
    ]),
  );

/**
 * A page row the cut-down scenario has no row for (a big rip row shown because another model of the page has one)
 * is blank in the panel (src/site/browser/whatIfPanel.ts): the what-if has no such value, which the presentation
 * writes as an em dash in a number row and as nothing in a text row. Fills those in as the panel does, so that a
 * row that is absent for any other reason still fails.
 */
function asPlaced(got: ReturnType<typeof shown>, expected: ReturnType<typeof cellsOf>) {
  return Object.fromEntries(
    Object.entries(expected.tables).map(([id, rows]) => [
      id,
      Object.fromEntries(
        Object.entries(rows).map(([key, cells]) => [
          key,
          got[id]?.[key] ?? cells.map(() => ({ text: expected.kinds[id][key] === "number" ? "—" : "" })),
        ]),
      ),
    ]),
  );
}

/** The copied block pasted at the end of the scenario file's models, as a reader would. */
function pasted(source: string, block: string): string {
  const d = parseDocument(source);
  (d.get("models") as YAMLSeq).add(d.createNode((parse(block) as unknown[])[0]));
  return String(d);
}

/** A what-if of the Lantern demo page, started from its reference model. */
const fromReference = (changes: Record<string, number | string | number[]>) =>
  whatIf({
    source: read("lantern-deep-field.yaml"),
    file: "lantern-deep-field.yaml",
    id: "lantern-deep-field",
    start: { model: "reference" },
    changes,
  });

describe("what-if models computed as a page computes them", { timeout: 600_000 }, () => {
  it("with no change, a what-if shows the numbers of the model it starts from (every demo scenario, every model; in h units too)", () => {
    compileProject();
    // Every demo scenario as it is, and the Lantern scenario shown in h units (lengths in h^-1 Mpc with each
    // model's own h): the what-if's column must be converted as the page's own columns are.
    const cases = [
      ...demoFiles.map((file) => ({ file, source: read(file) })),
      { file: "lantern-deep-field.yaml", source: `${read("lantern-deep-field.yaml")}h_units: true\n` },
    ];
    for (const { file, source } of cases) {
      const full = computeCli(source, file);
      for (const m of full.models) {
        const r = ok(whatIf({ source, file, id: full.scenario.id, start: { model: m.id }, changes: {} }));
        const expected = cellsOf(full, m.id);
        const got = asPlaced(shown(r), expected);
        for (const [id, rows] of Object.entries(expected.tables)) {
          if (id === "models") continue; // the what-if's own parameter rows say "inherited" where the model said "set"
          for (const [key, cells] of Object.entries(rows))
            expect(
              got[id][key].map((c) => c.text),
              `${file} ${m.id} ${id} ${key}`,
            ).toEqual(cells.map((c) => c.text));
        }
        expect(r.geometry.entries, `${file} ${m.id} geometry`).toEqual(expected.geometry);
        // In h units the column's note says so, with the what-if's own H0 (the page's notes name its models').
        if (/h_units: true/.test(source)) expect(r.notes.join("\n")).toMatch(/What-if \(not archived\): H0 = /);
      }
    }
  });

  it("the copied block, pasted into the scenario file, makes compute give the panel's numbers (seeded random changes)", () => {
    compileProject();
    const change = fc.record({
      file: fc.constantFrom(...demoFiles),
      pick: fc.nat(),
      H0: fc.option(fc.double({ min: 60, max: 76, noNaN: true }), { nil: undefined }),
      Omega_k: fc.option(fc.double({ min: -0.03, max: 0.03, noNaN: true }), { nil: undefined }),
      w0: fc.option(fc.double({ min: -1.2, max: -0.8, noNaN: true }), { nil: undefined }),
      m_nu_eV: fc.option(fc.constantFrom([], [0.06], [0.1, 0.1]), { nil: undefined }),
    });
    for (const c of fc.sample(change, { seed: 31, numRuns: 20 })) {
      const source = read(c.file);
      const models = (parse(source) as { models: { id: string }[] }).models;
      const startId = models[c.pick % models.length].id;
      const changes = Object.fromEntries(
        Object.entries({ H0: c.H0, Omega_k: c.Omega_k, w0: c.w0, m_nu_eV: c.m_nu_eV }).filter(
          ([, v]) => v !== undefined,
        ),
      ) as Record<string, number | number[]>;
      const id = (parse(source) as { id: string }).id;
      const r = whatIf({ source, file: c.file, id, start: { model: startId }, changes });
      if (!r.ok) {
        // Refused in the page: refused by check in the file, with the same messages (the locations are the
        // computed text's, which the panel shows).
        const dir = tempDir();
        writeFileSync(join(dir, r.file), r.text);
        const check = runCli(["check", r.file], dir);
        expect(check.code).toBe(2);
        expect(r.problems).toEqual(check.stderr.split("\n").filter((l) => /^(error|warning):/.test(l)));
        continue;
      }
      const text = pasted(source, r.block);
      expect(runCli(["check", c.file], folderWith(text, c.file)).code, `${c.file} with the block:\n${r.block}`).toBe(0);
      const full = computeCli(text, c.file);
      const expected = cellsOf(full, r.modelId);
      const got = asPlaced(shown(r), expected);
      for (const [tid, rows] of Object.entries(expected.tables))
        expect(got[tid], `${c.file} ${tid} after ${JSON.stringify(changes)}`).toEqual(rows);
      expect(r.geometry.entries).toEqual(expected.geometry);
    }
  });

  it("refuses a bad value with check's words, located in the computed text it shows", () => {
    const r = fromReference({ H0: -5, Omega_k: "(not a number)" });
    expect(r.ok).toBe(false);
    const dir = tempDir();
    writeFileSync(join(dir, r.file), r.text);
    const check = runCli(["check", r.file], dir);
    expect(r.ok ? [] : r.problems).toEqual(check.stderr.split("\n").filter((l) => /^(error|warning):/.test(l)));
    expect(r.ok ? "" : r.problems.join("\n")).toMatch(/lantern-deep-field\.what-if\.yaml:\d+:\d+: models\[\d\]\.H0: /);
  });

  it("says that a model without a big bang has none, in the words of check", () => {
    // Omega_m = 0.3 with Omega_de = 2.5: a closed model whose cosmological constant is above the bounce value for
    // its matter (about 1.7 for Omega_m = 0.3, recalled from memory) has no big bang.
    const r = fromReference({ Omega_m: 0.3, Omega_de: 2.5 });
    const dir = tempDir();
    writeFileSync(join(dir, r.file), r.text);
    const compute = runCli(["compute", r.file, "--json"], dir);
    expect(compute.code).toBe(2);
    expect(r.ok ? [] : r.problems).toEqual(compute.stderr.split("\n").filter((l) => /^(error|warning):/.test(l)));
    expect(r.ok ? "" : r.problems.join("\n")).toMatch(/big bang/);
  });

  it("warns of a model outside the verified box in the words of check, and computes it", () => {
    const r = fromReference({ w0: -2.5 });
    expect(r.ok).toBe(true);
    const dir = folderWith(r.text, r.file);
    const check = runCli(["check", r.file], dir);
    const checkWarnings = check.stderr.split("\n").filter((l) => l.startsWith("warning:"));
    expect(checkWarnings.length).toBeGreaterThan(0);
    // The page shows the what-if's own warnings (its model, models[1]); those of the page's models are on the page.
    expect(r.ok ? r.notes : []).toEqual(checkWarnings.filter((l) => l.includes("models[1]")));
    expect((r.ok ? r.notes : []).join("\n")).toMatch(/w0 = -2\.5 lies outside/);
  });

  it("keeps the block honest: its own id, extends the start, no spread inherited, published sets by reference", () => {
    const source = [
      "title: t",
      "id: t",
      "models:",
      "  - { id: what-if, H0: 70, Omega_m: 0.3, flat: true, spread: { normal: { H0: 1 } } }",
      "  - { id: other, extends: what-if, Omega_m: 0.32 }",
      "",
    ].join("\n");
    const fromModel = whatIfScenario(source, { model: "other" }, { w0: -0.9 });
    expect(fromModel.modelId).toBe("what-if-2");
    expect(parse(fromModel.block)).toEqual([
      { id: "what-if-2", label: "What-if", extends: "other", w0: -0.9, spread: "none" },
    ]);
    const fromSet = whatIfScenario(source, { published: "wmap9-lcdm" }, {});
    expect(parse(fromSet.block)).toEqual([
      { id: "what-if-2", label: "What-if", extends: "published/wmap9-lcdm", spread: "none" },
    ]);
    // The kept models draw nothing (their spreads, and published sets' spreads, off); otherwise unchanged.
    expect((parse(fromModel.text) as { models: Record<string, unknown>[] }).models.slice(0, 2)).toEqual([
      { id: "what-if", H0: 70, Omega_m: 0.3, flat: true, spread: "none" },
      { id: "other", extends: "what-if", Omega_m: 0.32, spread: "none" },
    ]);
  });
});
