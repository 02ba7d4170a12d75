import { namePathOnError } from "../common/namePathOnError.js";
import { closeSync, existsSync, fsyncSync, openSync, readFileSync, renameSync, rmSync, writeSync } from "node:fs";
import { join } from "node:path";
import { randomBytes } from "node:crypto";
import { parseStrictJson } from "../common/parseStrictJson.js";
import { displayPath } from "../common/displayPath.js";
import type { ArchiveIssue } from "./checkVersionChain.js";

/** The archive's record of each scenario's newest version, so that a lost newest version or folder is noticed. */
export const HEADS_FILE = "heads.json";
export const HEADS_FORMAT = "cosmoledger.heads/1";
export interface Head {
  version: number;
  sha256: string;
}
export type Heads = Record<string, Head>;

const LOCK = ".heads.lock";
const sleepMs = (ms: number) => Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "EPERM";
  }
};

/** The head records of an archive: null when it has none yet (archives of releases before heads), or an issue. */
export function readHeads(archiveDir: string): { heads: Heads | null; issue: ArchiveIssue | null } {
  const file = join(archiveDir, HEADS_FILE);
  if (!existsSync(file)) return { heads: null, issue: null };
  try {
    const doc = parseStrictJson(readFileSync(file, "utf8")) as { format?: unknown; heads?: unknown };
    const ok =
      doc?.format === HEADS_FORMAT &&
      doc.heads !== null &&
      typeof doc.heads === "object" &&
      Object.values(doc.heads as object).every(
        (h) =>
          Number.isInteger(h?.version) &&
          h.version > 0 &&
          typeof h?.sha256 === "string" &&
          /^[0-9a-f]{64}$/.test(h.sha256),
      );
    if (!ok)
      return {
        heads: null,
        issue: { file: displayPath(file), message: `not a valid head record (format ${HEADS_FORMAT})` },
      };
    return { heads: doc.heads as Heads, issue: null };
  } catch (e) {
    return { heads: null, issue: { file: displayPath(file), message: `damaged: ${(e as Error).message}` } };
  }
}

/** Runs `f` holding the archive's head lock (an exclusively created file; a lock left by a dead process is taken over). */
function withHeadLock<T>(archiveDir: string, f: () => T): T {
  const lock = join(archiveDir, LOCK);
  for (let attempt = 0; ; attempt++) {
    try {
      const fd = openSync(lock, "wx");
      writeSync(fd, String(process.pid));
      closeSync(fd);
      break;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== "EEXIST") throw e;
      const holder = Number(readFileSync(lock, "utf8").trim());
      if (Number.isInteger(holder) && holder > 0 && !alive(holder)) rmSync(lock, { force: true });
      else if (attempt > 600)
        throw new Error(`${displayPath(lock)} is held by process ${holder}; remove it if no freeze is running`);
      else sleepMs(10 + Math.floor(Math.random() * 20));
    }
  }
  try {
    return f();
  } finally {
    rmSync(lock, { force: true });
  }
}

/**
 * Records `head` as the newest version of scenario `id`, atomically (written aside, flushed, renamed) and under the
 * archive's lock, so that concurrent freezes of different scenarios never lose each other's heads. A head is only
 * ever moved forward.
 */
export function recordHead(archiveDir: string, id: string, head: Head): void {
  withHeadLock(archiveDir, () => {
    const { heads, issue } = readHeads(archiveDir);
    if (issue) throw new Error(`${issue.file}: ${issue.message}`);
    const next: Heads = { ...(heads ?? {}) };
    if ((next[id]?.version ?? 0) >= head.version) return;
    next[id] = head;
    const sorted = Object.fromEntries(
      Object.keys(next)
        .sort()
        .map((k) => [k, next[k]]),
    );
    const tmp = join(archiveDir, `.heads-${process.pid}-${randomBytes(4).toString("hex")}.tmp`);
    const file = join(archiveDir, HEADS_FILE);
    namePathOnError(
      file,
      () => {
        const fd = openSync(tmp, "wx");
        try {
          writeSync(fd, `${JSON.stringify({ format: HEADS_FORMAT, heads: sorted }, null, 1)}\n`);
          fsyncSync(fd);
        } finally {
          closeSync(fd);
        }
        renameSync(tmp, file);
      },
      () => rmSync(tmp, { force: true }),
    );
  });
}

/**
 * What the head records say is missing: a scenario folder that is gone, or newest versions that are gone (the
 * folder ends before the recorded head, or holds another version under the head's number).
 */
export function headLosses(
  archiveDir: string,
  heads: Heads,
  newest: Map<string, { version: number; sha256: string }>,
): ArchiveIssue[] {
  const issues: ArchiveIssue[] = [];
  for (const [id, head] of Object.entries(heads)) {
    const have = newest.get(id);
    const folder = displayPath(join(archiveDir, id));
    if (!have)
      issues.push({
        file: folder,
        message: `is missing: ${HEADS_FILE} records its version ${head.version}, so the scenario's folder was deleted`,
      });
    else if (have.version < head.version)
      issues.push({
        file: folder,
        message: `ends at v${have.version}, but ${HEADS_FILE} records v${head.version}: the newest version${head.version - have.version > 1 ? "s were" : " was"} deleted`,
      });
    else if (have.version === head.version && have.sha256 !== head.sha256)
      issues.push({
        file: `${folder}/v${head.version}.json`,
        message: `is not the version ${HEADS_FILE} recorded (sha256 ${head.sha256.slice(0, 12)}): it was replaced`,
      });
  }
  return issues;
}
