// The whole compute process for one scenario of 8 models, 2,000 grid points and 20 table redshifts,
// and --help start-up, each measured beyond a bare Node start-up (median of several runs).
import { spawnSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");

function median(fn, runs) {
  const t = [];
  for (let i = 0; i < runs; i++) {
    const t0 = process.hrtime.bigint();
    fn();
    t.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  t.sort((a, b) => a - b);
  return t[Math.floor(runs / 2)];
}

function run(args) {
  const r = spawnSync(process.execPath, args, { encoding: "utf8" });
  if (r.status !== 0) throw new Error(r.stderr);
  return r.stdout;
}

function elapsedMs(fn) {
  const t0 = process.hrtime.bigint();
  fn();
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

/** Median over pairs of (command time / `node -e 0` time), the two run alternately. */
function pairedRatio(fn, pairs) {
  const ratios = [];
  for (let i = 0; i < pairs; i++) {
    const a = elapsedMs(fn);
    const b = elapsedMs(() => spawnSync(process.execPath, ["-e", "0"]));
    ratios.push(a / b);
  }
  ratios.sort((x, y) => x - y);
  return ratios[Math.floor(pairs / 2)];
}

export function runComputeBench(runs = 7) {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-"));
  const file = join(dir, "bench.yaml");
  const models = [
    "{ id: m0, H0: 67.5, Omega_m: 0.315 }",
    "{ id: m1, extends: m0, Omega_k: 0.1 }",
    "{ id: m2, extends: m0, Omega_k: -0.05 }",
    "{ id: m3, extends: m0, w0: -0.8, wa: -0.6 }",
    "{ id: m4, extends: m0, Omega_k: 0.05, w0: -1.2, wa: 0.5 }",
    "{ id: m5, extends: m0, Omega_de: -0.2 }",
    "{ id: m6, H0: 60, Omega_m: 1.5, Omega_de: 0.005 }",
    "{ id: m7, extends: m0, w0: -0.9 }",
  ];
  const redshifts = Array.from({ length: 20 }, (_, i) => (0.25 * (i + 1)).toString());
  writeFileSync(
    file,
    `title: bench\nredshifts: [${redshifts.join(", ")}]\ngrid: { z_max: 20, points: 2000 }\nmodels:\n${models.map((m) => `  - ${m}\n`).join("")}`,
  );
  const node = median(() => spawnSync(process.execPath, ["-e", "0"]), runs);
  const help = median(() => spawnSync(process.execPath, [BIN, "--help"]), runs);
  let out = 0;
  const computeArgs = () => [BIN, "compute", file, "--out", join(dir, `out${out++}`)];
  const compute = median(() => run(computeArgs()), runs);
  const quoteArgs = [BIN, "quote", "--model", "H0=70 Omega_m=0.3", "--z", "0.5,1,2"];
  // Side by side: each command alternates with `node -e 0` and the ratio is taken pair by pair (a drifting machine
  // speed cancels), then the median ratio is quoted.
  const quoteRatio = pairedRatio(() => run(quoteArgs), runs * 2);
  const computeRatio = pairedRatio(() => run(computeArgs()), runs * 2);
  const phases = JSON.parse(run([join(ROOT, "bench/computePhases.js"), file, join(dir, "phases")]));
  const floorRatio = serialiseFloorRatio(dir, join(dir, "out0", "bench", "tables.json"), runs * 2);
  // compute's code loaded and nothing done: with no file named, compute stops at its usage error (exit 2) after
  // loading the modules it runs with.
  const loadRatio = pairedRatio(() => {
    const r = spawnSync(process.execPath, [BIN, "compute"], { encoding: "utf8" });
    if (r.status !== 2) throw new Error(`compute without a file: exit ${r.status} ${r.stderr}`);
  }, runs * 2);
  rmSync(dir, { recursive: true, force: true });
  return {
    nodeStartMs: node,
    helpMs: help,
    computeMs: compute,
    quoteRatio,
    computeRatio,
    floorRatio,
    loadRatio,
    phases,
  };
}

/**
 * The floor under compute's ratio: a process that only serialises the same tables document and writes it
 * (bench/serialiseFloor.js), side by side with `node -e 0`. Checked to write compute's own bytes.
 */
function serialiseFloorRatio(dir, tablesJson, pairs) {
  const text = readFileSync(tablesJson, "utf8");
  const doc = JSON.parse(text);
  const prepared = join(dir, "floor");
  mkdirSync(prepared);
  const doubles = [];
  for (const model of doc.models)
    for (const key of Object.keys(model.grid)) {
      const column = model.grid[key];
      for (const v of column) doubles.push(v === null ? Number.NaN : v);
      model.grid[key] = column.length;
    }
  writeFileSync(join(prepared, "grid.f64"), new Uint8Array(Float64Array.from(doubles).buffer));
  writeFileSync(join(prepared, "skeleton.json"), JSON.stringify(doc));
  const floorArgs = [join(ROOT, "bench/serialiseFloor.js"), prepared, join(dir, "floor.json")];
  run(floorArgs);
  if (readFileSync(join(dir, "floor.json"), "utf8") !== text)
    throw new Error("bench/serialiseFloor.js did not write compute's tables.json byte for byte");
  return pairedRatio(() => run(floorArgs), pairs);
}
