import {
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  renameSync,
  rmdirSync,
  rmSync,
  writeFileSync,
} from "node:fs";
import { dirname, join, relative } from "node:path";

/**
 * Applying a staged incremental build to a site folder. The staged folder holds every file that is new or changed;
 * `deletions` lists the site's files that the new site no longer has. The journal is written before the first
 * change: a build killed while applying (a few renames) is finished by the next build (roll forward), so the site
 * is either the previous one or the new one once a build has run.
 */
export const APPLY_JOURNAL = ".cosmoledger-apply.json";

export function writeApplyJournal(staged: string, deletions: string[]): void {
  const file = join(staged, APPLY_JOURNAL);
  writeFileSync(`${file}.tmp`, JSON.stringify({ deletions }));
  renameSync(`${file}.tmp`, file); // the journal exists whole or not at all
}

export const hasApplyJournal = (staged: string) => existsSync(join(staged, APPLY_JOURNAL));

/**
 * Moves every staged file into the site (each rename replaces one file at once), removes the deletions, then the
 * staging folder. The site's page list (`manifest`) goes first and comes back last: a site caught between the two
 * has none, so whatever happens its next build cannot reuse a page on the strength of a list that no longer
 * describes it.
 */
export function applyStagedSite(staged: string, site: string, manifest: string): void {
  const { deletions } = JSON.parse(readFileSync(join(staged, APPLY_JOURNAL), "utf8")) as { deletions: string[] };
  if (existsSync(join(staged, manifest))) rmSync(join(site, manifest), { force: true });
  const made = new Set<string>();
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const from = join(dir, e.name);
      if (e.isDirectory()) walk(from);
      else if (from !== join(staged, APPLY_JOURNAL) && from !== join(staged, manifest)) {
        const to = join(site, relative(staged, from));
        const folder = dirname(to);
        if (!made.has(folder)) {
          mkdirSync(folder, { recursive: true });
          made.add(folder);
        }
        renameSync(from, to);
      }
    }
  };
  walk(staged);
  if (existsSync(join(staged, manifest))) renameSync(join(staged, manifest), join(site, manifest));
  for (const f of deletions) removeFileAndEmptyFolders(site, f);
  rmSync(staged, { recursive: true, force: true });
}

/** Removes one file of a site, then each folder above it that it leaves empty (never the site folder itself). */
export function removeFileAndEmptyFolders(site: string, file: string): void {
  rmSync(join(site, file), { force: true });
  for (let d = dirname(join(site, file)); d.length > site.length; d = dirname(d)) {
    try {
      if (readdirSync(d).length > 0) return;
      rmdirSync(d);
    } catch {
      return;
    }
  }
}
