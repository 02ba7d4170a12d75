// Live preview latency: `cosmoledger serve` on a scenarios folder, a page open in headless Chromium, then edits of
// one scenario's H0; each edit is timed from the file's write to the reloaded page holding the new number (its
// DOMContentLoaded with the comoving distance at the first table redshift changed). On the demo scenarios, and on
// 200 generated scenarios with 1,000 frozen versions beside them, side by side with a full build of the same folder.
import { spawn, spawnSync } from "node:child_process";
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { generatedScenario, writeArchivedScenarios } from "./generatedArchive.js";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");
const PEAK = join(ROOT, "bench/reportPeakMemory.mjs");
const chromiumPath = spawnSync("sh", ["-c", "command -v chromium"], { encoding: "utf8" }).stdout.trim();
const CELL = 'table.ztable[data-quantity="comoving_distance_Mpc"] td.num';

function startServe(scenarios, peakFile) {
  const child = spawn(process.execPath, ["--import", PEAK, BIN, "serve", "--scenarios", scenarios, "--port", "0"], {
    stdio: ["ignore", "pipe", "pipe"],
    env: { ...process.env, COSMOLEDGER_PEAK_FILE: peakFile },
  });
  let out = "";
  child.stdout.on("data", (d) => (out += d));
  child.stderr.resume();
  const t0 = performance.now();
  return new Promise((ok, fail) => {
    const poll = setInterval(() => {
      const m = / at (http:\/\/\S+)[\s\S]*built the preview \((\d+) pages?\) in (\d+) ms/.exec(out);
      if (m) {
        clearInterval(poll);
        ok({ child, url: m[1], firstBuildMs: Number(m[3]), startMs: performance.now() - t0, output: () => out });
      } else if (child.exitCode !== null || child.signalCode !== null) {
        clearInterval(poll);
        fail(new Error(`serve stopped: ${out}`));
      }
    }, 20);
  });
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Times `edits` saves of `file` (each a new H0 through `edit(i)`) until the open page shows a new number. */
async function timeEdits(context, url, file, edit, edits) {
  const page = await context.newPage();
  await page.goto(url);
  const ms = [];
  for (let i = 1; i <= edits; i++) {
    await page.waitForSelector("html[data-preview-listening]", { timeout: 120_000 });
    const before = await page.textContent(CELL);
    const loaded = page.waitForEvent("domcontentloaded", { timeout: 120_000 });
    const t0 = performance.now();
    writeFileSync(file, edit(i));
    await loaded;
    const after = await page.textContent(CELL);
    if (after === before) throw new Error(`the page reloaded without a new number (${after})`);
    ms.push(performance.now() - t0);
  }
  await page.close();
  return ms;
}

async function measure(context, scenarios, pagePath, file, edit, edits) {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-preview-"));
  const peakFile = join(dir, "peak");
  const served = await startServe(scenarios, peakFile);
  try {
    const ms = await timeEdits(context, served.url + pagePath, file, edit, edits);
    return { ms, medianMs: median(ms), firstMs: ms[0], maxMs: Math.max(...ms), firstBuildMs: served.firstBuildMs };
  } finally {
    await new Promise((ok) => {
      served.child.on("exit", ok);
      served.child.kill("SIGINT");
    });
    const peakMB = Number(readFileSync(peakFile, "utf8")) / 1024;
    rmSync(dir, { recursive: true, force: true });
    measure.lastPeakMB = peakMB;
  }
}

function fullBuildSeconds(scenarios) {
  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-preview-build-"));
  const t0 = process.hrtime.bigint();
  const r = spawnSync(
    process.execPath,
    [BIN, "build", "--scenarios", scenarios, "--out", join(dir, "site"), "--quiet", "--skip-images"],
    { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 },
  );
  const s = Number(process.hrtime.bigint() - t0) / 1e9;
  rmSync(dir, { recursive: true, force: true });
  if (r.status !== 0) throw new Error(r.stderr);
  return s;
}

export async function runPreviewBench(edits = 9) {
  if (!chromiumPath) return null;
  const { chromium } = await import("playwright-core");
  const context = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), "cosmoledger-bench-chromium-")), {
    executablePath: chromiumPath,
    headless: true,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--no-first-run"],
  });
  try {
    // The demo scenarios (a copy, with their archive): the first model's H0 of the geometry seminar.
    const demo = mkdtempSync(join(tmpdir(), "cosmoledger-bench-preview-demo-"));
    cpSync(join(ROOT, "scenarios"), join(demo, "scenarios"), { recursive: true });
    const demoFile = join(demo, "scenarios/tidewater-geometry.yaml");
    const demoText = readFileSync(demoFile, "utf8");
    const demoEdit = (i) => demoText.replace("    H0: 70\n", `    H0: ${(70 + i / 100).toFixed(2)}\n`);
    const small = await measure(
      context,
      join(demo, "scenarios"),
      "tidewater-geometry/index.html",
      demoFile,
      demoEdit,
      edits,
    );
    small.peakMB = measure.lastPeakMB;
    small.fullBuildS = fullBuildSeconds(join(demo, "scenarios"));
    rmSync(demo, { recursive: true, force: true });

    // 200 generated scenarios, each frozen 5 times (1,000 version pages, 2,000 diff pages).
    const big = mkdtempSync(join(tmpdir(), "cosmoledger-bench-preview-big-"));
    const scenarios = await writeArchivedScenarios(big, 200, 5);
    const bigFile = join(scenarios, "gen-0.yaml");
    const bigEdit = (i) => generatedScenario(0, 70 + i / 100);
    const large = await measure(context, scenarios, "gen-0/index.html", bigFile, bigEdit, edits);
    large.peakMB = measure.lastPeakMB;
    large.fullBuildS = fullBuildSeconds(scenarios);
    rmSync(big, { recursive: true, force: true });
    return { small, large };
  } finally {
    await context.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(JSON.stringify(await runPreviewBench(), null, 1));
