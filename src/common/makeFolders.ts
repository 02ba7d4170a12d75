import { mkdirSync, rmdirSync, statSync } from "node:fs";
import { dirname } from "node:path";

/**
 * mkdir -p, one level at a time from the nearest existing ancestor. Node's own recursive mkdir can retry forever
 * where the kernel answers ENOENT for a folder whose parent exists (/proc, some FUSE mounts); this raises instead.
 * Returns the folders it made, outermost first, so that a failed command can remove them again.
 */
export function makeFolders(path: string): string[] {
  const missing: string[] = [];
  for (let p = path; ; p = dirname(p)) {
    let exists = false;
    try {
      statSync(p);
      exists = true;
    } catch {
      exists = false;
    }
    if (exists || dirname(p) === p) break;
    missing.push(p);
  }
  const made: string[] = [];
  for (const p of missing.reverse()) {
    try {
      mkdirSync(p);
      made.push(p);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== "EEXIST") {
        removeEmptyFolders(made);
        throw e;
      }
    }
  }
  return made;
}

/** Removes folders that makeFolders made, innermost first, where they are still empty (after a failed command). */
export function removeEmptyFolders(made: string[]): void {
  for (const p of [...made].reverse()) {
    try {
      rmdirSync(p);
    } catch {
      return; // not empty (someone else wrote there) or already gone: leave it and its parents
    }
  }
}
