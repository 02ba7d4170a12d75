import { lstatSync, readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import { readRegularFile } from "../common/readRegularFile.js";
import { checkVersionChain, type ArchiveIssue } from "./checkVersionChain.js";
import { HEADS_FILE, headLosses, readHeads } from "./headRecord.js";
import { versionFileName, type StoredVersionRecord } from "../contract/versionRecord.js";
import { lazyRecord, metaOf, sha256OfBytes, type TrustedRecords } from "./trustedRecords.js";

export interface ScenarioArchive {
  id: string;
  folder: string;
  versions: StoredVersionRecord[];
}

/** Scenario ids are folder names in the archive; dotfiles (a freeze's temporary files, the head lock) are skipped. */
const visible = (name: string) => !name.startsWith(".");

/** What a path is, without following a broken link into an error: missing, a dangling link, a folder, a file, other. */
export function pathKind(path: string): "missing" | "dangling-link" | "folder" | "file" | "other" {
  let l: ReturnType<typeof lstatSync>;
  try {
    l = lstatSync(path);
  } catch {
    return "missing";
  }
  try {
    const s = l.isSymbolicLink() ? statSync(path) : l;
    return s.isDirectory() ? "folder" : s.isFile() ? "file" : "other";
  } catch {
    return "dangling-link";
  }
}

const KIND_PROBLEM = {
  "dangling-link": "is a symbolic link whose target does not exist",
  file: "is a file, not an archive folder",
  other: "is not a folder (a FIFO, socket or device)",
} as const;

/**
 * Reads and checks every scenario's version chain in an archive folder, and the head record that notices a lost
 * newest version or scenario folder. A folder that does not exist is an empty archive. With `trusted` (a site
 * build), files whose bytes a previous build checked are not checked again, and their records read their tables
 * only when needed (src/archive/trustedRecords.ts).
 */
export function readArchive(
  archiveDir: string,
  trusted?: TrustedRecords,
): { archives: ScenarioArchive[]; issues: ArchiveIssue[] } {
  const archives: ScenarioArchive[] = [];
  const issues: ArchiveIssue[] = [];
  const kind = pathKind(archiveDir);
  if (kind === "missing") return { archives, issues };
  if (kind !== "folder") return { archives, issues: [{ file: displayPath(archiveDir), message: KIND_PROBLEM[kind] }] };
  // Heads first (they only move forward after a publish), then the folders: never a false "lost" during a freeze.
  const { heads, issue } = readHeads(archiveDir);
  for (const id of readdirSync(archiveDir).filter(visible).sort()) {
    const folder = join(archiveDir, id);
    const k = pathKind(folder);
    if (k !== "folder") {
      if (k === "file" && (id.toLowerCase() === "readme.md" || id === HEADS_FILE)) continue;
      issues.push({
        file: displayPath(folder),
        message:
          k === "dangling-link"
            ? KIND_PROBLEM[k]
            : "unexpected file in the archive (expected one folder per scenario id)",
      });
      continue;
    }
    archives.push(readScenarioArchive(folder, id, issues, trusted));
  }
  if (issue) issues.push(issue);
  if (heads) {
    const newest = new Map<string, { version: number; sha256: string }>();
    const damaged = new Set(issues.map((i) => i.file));
    for (const a of archives) {
      const v = a.versions.at(-1);
      if (v) newest.set(a.id, { version: v.version, sha256: v.sha256 });
      else if ([...damaged].some((f) => f.startsWith(displayPath(a.folder))))
        newest.set(a.id, { version: Infinity, sha256: "" });
    }
    issues.push(...headLosses(archiveDir, heads, newest));
  } else if (!issue && archives.some((a) => a.versions.some((v) => v.format !== "cosmoledger.version/1"))) {
    issues.push({
      file: displayPath(join(archiveDir, HEADS_FILE)),
      message:
        "is missing: it records every scenario's newest version (restore it from git; versions of format 2 on are always recorded there)",
    });
  }
  return { archives, issues };
}

/** One scenario's folder: its checked versions, oldest first; problems are added to `issues`. */
export function readScenarioArchive(
  folder: string,
  id: string,
  issues: ArchiveIssue[],
  trusted?: TrustedRecords,
): ScenarioArchive {
  const names = pathKind(folder) === "folder" ? readdirSync(folder).filter(visible) : [];
  const files: Parameters<typeof checkVersionChain>[2] = [];
  const hashes = new Map<string, string>();
  for (const name of names) {
    const path = join(folder, name);
    const k = pathKind(path);
    if (k === "folder") {
      issues.push({
        file: displayPath(path),
        message: "unexpected folder in a version folder (expected v1.json, v2.json, ...)",
      });
      continue;
    }
    const read = readRegularFile(path);
    if ("why" in read) issues.push({ file: displayPath(path), message: `the path ${read.why}` });
    else if (!trusted) files.push({ name, text: read.bytes.toString("utf8") });
    else {
      const hash = sha256OfBytes(read.bytes);
      const meta = trusted.get(hash);
      if (meta) files.push({ name, trusted: lazyRecord(path, hash, meta) });
      else {
        files.push({ name, text: read.bytes.toString("utf8") });
        hashes.set(name, hash);
      }
    }
  }
  const checked = checkVersionChain(displayPath(folder), id, files);
  issues.push(...checked.issues);
  // Records checked here in full become trusted ones too (the hash of their bytes noted for the next build): a site
  // build holds the light fields of every version, and the tables of those it is rendering.
  if (trusted)
    checked.versions = checked.versions.map((r) => {
      const h = hashes.get(versionFileName(r.version));
      return h ? lazyRecord(join(folder, versionFileName(r.version)), h, metaOf(r)) : r;
    });
  return { id, folder, versions: checked.versions };
}
