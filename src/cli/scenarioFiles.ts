import { readdirSync, statSync } from "node:fs";
import { join } from "node:path";

/** Scenario files in a folder: *.yaml and *.yml, sorted so builds are deterministic. */
export function scenarioFiles(dir: string): string[] {
  return readdirSync(dir)
    .filter((f) => /\.ya?ml$/i.test(f))
    .sort()
    .map((f) => join(dir, f));
}

/** The command line's file arguments with each folder replaced by its scenario files (`check scenarios/`). */
export function expandFolders(args: string[]): { files: string[]; emptyFolders: string[] } {
  const files: string[] = [];
  const emptyFolders: string[] = [];
  for (const a of args) {
    let folder = false;
    try {
      folder = statSync(a).isDirectory();
    } catch {
      folder = false; // missing or unreadable: the file reader reports it, located
    }
    if (!folder) files.push(a);
    else {
      const inside = scenarioFiles(a);
      if (inside.length === 0) emptyFolders.push(a);
      files.push(...inside);
    }
  }
  return { files, emptyFolders };
}
