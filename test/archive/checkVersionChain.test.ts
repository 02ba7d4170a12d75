// The chain rules, on records built in memory. Expected outcomes follow from the definition of a hash chain
// (each record commits to its predecessor's hash; common practice for tamper-evident logs).
import { describe, expect, it } from "vitest";
import { checkVersionChain } from "../../src/archive/checkVersionChain.js";
import { sealVersion, versionHash, type VersionRecord } from "../../src/contract/versionRecord.js";
import { relativeChange, tablesDrift } from "../../src/archive/tablesDrift.js";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { frozenInputs } from "../../src/contract/versionRecord.js";

const text = (h0: number) =>
  `id: chain\ntitle: Chain test\nredshifts: [1]\ngrid: { z_max: 2, points: 5 }\nmodels:\n  - { id: a, H0: ${h0}, Omega_m: 0.3, flat: true }\n`;
function chain(n: number): VersionRecord[] {
  const out: VersionRecord[] = [];
  for (let v = 1; v <= n; v++) {
    const s = loadScenario(text(60 + v), "chain.yaml");
    out.push(
      sealVersion(
        {
          scenario_id: "chain",
          version: v,
          created: `2026-01-0${v}T00:00:00.000Z`,
          message: `v${v}`,
          previous_sha256: out.at(-1)?.sha256 ?? null,
          source: { path: s.source.name, text: s.source.text },
          attachments: [],
          inputs: frozenInputs(s),
          tables: buildTablesDocument(s),
        },
        "0.0.0-test",
      ),
    );
  }
  return out;
}
const files = (rs: VersionRecord[]) => rs.map((r) => ({ name: `v${r.version}.json`, text: JSON.stringify(r) }));

describe("checkVersionChain", () => {
  it("accepts an intact chain in any file order and returns it oldest first", () => {
    const rs = chain(3);
    const r = checkVersionChain("archive/chain", "chain", files(rs).reverse());
    expect(r.issues).toEqual([]);
    expect(r.versions.map((v) => v.version)).toEqual([1, 2, 3]);
  });

  it("a re-sealed record whose previous_sha256 is wrong breaks the chain at that file", () => {
    const rs = chain(3);
    const forged = { ...rs[2], previous_sha256: rs[0].sha256 };
    forged.sha256 = versionHash(forged);
    const r = checkVersionChain("archive/chain", "chain", files([rs[0], rs[1], forged]));
    expect(r.versions).toEqual([]);
    expect(r.issues).toEqual([
      {
        file: "archive/chain/v3.json",
        message: expect.stringMatching(/^breaks the hash chain: previous_sha256 .* is not the sha256 of v2/),
      },
    ]);
  });

  it("a gap names the missing file; version 1 must start the chain; a foreign id is refused", () => {
    const rs = chain(3);
    expect(checkVersionChain("a", "chain", files([rs[0], rs[2]])).issues.map((i) => i.file)).toEqual(["a/v2.json"]);
    const notFirst = { ...rs[0], previous_sha256: rs[1].sha256 };
    notFirst.sha256 = versionHash(notFirst);
    expect(checkVersionChain("a", "chain", files([notFirst])).issues[0].message).toMatch(
      /version 1 must start the chain/,
    );
    expect(checkVersionChain("a", "other", files([rs[0]])).issues[0].message).toMatch(/belongs to scenario chain/);
    expect(checkVersionChain("a", "chain", [{ name: "notes.txt", text: "" }]).issues[0].message).toMatch(
      /unexpected file/,
    );
    expect(checkVersionChain("a", "chain", [{ name: "v1.json", text: "{" }]).issues[0].message).toMatch(
      /not valid JSON/,
    );
  });
});

describe("tablesDrift", () => {
  it("relative change is |a - b| / max(|a|, |b|), 0 for equal values including two zeros", () => {
    expect(relativeChange(100, 101)).toBeCloseTo(1 / 101, 15);
    expect(relativeChange(-2, 2)).toBe(2);
    expect(relativeChange(0, 0)).toBe(0);
    expect(relativeChange(5, 5)).toBe(0);
  });

  it("reports the largest change per key path, and a number that became null, a changed text or shape as infinite", () => {
    const drift = tablesDrift(
      { models: [{ x: [1, 2, 3], y: 1, label: "a", z: [1] }], differences: { q: 1 } },
      { models: [{ x: [1, 2.002, 3.0003], y: null, label: "b", z: [1, 2] }], differences: { q: 2 } },
      ["differences"],
    );
    const by = Object.fromEntries(drift.map((d) => [d.quantity, d]));
    expect(by["models[].x[]"].relative).toBeCloseTo(0.002 / 2.002, 15);
    expect(by["models[].x[]"].where).toBe("models[0].x[1]");
    expect(by["models[].y"].relative).toBe(Infinity);
    expect(by["models[].label"].relative).toBe(Infinity);
    expect(by["models[].z[]"].relative).toBe(Infinity);
    expect(by["differences.q"]).toBeUndefined();
  });
});
