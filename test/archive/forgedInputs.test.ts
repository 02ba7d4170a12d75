// A forged version (its stored inputs edited, its hash recomputed and its head rewritten, so the chain still holds)
// is caught by recomputation, and verify names what differs: the key path with the stored and the current value.
import { describe, expect, it } from "vitest";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { versionHash } from "../../src/contract/versionRecord.js";

describe("a forged version", { timeout: 300_000 }, () => {
  it("whose inputs were edited and rehashed is reported with the key that differs", () => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(
      join(dir, "scenarios/f.yaml"),
      "title: Forged\nid: forged\nredshifts: [1]\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\n",
    );
    expect(runCli(["freeze", "scenarios/f.yaml", "-m", "first"], dir).code).toBe(0);
    const file = join(dir, "scenarios/archive/forged/v1.json");
    const record = JSON.parse(readFileSync(file, "utf8"));
    record.inputs.models[0].inputs.H0 = 71;
    record.sha256 = versionHash(record);
    writeFileSync(file, `${JSON.stringify(record)}\n`);
    const headsFile = join(dir, "scenarios/archive/heads.json");
    const heads = JSON.parse(readFileSync(headsFile, "utf8"));
    heads.heads.forged.sha256 = record.sha256;
    writeFileSync(headsFile, `${JSON.stringify(heads, null, 1)}\n`);
    const v = runCli(["verify", "--archive", "scenarios/archive", "--strict"], dir);
    expect(v.code).not.toBe(0);
    expect(v.stderr + v.stdout).toMatch(
      /forged v1: the inputs its source resolves to today differ from the inputs the version stores, at inputs\.models\[0\]\.inputs\.H0 \(stored 71, now 70\)/,
    );
  });
});
