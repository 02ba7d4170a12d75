// Site build benchmark: N generated scenarios of 4 models each through `cosmoledger build`, for several N, to show
// the cost per page and that it grows linearly; and the weight of the demo scenario pages.
import { spawnSync } from "node:child_process";
import { mkdtempSync, mkdirSync, writeFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");

function generated(i) {
  // Generated benchmark inputs (not physics data): a flat model and three variations of it.
  const om = (0.25 + (i % 10) * 0.01).toFixed(3);
  return (
    `title: Generated scenario ${i}\nid: gen-${i}\nmodels:\n  - { id: flat, H0: ${65 + (i % 7)}, Omega_m: ${om} }\n` +
    `  - { id: open, extends: flat, Omega_k: 0.05 }\n  - { id: closed, extends: flat, Omega_k: -0.05 }\n  - { id: cpl, extends: flat, w0: -0.9, wa: -0.2 }\n` +
    `targets:\n  - { name: arc, z: 2, size_kpc: 5 }\nsurveys:\n  - { name: shell, area_deg2: 1000, z_min: 0.5, z_max: 1 }\n`
  );
}

/** Wall time of one build of n generated scenarios; `images` draws the chart images into a fresh, empty cache (cold). */
function buildSeconds(n, images = false) {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-sitebench-"));
  mkdirSync(join(dir, "scenarios"));
  for (let i = 0; i < n; i++) writeFileSync(join(dir, "scenarios", `gen-${i}.yaml`), generated(i));
  const t0 = process.hrtime.bigint();
  const args = [
    BIN,
    "build",
    "--scenarios",
    join(dir, "scenarios"),
    "--out",
    join(dir, "site"),
    "--quiet",
    ...(images ? [] : ["--skip-images"]),
  ];
  const r = spawnSync(process.execPath, args, {
    encoding: "utf8",
    env: { ...process.env, COSMOLEDGER_CACHE: join(dir, "cache") },
  });
  const s = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(r.stderr);
  rmSync(dir, { recursive: true, force: true });
  return s;
}

export function runSiteBench() {
  const sizes = [50, 100, 200];
  const seconds = sizes.map((n) => buildSeconds(n));
  const imagesN = 10;
  const imageSeconds = buildSeconds(imagesN, true);
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-sitebench-"));
  const r = spawnSync(process.execPath, [BIN, "build", "--out", join(dir, "site"), "--quiet"], {
    cwd: ROOT,
    encoding: "utf8",
  });
  if (r.status !== 0) throw new Error(r.stderr);
  const weights = ["lantern-deep-field", "harbor-lights-census", "tidewater-geometry"].map(
    (id) => statSync(join(dir, "site", id, "index.html")).size,
  );
  rmSync(dir, { recursive: true, force: true });
  return { sizes, seconds, imagesN, imageSeconds, maxPageKB: Math.max(...weights) / 1024 };
}
