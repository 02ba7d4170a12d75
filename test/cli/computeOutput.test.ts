// compute replaces each scenario's output folder as a whole. The expectations are the contract stated in the README
// (common practice for atomic publication: build aside, rename into place), not values from our own output.
import { describe, expect, it, beforeAll } from "vitest";
import { spawn, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, readdirSync, renameSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { BIN, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

const scenario = (targets: boolean, models = 1, points = 20) =>
  [
    "id: outfold",
    "title: Output folder test",
    `grid: { z_max: 5, points: ${points} }`,
    "models:",
    ...Array.from({ length: models }, (_, i) => `  - { id: m${i}, H0: ${60 + i * 0.01}, Omega_m: 0.3 }`),
    ...(targets ? ["targets:", "  - { name: Arc, z: 2, size_kpc: 5 }"] : []),
    "",
  ].join("\n");

/** A process id that no longer runs: a child that has exited (its pid is free until reused). */
function deadPid(): number {
  const r = spawnSync(process.execPath, ["-e", "process.stdout.write(String(process.pid))"], { encoding: "utf8" });
  return Number(r.stdout);
}

beforeAll(() => compileProject());

describe("compute writes each scenario's folder whole", { timeout: 120_000 }, () => {
  it("a file an earlier run wrote and this run does not is gone; the folder lists what it holds", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "s.yaml"), scenario(true));
    expect(runCli(["compute", "s.yaml", "--out", "out"], dir).code).toBe(0);
    expect(existsSync(join(dir, "out/outfold/targets.csv"))).toBe(true);
    writeFileSync(join(dir, "s.yaml"), scenario(false));
    const r = runCli(["compute", "s.yaml", "--out", "out"], dir);
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(join(dir, "out/outfold")).sort()).toEqual([
      ".cosmoledger-output",
      "differences.csv",
      "parameters.csv",
      "redshifts.csv",
      "summary.csv",
      "tables.json",
    ]);
    expect(readFileSync(join(dir, "out/outfold/.cosmoledger-output"), "utf8")).toMatch(/tables\.json/);
    expect(readdirSync(join(dir, "out"))).toEqual(["outfold"]);
  });

  it("a folder holding a file cosmoledger did not write is refused (exit 2) and nothing in it is touched", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "s.yaml"), scenario(true));
    expect(runCli(["compute", "s.yaml", "--out", "out"], dir).code).toBe(0);
    writeFileSync(join(dir, "out/outfold/my-notes.txt"), "mine");
    const before = readFileSync(join(dir, "out/outfold/tables.json"));
    writeFileSync(join(dir, "s.yaml"), scenario(false));
    const r = runCli(["compute", "s.yaml", "--out", "out"], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(
      /refusing to replace out\/outfold: it holds out\/outfold\/my-notes\.txt, which cosmoledger did not write/,
    );
    expect(readFileSync(join(dir, "out/outfold/my-notes.txt"), "utf8")).toBe("mine");
    expect(readFileSync(join(dir, "out/outfold/tables.json")).equals(before)).toBe(true);
    expect(existsSync(join(dir, "out/outfold/targets.csv"))).toBe(true);
  });

  it("what a killed run left (an unfinished folder, a displaced previous folder, stray temporary files) is cleaned by the next run", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "s.yaml"), scenario(true));
    expect(runCli(["compute", "s.yaml", "--out", "out"], dir).code).toBe(0);
    const pid = deadPid();
    // Killed between moving the previous folder aside and renaming the new one in: the previous one must come back.
    renameSync(join(dir, "out/outfold"), join(dir, `out/.outfold.previous-${pid}-abcd`));
    mkdirSync(join(dir, `out/.outfold.writing-${pid}-abcd`));
    writeFileSync(join(dir, `out/.outfold.writing-${pid}-abcd/tables.json`), "{");
    mkdirSync(join(dir, "out/other"));
    writeFileSync(join(dir, "out/other/.cosmoledger-output"), "Written by cosmoledger; files here are regenerated.\n");
    writeFileSync(join(dir, `out/other/tables.json.tmp-${pid}-123`), "partial");
    writeFileSync(join(dir, "s.yaml"), scenario(false));
    const r = runCli(["compute", "s.yaml", "--out", "out"], dir);
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(join(dir, "out")).sort()).toEqual(["other", "outfold"]);
    expect(readdirSync(join(dir, "out/other"))).toEqual([".cosmoledger-output"]);
    expect(existsSync(join(dir, "out/outfold/targets.csv"))).toBe(false);
  });

  it("a compute killed at any moment leaves the previous folder whole, and the next run leaves no temporary file", async () => {
    const dir = tempDir();
    writeFileSync(join(dir, "s.yaml"), scenario(true, 30, 3000));
    expect(runCli(["compute", "s.yaml", "--out", "out"], dir).code).toBe(0);
    const complete = () => {
      const names = readdirSync(join(dir, "out/outfold"));
      return (
        ["tables.json", "targets.csv", ".cosmoledger-output"].every((n) => names.includes(n)) &&
        JSON.parse(readFileSync(join(dir, "out/outfold/tables.json"), "utf8")).format
      );
    };
    for (const delayMs of [30, 120, 300, 700]) {
      const child = spawn(process.execPath, [BIN, "compute", "s.yaml", "--out", "out"], { cwd: dir, stdio: "ignore" });
      // Listen before killing: a run that finishes first has already exited, and then there is nothing to await.
      const exited = new Promise((r) => child.once("exit", r));
      await new Promise((r) => setTimeout(r, delayMs));
      child.kill("SIGKILL");
      await exited;
      expect(complete()).toBeTruthy();
    }
    expect(runCli(["compute", "s.yaml", "--out", "out"], dir).code).toBe(0);
    expect(readdirSync(join(dir, "out"))).toEqual(["outfold"]);
    expect(readdirSync(join(dir, "out/outfold")).filter((n) => n.includes(".tmp-"))).toEqual([]);
  });
});
