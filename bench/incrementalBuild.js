// Incremental site builds: 50 generated scenarios frozen 20 times each (1,000 version pages, 9,500 diff pages), a
// clean build, then one more freeze and the rebuild of the same folder, and a rebuild with nothing changed. Whole
// `cosmoledger build` processes (chart images skipped, as in the site benchmark); peak resident memory of each.
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { freezeQuietly, generatedScenario, writeArchivedScenarios } from "./generatedArchive.js";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");
const PEAK = join(ROOT, "bench/reportPeakMemory.mjs");

function build(scenarios, out, dir) {
  const peakFile = join(dir, "peak");
  const t0 = process.hrtime.bigint();
  const r = spawnSync(
    process.execPath,
    ["--import", PEAK, BIN, "build", "--scenarios", scenarios, "--out", out, "--skip-images"],
    { encoding: "utf8", env: { ...process.env, COSMOLEDGER_PEAK_FILE: peakFile }, maxBuffer: 64 * 1024 * 1024 },
  );
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(r.stderr);
  const rendered = /\((\d+) of (\d+) pages rendered/.exec(r.stdout);
  return {
    seconds,
    peakMB: Number(readFileSync(peakFile, "utf8")) / 1024,
    rendered: rendered ? Number(rendered[1]) : null,
    pages: rendered ? Number(rendered[2]) : null,
  };
}

export async function runIncrementalBuildBench(count = 50, versions = 20) {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-incremental-"));
  const scenarios = await writeArchivedScenarios(dir, count, versions);
  const out = join(dir, "site");
  const clean = build(scenarios, out, dir);
  const unchanged = build(scenarios, out, dir);
  const file = join(scenarios, "gen-0.yaml");
  writeFileSync(file, generatedScenario(0, 90));
  await freezeQuietly(file, "one more version");
  const afterFreeze = build(scenarios, out, dir);
  rmSync(dir, { recursive: true, force: true });
  return { count, versions, clean, unchanged, afterFreeze };
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(await runIncrementalBuildBench());
