// Scenarios exactly at the documented limits (20,000 table and 100,000 chart-grid evaluations), computed and built
// as whole processes under a 2 GB heap; reports wall time and peak resident memory. Never asserts on time.
import { spawnSync } from "node:child_process";
import { mkdtempSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");
const PEAK = join(ROOT, "bench/reportPeakMemory.mjs");

function scenarioAtLimits(models, redshifts, gridPoints) {
  const zs = Array.from({ length: redshifts }, (_, i) => ((10 * (i + 1)) / redshifts).toPrecision(6));
  const lines = Array.from({ length: models }, (_, i) => `  - { id: m${i}, H0: ${60 + i * 0.01}, Omega_m: 0.3 }`);
  return `title: at the limits\nredshifts: [${zs.join(", ")}]\ngrid: { z_max: 10, points: ${gridPoints} }\nmodels:\n${lines.join("\n")}\n`;
}

function timed(args, peakFile) {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, ["--max-old-space-size=2048", "--import", PEAK, BIN, ...args], {
    encoding: "utf8",
    env: { ...process.env, COSMOLEDGER_PEAK_FILE: peakFile },
  });
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`${args.join(" ")} failed (${r.status}): ${r.stderr}`);
  return { seconds, peakMB: Number(readFileSync(peakFile, "utf8")) / 1024 };
}

export function runLimitsBench() {
  const cases = [
    { name: "20 models x 1,000 redshifts, 5,000 grid points", models: 20, redshifts: 1000, grid: 5000 },
    { name: "500 models x 40 redshifts, 200 grid points", models: 500, redshifts: 40, grid: 200 },
  ];
  const results = [];
  for (const c of cases) {
    const dir = mkdtempSync(join(tmpdir(), "cosmoledger-limits-"));
    mkdirSync(join(dir, "scenarios/archive"), { recursive: true });
    writeFileSync(join(dir, "scenarios/limits.yaml"), scenarioAtLimits(c.models, c.redshifts, c.grid));
    const peak = join(dir, "peak");
    const compute = timed(["compute", join(dir, "scenarios/limits.yaml"), "--out", join(dir, "tables")], peak);
    const build = timed(
      ["build", "--scenarios", join(dir, "scenarios"), "--out", join(dir, "site"), "--skip-images", "--quiet"],
      peak,
    );
    results.push({ ...c, compute, build });
    rmSync(dir, { recursive: true, force: true });
  }
  return results;
}
