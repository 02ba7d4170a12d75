import { existsSync, readFileSync, readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import { checkVersionChain, type ArchiveIssue } from "./checkVersionChain.js";
import type { StoredVersionRecord } from "../contract/versionRecord.js";

export interface ScenarioArchive {
  id: string;
  folder: string;
  versions: StoredVersionRecord[];
}

/** Scenario ids are folder names in the archive; dotfiles (a freeze's temporary files) are skipped. */
const visible = (name: string) => !name.startsWith(".");

/** Reads and checks every scenario's version chain in an archive folder. A folder that does not exist is an empty archive. */
export function readArchive(archiveDir: string): { archives: ScenarioArchive[]; issues: ArchiveIssue[] } {
  const archives: ScenarioArchive[] = [];
  const issues: ArchiveIssue[] = [];
  if (!existsSync(archiveDir)) return { archives, issues };
  if (!statSync(archiveDir).isDirectory())
    return { archives, issues: [{ file: displayPath(archiveDir), message: "is a file, not an archive folder" }] };
  for (const id of readdirSync(archiveDir).filter(visible).sort()) {
    const folder = join(archiveDir, id);
    if (!statSync(folder).isDirectory()) {
      if (id.toLowerCase() !== "readme.md")
        issues.push({
          file: displayPath(folder),
          message: "unexpected file in the archive (expected one folder per scenario id)",
        });
      continue;
    }
    archives.push(readScenarioArchive(folder, id, issues));
  }
  return { archives, issues };
}

/** One scenario's folder: its checked versions, oldest first; problems are added to `issues`. */
export function readScenarioArchive(folder: string, id: string, issues: ArchiveIssue[]): ScenarioArchive {
  const names = existsSync(folder) ? readdirSync(folder).filter(visible) : [];
  const files: { name: string; text: string }[] = [];
  for (const name of names) {
    const path = join(folder, name);
    if (statSync(path).isFile()) files.push({ name, text: readFileSync(path, "utf8") });
    else
      issues.push({
        file: displayPath(path),
        message: "unexpected folder in a version folder (expected v1.json, v2.json, ...)",
      });
  }
  const checked = checkVersionChain(displayPath(folder), id, files);
  issues.push(...checked.issues);
  return { id, folder, versions: checked.versions };
}
