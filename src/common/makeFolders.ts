import { mkdirSync, statSync } from "node:fs";
import { dirname } from "node:path";

/**
 * mkdir -p, one level at a time from the nearest existing ancestor. Node's own recursive mkdir can retry forever
 * where the kernel answers ENOENT for a folder whose parent exists (/proc, some FUSE mounts); this raises instead.
 */
export function makeFolders(path: string): void {
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
  for (const p of missing.reverse()) {
    try {
      mkdirSync(p);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== "EEXIST") throw e;
    }
  }
}
