// The helper thread of spreads cannot hang a command: a helper that dies or stops answering after taking a job ends
// `compute` with exit 1, a message that names it as a fault of cosmoledger, and nothing written. The faults are
// injected through the worker's test hook (src/tables/drawPoolStates.ts); the wait is shortened to 2 s here.
import { describe, expect, it } from "vitest";
import { existsSync, writeFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { join } from "node:path";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

// 1,000 draws over 205 redshifts: past the size at which the helper thread takes a share.
const SCENARIO = `title: Fault
id: fault
draws: { count: 1000, seed: 3 }
models:
  - id: m
    H0: 70
    Omega_m: 0.3
    spread: { normal: { H0: 2, Omega_m: 0.01 } }
`;

// The helper thread exists only with two or more cores (drawPool.ts); every machine of this project has two.
const oneCore = availableParallelism() < 2;
if (oneCore) console.warn("draw pool fault tests SKIPPED: one core, so no helper thread to fail");

describe.skipIf(oneCore)("a helper thread that dies or stops answering", { timeout: 300_000 }, () => {
  for (const fault of ["helper-exit", "helper-hang"]) {
    it(`${fault}: exit 1 within the bounded wait, named as our fault, nothing written`, () => {
      compileProject();
      const dir = tempDir();
      writeFileSync(join(dir, "s.yaml"), SCENARIO);
      const r = runCli(["compute", "s.yaml", "--out", "out"], dir, {
        COSMOLEDGER_FAULT_INJECTION: fault,
        COSMOLEDGER_HELPER_STALL_MS: "2000",
      });
      expect(r.code).toBe(1);
      expect(r.stderr).toMatch(/the helper thread of spreads stopped answering .* a fault of cosmoledger/);
      expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
      expect(existsSync(join(dir, "out"))).toBe(false);
    });
  }

  it("without a fault the same scenario computes (with the default wait, so a busy machine cannot fail it)", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "s.yaml"), SCENARIO);
    const r = runCli(["compute", "s.yaml", "--out", "out"], dir);
    expect(r.code, r.stderr).toBe(0);
    expect(existsSync(join(dir, "out/fault/tables.json"))).toBe(true);
  });
});
