// Spreads (published cosmologies and their uncertainties): 1,000 draws of each of 8 models over 200 grid and 20
// table redshifts, as a whole `compute` process, and the cost of one draw against one plain model's evaluation.
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");

const REDSHIFTS = "[0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1, 1.2, 1.4, 1.6, 1.8, 2, 2.5, 3, 4, 5, 6]";
const MODELS = [
  "  - id: m1",
  "    H0: 67.4",
  "    Omega_m: 0.315",
  "    omega_b: 0.0224",
  "    m_nu_eV: [0.06]",
  "    spread: { normal: { H0: 0.5, Omega_m: 0.007, omega_b: 0.0001 } }",
  "  - { id: m2, extends: m1, H0: 68 }",
  "  - { id: m3, extends: m1, H0: 69 }",
  "  - { id: m4, extends: m1, Omega_m: 0.3 }",
  "  - { id: m5, extends: m1, w0: -0.9 }",
  "  - { id: m6, extends: m1, w0: -0.9, wa: -0.3 }",
  "  - { id: m7, extends: m1, Omega_k: 0.01 }",
  "  - { id: m8, extends: m1, Omega_k: -0.01 }",
].join("\n");
const scenario = (spread) =>
  `title: Spread benchmark\nredshifts: ${REDSHIFTS}\ngrid: { z_max: 10, points: 200 }\ndraws: { count: 1000, seed: 1 }\nmodels:\n${spread ? MODELS : MODELS.replace(/\n {4}spread: .*$/m, "")}\n`;

function timedRun(args, cwd) {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, args, { cwd, encoding: "utf8" });
  if (r.status !== 0) throw new Error(r.stderr);
  return Number(process.hrtime.bigint() - t0) / 1e6;
}
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

export async function runSpreadBench() {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-spread-"));
  try {
    writeFileSync(join(dir, "with.yaml"), scenario(true));
    writeFileSync(join(dir, "without.yaml"), scenario(false));
    const whole = [];
    const plain = [];
    const node = [];
    for (let i = 0; i < 3; i++) {
      node.push(timedRun(["-e", "0"], dir));
      whole.push(timedRun([BIN, "compute", "with.yaml", "--out", `out-with-${i}`], dir));
      plain.push(timedRun([BIN, "compute", "without.yaml", "--out", `out-without-${i}`], dir));
    }
    // In one process, warm: one plain evaluation of the 8 models, then the same with 8,000 draws.
    const { loadScenario } = await import(join(ROOT, "dist/scenario/loadScenario.js"));
    const { buildTablesDocument } = await import(join(ROOT, "dist/tables/buildTablesDocument.js"));
    const withS = loadScenario(scenario(true), "with.yaml");
    const withoutS = loadScenario(scenario(false), "without.yaml");
    for (let i = 0; i < 3; i++) buildTablesDocument(withoutS);
    const tPlain = [];
    for (let i = 0; i < 20; i++) {
      const t0 = process.hrtime.bigint();
      buildTablesDocument(withoutS);
      tPlain.push(Number(process.hrtime.bigint() - t0) / 1e6);
    }
    const t0 = process.hrtime.bigint();
    buildTablesDocument(withS);
    const tWith = Number(process.hrtime.bigint() - t0) / 1e6;
    // The same again, warm (both threads' code optimised): the floor under the whole process, which also starts
    // Node and the helper thread, loads and compiles our code, and writes the document.
    const tWarm = [];
    for (let i = 0; i < 3; i++) {
      const w0 = process.hrtime.bigint();
      buildTablesDocument(withS);
      tWarm.push(Number(process.hrtime.bigint() - w0) / 1e6);
    }
    const plainPerModel = median(tPlain) / 8;
    const perDraw = (tWith - median(tPlain)) / 8000;
    return {
      wholeMs: median(whole),
      plainMs: median(plain),
      nodeMs: median(node),
      plainPerModelMs: plainPerModel,
      perDrawMs: perDraw,
      drawOverPlain: perDraw / plainPerModel,
      warmMs: Math.min(...tWarm),
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
