// Freezing and verifying: 20 versions of one 4-model scenario (200 grid points each), then verify over all of them,
// and a site build of that archive (21 scenario pages, 190 diff pages; chart images skipped). Wall time of whole CLI processes.
import { spawnSync } from "node:child_process";
import { mkdtempSync, mkdirSync, writeFileSync, rmSync, statSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");

function timed(args) {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(r.stderr);
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

export function runArchiveBench(versions = 20) {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-archive-"));
  mkdirSync(join(dir, "scenarios"));
  const file = join(dir, "scenarios", "bench.yaml");
  const freezeMs = [];
  for (let v = 0; v < versions; v++) {
    writeFileSync(
      file,
      `title: bench\nid: bench\nredshifts: [0.5, 1, 2, 3]\ngrid: { z_max: 10, points: 200 }\nmodels:\n  - { id: m0, H0: ${60 + v / 2}, Omega_m: 0.3 }\n  - { id: m1, extends: m0, Omega_k: 0.1 }\n  - { id: m2, extends: m0, w0: -0.9 }\n  - { id: m3, extends: m0, Omega_k: -0.05 }\n`,
    );
    freezeMs.push(timed(["freeze", file, "-m", `v${v + 1}`]));
  }
  const verifyMs = timed(["verify", "--archive", join(dir, "scenarios", "archive"), "--quiet"]);
  // Chart images are measured by the site benchmark; here the archive's own cost (version, history and diff pages).
  const buildMs = timed([
    "build",
    "--scenarios",
    join(dir, "scenarios"),
    "--out",
    join(dir, "site"),
    "--quiet",
    "--skip-images",
  ]);
  const bytes = readdirSync(join(dir, "scenarios", "archive", "bench")).reduce(
    (n, f) => n + statSync(join(dir, "scenarios", "archive", "bench", f)).size,
    0,
  );
  rmSync(dir, { recursive: true, force: true });
  freezeMs.sort((a, b) => a - b);
  return {
    versions,
    freezeMedianMs: freezeMs[Math.floor(versions / 2)],
    verifyMs,
    buildMs,
    recordKB: bytes / versions / 1024,
  };
}
