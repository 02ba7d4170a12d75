import { makeFolders, removeEmptyFolders } from "../common/makeFolders.js";
import {
  closeSync,
  existsSync,
  fsyncSync,
  lstatSync,
  mkdirSync,
  openSync,
  readFileSync,
  readdirSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from "node:fs";
import { randomBytes } from "node:crypto";
import { basename, dirname, join } from "node:path";

/** Marker file that says a folder was written by cosmoledger and may be replaced by it; it lists the files written. */
export const OUTPUT_MARKER = ".cosmoledger-output";
const MARKER_HEADER = "Written by cosmoledger; this folder is replaced as a whole by the next run. Files it wrote:";
/** What releases before the manifest wrote in the marker; their folders held only these names. */
const LEGACY_MARKER = "Written by cosmoledger; files here are regenerated.";
const LEGACY_NAMES = [
  "tables.json",
  "parameters.csv",
  "summary.csv",
  "redshifts.csv",
  "differences.csv",
  "targets.csv",
  "surveys.csv",
];

export class OutputRefusedError extends Error {}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "EPERM";
  }
};

function fsyncPath(path: string, flags: string): void {
  const fd = openSync(path, flags);
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** The names cosmoledger wrote into a folder, from its marker; null when the folder has no marker (not ours). */
function namesWeWrote(dir: string): Set<string> | null {
  const marker = join(dir, OUTPUT_MARKER);
  if (!existsSync(marker)) return null;
  const lines = readFileSync(marker, "utf8")
    .split("\n")
    .map((l) => l.trim())
    .filter(Boolean);
  if (lines[0] === LEGACY_MARKER) return new Set([OUTPUT_MARKER, ...LEGACY_NAMES]);
  if (lines[0] !== MARKER_HEADER) return null;
  return new Set([OUTPUT_MARKER, ...lines.slice(1)]);
}

/** Why an existing output folder may not be replaced, or null when it may (absent, empty, or entirely ours). */
function refusal(dir: string): string | null {
  if (isDanglingLink(dir))
    return `refusing to write ${dir}: it is a symbolic link whose target does not exist; remove the link or choose another --out`;
  if (!existsSync(dir)) return null;
  if (!lstatSync(dir).isDirectory())
    return `refusing to write ${dir}: it exists and is not a folder; choose another --out`;
  const names = readdirSync(dir);
  if (names.length === 0) return null;
  const ours = namesWeWrote(dir);
  if (!ours)
    return `refusing to write into ${dir}: it exists, is not empty and was not created by cosmoledger (no ${OUTPUT_MARKER} file); choose another --out`;
  const foreign = names.filter((n) => !ours.has(n) && !/\.tmp-\d+-\d+$/.test(n));
  if (foreign.length > 0)
    return `refusing to replace ${dir}: it holds ${foreign.map((n) => join(dir, n)).join(", ")}, which cosmoledger did not write; move it away or choose another --out`;
  return null;
}

const LEFTOVER = /^\.(.+)\.(writing|previous)-(\d+)-[0-9a-f]+$/;

/**
 * Removes what killed runs left beside the output folders in `parent`: unfinished folders go, and a previous folder
 * that a run had moved aside but not yet replaced is put back. Folders of runs still alive are left alone.
 */
function cleanLeftovers(parent: string): void {
  if (!existsSync(parent) || !lstatSync(parent).isDirectory()) return;
  for (const name of readdirSync(parent)) {
    const m = LEFTOVER.exec(name);
    if (!m || Number(m[3]) === process.pid || alive(Number(m[3]))) continue;
    const final = join(parent, m[1]);
    if (m[2] === "previous" && !existsSync(final)) renameSync(join(parent, name), final);
    else rmSync(join(parent, name), { recursive: true, force: true });
  }
  // Files left inside output folders by releases that wrote file by file (name.tmp-<pid>-<time>).
  for (const name of readdirSync(parent)) {
    const dir = join(parent, name);
    if (name.startsWith(".") || !lstatSync(dir).isDirectory() || !existsSync(join(dir, OUTPUT_MARKER))) continue;
    for (const f of readdirSync(dir)) {
      const t = /\.tmp-(\d+)-\d+$/.exec(f);
      if (t && !alive(Number(t[1]))) rmSync(join(dir, f), { force: true });
    }
  }
}

function isDanglingLink(path: string): boolean {
  try {
    return lstatSync(path).isSymbolicLink();
  } catch {
    return false;
  }
}

/**
 * Writes every output folder whole or not at all. Each folder is built aside (`.<name>.writing-*` beside it, every file
 * flushed), then swapped in: the old folder is moved aside, the new one renamed into place, the old one removed. So a
 * file an earlier run wrote and this run does not (targets.csv after the targets were removed) is gone afterwards,
 * a killed run leaves the previous folder whole, and the next run removes what it left. A folder holding anything
 * cosmoledger did not write is refused, never touched.
 */
export function writeOutputsAtomically(folders: { dir: string; files: Record<string, string | Buffer> }[]): void {
  for (const f of folders) {
    for (let parent = dirname(f.dir); ; parent = dirname(parent)) {
      if (!existsSync(parent) && isDanglingLink(parent))
        throw new OutputRefusedError(
          `refusing to write ${f.dir}: ${parent} is a symbolic link whose target does not exist; create the target folder or choose another --out`,
        );
      if (existsSync(parent)) {
        if (!lstatSync(parent).isDirectory() && !statSync(parent).isDirectory())
          throw new OutputRefusedError(
            `refusing to write ${f.dir}: ${parent} is a file, not a folder; choose another --out`,
          );
        break;
      }
      if (dirname(parent) === parent) break;
    }
    const why = refusal(f.dir);
    if (why) throw new OutputRefusedError(why);
  }
  for (const parent of new Set(folders.map((f) => dirname(f.dir)))) cleanLeftovers(parent);
  const staged: { dir: string; tmp: string }[] = [];
  const made: string[] = [];
  try {
    for (const f of folders) {
      const parent = dirname(f.dir);
      made.push(...makeFolders(parent));
      const tmp = join(parent, `.${basename(f.dir)}.writing-${process.pid}-${randomBytes(4).toString("hex")}`);
      mkdirSync(tmp);
      staged.push({ dir: f.dir, tmp });
      const names = Object.keys(f.files).sort();
      const marker = `${MARKER_HEADER}\n${names.join("\n")}\n`;
      for (const [name, content] of [...Object.entries(f.files), [OUTPUT_MARKER, marker] as const]) {
        const path = join(tmp, name);
        writeFileSync(path, content, { flag: "wx" });
        fsyncPath(path, "r+");
      }
    }
  } catch (e) {
    for (const s of staged) rmSync(s.tmp, { recursive: true, force: true });
    removeEmptyFolders(made);
    // Name the output folder the user chose, not the staging folder that is gone now.
    const err = e as NodeJS.ErrnoException;
    if (typeof err.code === "string") err.path = staged.at(-1)?.dir ?? folders[0]?.dir ?? err.path;
    throw e;
  }
  for (const s of staged) {
    const old = `${s.tmp.replace(/\.writing-/, ".previous-")}`;
    const had = existsSync(s.dir);
    if (had) renameSync(s.dir, old);
    renameSync(s.tmp, s.dir);
    if (had) rmSync(old, { recursive: true, force: true });
  }
}
