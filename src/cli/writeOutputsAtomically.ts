import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, writeFileSync, openSync, fsyncSync, closeSync } from "node:fs";
import { join } from "node:path";

/** Marker file that says a folder was written by cosmoledger and may be refreshed by it. */
export const OUTPUT_MARKER = ".cosmoledger-output";

export class OutputRefusedError extends Error {}

/**
 * Writes every folder's files or none: first each file to a temporary name (flushed), then all renames.
 * A folder that exists, is not empty and lacks the marker was not made by us: refuse rather than overwrite.
 */
export function writeOutputsAtomically(folders: { dir: string; files: Record<string, string | Buffer> }[]): void {
  for (const f of folders) {
    if (existsSync(f.dir) && !existsSync(join(f.dir, OUTPUT_MARKER)) && readdirSync(f.dir).length > 0) {
      throw new OutputRefusedError(`refusing to write into ${f.dir}: it exists, is not empty and was not created by cosmoledger (no ${OUTPUT_MARKER} file); choose another --out`);
    }
  }
  const temps: { tmp: string; final: string }[] = [];
  const suffix = `.tmp-${process.pid}-${Date.now()}`;
  try {
    for (const f of folders) {
      mkdirSync(f.dir, { recursive: true });
      for (const [name, text] of Object.entries({ ...f.files, [OUTPUT_MARKER]: "Written by cosmoledger; files here are regenerated.\n" })) {
        const final = join(f.dir, name);
        const tmp = final + suffix;
        writeFileSync(tmp, text, { flag: "wx" });
        const fd = openSync(tmp, "r+");
        fsyncSync(fd);
        closeSync(fd);
        temps.push({ tmp, final });
      }
    }
  } catch (e) {
    for (const t of temps) rmSync(t.tmp, { force: true });
    throw e;
  }
  for (const t of temps) renameSync(t.tmp, t.final);
}
