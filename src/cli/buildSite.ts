import { existsSync, mkdirSync, readdirSync, renameSync, rmSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { readLedger, setSiteLedger } from "../site/siteLedger.js";
import { formatIssue } from "../scenario/scenarioIssue.js";

import { SITE_MARKER } from "./siteMarker.js";

/** The package root (where .eleventy.js and content/ live), from dist/cli/. */
const PACKAGE_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "../..");

/**
 * Check and compute every scenario of `scenariosDir`, render them with Eleventy into a temporary folder beside
 * `outDir`, then swap it in. An invalid scenario stops the build (exit 2) before anything is written; a failed or
 * killed build leaves the previous site whole. A non-empty `outDir` that cosmoledger did not create is refused.
 */
export async function buildSite(scenariosDir: string, outDir: string, quiet: boolean): Promise<number> {
  const scenarios = resolve(scenariosDir);
  const out = resolve(outDir);
  if (!existsSync(scenarios)) {
    process.stderr.write(`error: scenarios folder ${scenariosDir} does not exist\n`);
    return 2;
  }
  if (existsSync(out) && !existsSync(join(out, SITE_MARKER)) && readdirSync(out).length > 0) {
    process.stderr.write(`error: refusing to replace ${outDir}: it is not empty and was not built by cosmoledger (no ${SITE_MARKER}); choose another --out\n`);
    return 2;
  }
  const { ledger, issues } = readLedger(scenarios);
  if (!ledger) {
    for (const i of issues) process.stderr.write(`error: ${formatIssue(i)}\n`);
    process.stderr.write(`${issues.length} problem${issues.length === 1 ? "" : "s"} found; the site was not built and ${outDir} is untouched.\n`);
    return 2;
  }
  if (ledger.docs.length === 0) {
    process.stderr.write(`error: no scenario files (*.yaml) in ${scenariosDir}\n`);
    return 2;
  }
  const stamp = `${process.pid}-${Date.now()}`;
  const tmp = `${out}.building-${stamp}`;
  const old = `${out}.previous-${stamp}`;
  mkdirSync(dirname(out), { recursive: true });
  setSiteLedger(ledger);
  const cwd = process.cwd();
  try {
    process.chdir(PACKAGE_ROOT); // Eleventy resolves the config, content/ and passthrough paths from here
    const { Eleventy } = await import("@11ty/eleventy");
    process.env.COSMOLEDGER_SITE_OUT = tmp;
    const eleventy = new Eleventy("content", tmp, { configPath: ".eleventy.js", quietMode: true });
    await eleventy.write();
    if (!existsSync(join(tmp, SITE_MARKER))) throw new Error("Eleventy finished without writing the site marker");
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    throw e;
  } finally {
    process.chdir(cwd);
    delete process.env.COSMOLEDGER_SITE_OUT;
    setSiteLedger(null);
  }
  if (existsSync(out)) renameSync(out, old);
  renameSync(tmp, out);
  rmSync(old, { recursive: true, force: true });
  if (!quiet) process.stdout.write(`built ${ledger.docs.length} scenario page${ledger.docs.length === 1 ? "" : "s"} into ${outDir}/\n`);
  return 0;
}
