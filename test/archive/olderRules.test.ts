// A version frozen under the rules of an earlier release keeps verifying after the rules got stricter: a samples file
// of 4 rows with a hexadecimal cell and an in-cell "#" comment, and a LaTeX label with a double superscript, which
// today's `check` refuses in a live file. The version is sealed here as such a release would have written it (its
// tables computed by the same engine reading the file by the older rules), and `verify --strict` must pass.
import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { frozenInputs, sealVersion } from "../../src/contract/versionRecord.js";

const SOURCE = `title: Older rules
id: older-rules
redshifts: [1]
draws: { count: 20, seed: 1 }
models:
  - { id: m, H0: 70, Omega_m: 0.3, label_tex: 'x^1^2', spread: { samples: chain.csv } }
`;
const CHAIN = "H0,Omega_m\n69.5,0.31\n0x46,0.30#a comment\n70.5,0.29\n71,0.3\n";

describe("archives frozen under earlier rules", { timeout: 300_000 }, () => {
  it("keep verifying, while a live file with the same content is refused", () => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios/archive/older-rules"), { recursive: true });
    writeFileSync(join(dir, "scenarios/older-rules.yaml"), SOURCE);
    writeFileSync(join(dir, "scenarios/chain.csv"), CHAIN);
    const check = runCli(["check", "scenarios/older-rules.yaml"], dir);
    expect(check.code).toBe(2);
    expect(check.stderr).toMatch(/double superscript/);
    writeFileSync(
      join(dir, "scenarios/samples-only.yaml"),
      SOURCE.replace(" label_tex: 'x^1^2',", "").replace("id: older-rules", "id: samples-only"),
    );
    const samples = runCli(["check", "scenarios/samples-only.yaml"], dir);
    expect(samples.code).toBe(2);
    expect(samples.stderr).toMatch(/"0x46" is not a finite decimal number/);

    const s = loadScenario(SOURCE, "scenarios/older-rules.yaml", { frozen: true, readAttachment: () => CHAIN });
    const record = sealVersion(
      {
        scenario_id: "older-rules",
        version: 1,
        created: "2026-01-01T00:00:00.000Z",
        message: "frozen under earlier rules",
        previous_sha256: null,
        source: { path: "scenarios/older-rules.yaml", text: SOURCE },
        attachments: [{ path: "chain.csv", sha256: createHash("sha256").update(CHAIN).digest("hex"), text: CHAIN }],
        inputs: frozenInputs(s),
        tables: buildTablesDocument(s),
      },
      "0.3.0",
    );
    writeFileSync(join(dir, "scenarios/archive/older-rules/v1.json"), `${JSON.stringify(record)}\n`);
    writeFileSync(
      join(dir, "scenarios/archive/heads.json"),
      `${JSON.stringify({ format: "cosmoledger.heads/1", heads: { "older-rules": { version: 1, sha256: record.sha256 } } })}\n`,
    );
    const v = runCli(["verify", "--archive", "scenarios/archive", "--strict"], dir);
    expect(v.code, v.stderr + v.stdout).toBe(0);
    expect(v.stdout).toMatch(/every archived number reproduces/);
  });
});
