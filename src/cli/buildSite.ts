import { namePathOnError } from "../common/namePathOnError.js";
import { reportWarnings } from "./scenarioWarnings.js";
import { makeFolders, removeEmptyFolders } from "../common/makeFolders.js";
import { existsSync, mkdirSync, readdirSync, realpathSync, renameSync, rmSync, statSync } from "node:fs";
import { isLink } from "../common/readRegularFile.js";
import { basename, dirname, join, resolve } from "node:path";
import { defaultArchive, ledgerFrom, readSiteInputs } from "./readLedger.js";
import type { SiteUnit } from "../site/sitePages.js";
import { applyStagedSite, hasApplyJournal, writeApplyJournal } from "./applySiteChanges.js";

import { renderInBatches } from "./renderSite.js";
import { issueLine, issueSummary } from "../scenario/scenarioIssue.js";

import { SITE_MARKER } from "./siteMarker.js";
import { buildSalt } from "./buildSalt.js";
import {
  carryUnitFiles,
  readSiteManifest,
  readTrustedRecords,
  SITE_MANIFEST,
  SITE_RECORDS,
  siteManifestText,
  trustedRecordsText,
  unitFilesPresent,
} from "./siteManifest.js";
import { writeFileSync } from "node:fs";

/**
 * Check and compute every scenario of `scenariosDir`, render them with Eleventy into a temporary folder beside
 * `outDir`, then swap it in. An invalid scenario stops the build (exit 2) before anything is written; a failed or
 * killed build leaves the previous site whole. A non-empty `outDir` that cosmoledger did not create is refused.
 * Pages whose key (src/site/sitePages.ts) is unchanged since the last build of `outDir` are carried over instead of
 * rendered; the result is byte for byte the site a clean build would write.
 */
export async function buildSite(
  scenariosDir: string,
  outDir: string,
  quiet: boolean,
  archiveDir?: string,
  options: { images?: boolean; strict?: boolean; clean?: boolean; toolVersion?: string } = {},
): Promise<number> {
  const scenarios = resolve(scenariosDir);
  const archive = resolve(archiveDir ?? defaultArchive(scenariosDir));
  // A --out that is the user's symbolic link (to a web root, say) is kept: the site is built into its target.
  let out = resolve(outDir);
  if (existsSync(out) || isLink(out)) {
    if (isLink(out)) {
      if (!existsSync(out)) {
        process.stderr.write(
          `error: ${outDir} is a symbolic link whose target does not exist; create the target folder or choose another --out\n`,
        );
        return 2;
      }
      out = realpathSync(out);
    }
    if (!statSync(out).isDirectory()) {
      process.stderr.write(`error: ${outDir} is a file, not a folder; choose another --out\n`);
      return 2;
    }
  }
  if (!existsSync(scenarios)) {
    process.stderr.write(`error: scenarios folder ${scenariosDir} does not exist\n`);
    return 2;
  }
  if (archiveDir !== undefined && !existsSync(archive)) {
    process.stderr.write(`error: archive folder ${archiveDir} does not exist\n`);
    return 2;
  }
  if (existsSync(out) && !existsSync(join(out, SITE_MARKER)) && readdirSync(out).length > 0) {
    process.stderr.write(
      `error: refusing to replace ${outDir}: it is not empty and was not built by cosmoledger (no ${SITE_MARKER}); choose another --out\n`,
    );
    return 2;
  }
  removeAbandonedBuilds(out); // first: a build killed while applying its changes is finished before this one reads the site
  const ours = !options.clean && existsSync(join(out, SITE_MARKER));
  const previous = ours ? readSiteManifest(out) : null;
  const inputs = readSiteInputs(scenarios, archive, ours ? readTrustedRecords(out, buildSalt()) : new Map());
  if (inputs.issues.length > 0) {
    for (const i of inputs.issues) process.stderr.write(`${issueLine(i)}\n`);
    process.stderr.write(`${issueSummary(inputs.issues, `the site was not built and ${outDir} is untouched.`)}\n`);
    return 2;
  }
  if (reportWarnings(inputs.warnings, options.strict ?? false)) return 2;
  const ledgerOptions = { images: options.images, toolVersion: options.toolVersion, salt: buildSalt() };
  const ledgerOf = (reuse: (path: string, key: string) => boolean) =>
    ledgerFrom(inputs.docs, inputs.archives, archive, { ...ledgerOptions, reuse });
  // The plan: every page's key, nothing built yet. A page is carried over when the last build of this folder made
  // it from the same inputs and its files are all still there.
  const plan = ledgerOf(() => true);
  if (plan.docs.length === 0) {
    process.stderr.write(`error: no scenario files (*.yaml) in ${scenariosDir}\n`);
    return 2;
  }
  const carried = (path: string, key: string) => {
    const u = previous?.get(path);
    return !!u && u.key === key && unitFilesPresent(out, u.files);
  };
  const toRender = plan.units.filter((u) => !carried(u.path, u.key)).map((u) => u.path);
  const stamp = `${process.pid}-${Date.now()}`;
  const tmp = `${out}.building-${stamp}`;
  const old = `${out}.previous-${stamp}`;
  const made = makeFolders(dirname(out));
  let lateRefusal: unknown = null;
  let units: SiteUnit[] = [];
  // With a previous build and most of its pages unchanged, the new and changed files are staged and then moved into
  // the site (src/cli/applySiteChanges.ts); otherwise the whole site is built beside it and swapped in.
  const inPlace = previous !== null && toRender.length < plan.units.length / 2;
  try {
    namePathOnError(outDir, () => mkdirSync(tmp)); // a refused folder fails here, before Eleventy's parallel writes
    const renderSet = new Set(toRender);
    const kept = plan.units.filter((u) => !renderSet.has(u.path));
    const carriedUnits = !previous
      ? []
      : inPlace
        ? kept.map((u) => ({ ...u, files: previous.get(u.path)!.files }))
        : carryUnitFiles(out, tmp, kept, previous);
    // Eleventy's parallel writes (passthrough copies) can fail after, or without, the write() call failing: a late
    // refusal is the one already reported, and what such writes leave is removed again when the process ends.
    process.on("unhandledRejection", (late) => {
      if (!systemRefusalInside(late, outDir)) throw late;
      lateRefusal ??= late;
    });
    process.on("exit", () => {
      if (existsSync(tmp) && !hasApplyJournal(tmp)) rmSync(tmp, { recursive: true, force: true });
    });
    const rendered = await renderInBatches(ledgerOf, toRender, tmp);
    units = [...carriedUnits, ...rendered].sort((x, y) => (x.path < y.path ? -1 : x.path > y.path ? 1 : 0));
    if (lateRefusal) throw lateRefusal;
    if (!existsSync(join(tmp, SITE_MARKER))) throw new Error("Eleventy finished without writing the site marker");
    writeFileSync(
      join(tmp, SITE_MANIFEST),
      siteManifestText(units as { path: string; key: string; files: string[] }[]),
    );
    writeFileSync(join(tmp, SITE_RECORDS), trustedRecordsText(inputs.archives, buildSalt()));
    if (inPlace) {
      const now = new Set(units.flatMap((u) => u.files ?? []));
      const deletions = [...previous.values()].flatMap((u) => u.files).filter((f) => !now.has(f));
      writeApplyJournal(tmp, deletions);
    }
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    removeEmptyFolders(made);
    process.on("exit", () => removeEmptyFolders(made));
    throw systemRefusalInside(e, outDir) ?? e;
  }
  if (inPlace) applyStagedSite(tmp, out, SITE_MANIFEST);
  else {
    if (existsSync(out)) renameSync(out, old);
    renameSync(tmp, out);
    rmSync(old, { recursive: true, force: true });
  }
  const frozen = units.filter((u) => /^[^/]+\/v\d+\/$/.test(u.path)).length;
  const reused = units.length - toRender.length;
  if (!quiet)
    process.stdout.write(
      `built ${plan.docs.length} scenario page${plan.docs.length === 1 ? "" : "s"} and ${frozen} frozen version page${frozen === 1 ? "" : "s"} into ${outDir}/` +
        `${reused ? ` (${toRender.length} of ${units.length} pages rendered, the rest unchanged since the last build)` : ""}\n`,
    );
  return 0;
}

/**
 * Eleventy wraps a write that the file system refused (full disk, permission) in its own error; the refusal found
 * along the cause chain, renamed to the site folder the user chose, so that it gets the file-system exit status.
 */
function systemRefusalInside(error: unknown, outDir: string): NodeJS.ErrnoException | null {
  const seen = new Set<unknown>();
  for (let e = error as { code?: unknown; cause?: unknown; originalError?: unknown } | undefined; e && !seen.has(e); ) {
    seen.add(e);
    if (typeof e.code === "string" && /^E[A-Z]+$/.test(e.code)) {
      const refusal = e as NodeJS.ErrnoException;
      refusal.path = outDir;
      return refusal;
    }
    e = (e.originalError ?? e.cause) as typeof e;
  }
  return null;
}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "EPERM";
  }
};

/** Folders left by builds that were killed (their process is gone): unfinished sites go; a displaced previous site is restored. */
function removeAbandonedBuilds(out: string): void {
  const parent = dirname(out);
  if (!existsSync(parent)) return;
  const pattern = new RegExp(
    `^${basename(out).replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}\\.(building|previous)-(\\d+)-\\d+$`,
  );
  for (const name of readdirSync(parent)) {
    const m = pattern.exec(name);
    if (!m || Number(m[2]) === process.pid || alive(Number(m[2]))) continue;
    // A build killed between its two renames left the previous site under .previous-*: put it back. One killed
    // while moving its staged files into the site is finished (its journal lists what remains to do).
    if (m[1] === "previous" && !existsSync(out)) renameSync(join(parent, name), out);
    else if (m[1] === "building" && existsSync(out) && hasApplyJournal(join(parent, name)))
      applyStagedSite(join(parent, name), out, SITE_MANIFEST);
    else rmSync(join(parent, name), { recursive: true, force: true });
  }
}
