import { makeFolders, removeEmptyFolders } from "../common/makeFolders.js";
import { namePathOnError } from "../common/namePathOnError.js";
import { closeSync, constants, copyFileSync, fsyncSync, linkSync, openSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { createHash, randomBytes } from "node:crypto";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import type { TablesDocument } from "../contract/tablesDocument.js";
import { readScenarioArchive } from "./readArchive.js";
import type { ArchiveIssue } from "./checkVersionChain.js";
import { headLosses, readHeads, recordHead } from "./headRecord.js";
import {
  frozenInputs,
  holdsSameInputs,
  sealVersion,
  versionFileName,
  type StoredVersionRecord,
  type VersionRecord,
} from "../contract/versionRecord.js";
import { TOOL_VERSION } from "../common/toolVersion.js";

export type FreezeOutcome =
  | { kind: "frozen"; record: VersionRecord; file: string; sameInputsAs: number | null }
  | { kind: "unchanged"; record: StoredVersionRecord; file: string }
  | { kind: "broken"; issues: ArchiveIssue[] };

const RETRIES = 50;

/**
 * Puts the finished temporary file at its final name only if that name is free: link(2), atomic; on file systems
 * without hard links, an exclusive copy (COPYFILE_EXCL), which still never overwrites but is not atomic.
 */
function publish(tmp: string, final: string): void {
  try {
    linkSync(tmp, final);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code !== "EPERM" && code !== "ENOTSUP" && code !== "EOPNOTSUPP" && code !== "ENOSYS") throw e;
    copyFileSync(tmp, final, constants.COPYFILE_EXCL);
    fsyncPath(final, "r+");
  }
}

function fsyncPath(path: string, flags: string): void {
  const fd = openSync(path, flags);
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/**
 * Freezes the next version of a scenario into `archiveDir/<id>/vN.json`.
 * The record is written to a temporary file, flushed, then published with link(2), which fails if vN.json already
 * exists: two freezes at once can never share a number or leave a torn file; the loser re-reads the chain and tries N+1.
 * Existing versions are never rewritten. Unchanged inputs (same source text and inputs hash as the latest) are a no-op;
 * inputs that return to an older version's make a new version, which says so (a revert is history too).
 */
export function freezeScenario(
  archiveDir: string,
  scenario: ResolvedScenario,
  doc: TablesDocument,
  message: string,
  now: () => Date = () => new Date(),
): FreezeOutcome {
  const folder = join(archiveDir, scenario.id);
  const made = makeFolders(folder);
  try {
    return freezeInto(archiveDir, folder, scenario, doc, message, now);
  } catch (e) {
    removeEmptyFolders(made); // a failed first freeze leaves no empty archive behind
    throw e;
  }
}

function freezeInto(
  archiveDir: string,
  folder: string,
  scenario: ResolvedScenario,
  doc: TablesDocument,
  message: string,
  now: () => Date,
): FreezeOutcome {
  for (let attempt = 0; attempt < RETRIES; attempt++) {
    const issues: ArchiveIssue[] = [];
    // The head record first: heads only move forward after a version is published, so the folder read next holds
    // at least what they record, even while other freezes run.
    const { heads, issue } = readHeads(archiveDir);
    const { versions } = readScenarioArchive(folder, scenario.id, issues);
    if (issue) issues.push(issue);
    const newest = versions.at(-1);
    if (heads && issues.length === 0) {
      const have = new Map(newest ? [[scenario.id, { version: newest.version, sha256: newest.sha256 }]] : []);
      issues.push(
        ...headLosses(archiveDir, { ...(heads[scenario.id] ? { [scenario.id]: heads[scenario.id] } : {}) }, have),
      );
    }
    if (issues.length > 0) return { kind: "broken", issues };
    const latest = versions.at(-1);
    if (latest && holdsSameInputs(latest, doc))
      return { kind: "unchanged", record: latest, file: join(folder, versionFileName(latest.version)) };
    const record = sealVersion(
      {
        scenario_id: scenario.id,
        version: (latest?.version ?? 0) + 1,
        created: now().toISOString(),
        message,
        previous_sha256: latest?.sha256 ?? null,
        source: { path: scenario.source.name, text: scenario.source.text },
        // Every samples file the scenario names, so that the version can be recomputed without it.
        attachments: Object.values(scenario.samples ?? {})
          .map((t) => ({ path: t.path, sha256: sha256Of(t.text), text: t.text }))
          .filter((a, i, all) => all.findIndex((b) => b.path === a.path) === i)
          .sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0)),
        inputs: frozenInputs(scenario),
        tables: doc,
      },
      TOOL_VERSION,
    );
    const final = join(folder, versionFileName(record.version));
    const tmp = join(folder, `.freeze-${process.pid}-${randomBytes(6).toString("hex")}.tmp`);
    try {
      namePathOnError(final, () => {
        writeFileSync(tmp, `${JSON.stringify(record)}\n`, { flag: "wx" });
        fsyncPath(tmp, "r+");
      });
      publish(tmp, final);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === "EEXIST") continue; // another freeze took this number first
      throw e;
    } finally {
      rmSync(tmp, { force: true });
    }
    fsyncPath(folder, "r");
    recordHead(archiveDir, scenario.id, { version: record.version, sha256: record.sha256 });
    const earlier = versions.find((v) => holdsSameInputs(v, doc));
    return { kind: "frozen", record, file: final, sameInputsAs: earlier ? earlier.version : null };
  }
  throw new Error(`could not take a version number in ${folder} after ${RETRIES} attempts`);
}

const sha256Of = (text: string) => createHash("sha256").update(text, "utf8").digest("hex");
