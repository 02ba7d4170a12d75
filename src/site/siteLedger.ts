import { readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import { displayPath } from "../cli/displayPath.js";
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError, type ScenarioIssue } from "../scenario/scenarioIssue.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import { buildTablesDocument } from "../tables/buildTablesDocument.js";
import type { TablesDocument } from "../tables/tablesDocument.js";
import { readArchive } from "../archive/readArchive.js";
import { sitePages, type PageExporter, type SitePages } from "./sitePages.js";
import { EXPORT_FORMATS, exportFiles } from "../exports/exportFiles.js";
import { cachedRenderers } from "./imageCache.js";
import { TOOL_VERSION } from "../cli/toolVersion.js";

/** What the site is built from: every page's tables document (live or frozen), the archive's pages and the downloads. */
export interface SiteLedger extends SitePages {
  /** Tables documents of the live pages, in id order (the index's overview charts). */
  docs: TablesDocument[];
  /** The archive folder, as shown to users. */
  archive: string;
}

/** Scenario files in a folder: *.yaml and *.yml, sorted so builds are deterministic. */
export function scenarioFiles(dir: string): string[] {
  return readdirSync(dir).filter((f) => /\.ya?ml$/i.test(f)).sort().map((f) => join(dir, f));
}

/** The archive that belongs to a scenarios folder when none is named: a folder "archive" inside it. */
export const defaultArchive = (scenariosDir: string) => join(scenariosDir, "archive");

/**
 * Reads, validates and computes every scenario of a folder and reads the archive (checking every hash and the
 * chains); either a ledger or the issues that stop the build.
 */
export function readLedger(dir: string, archiveDir: string = defaultArchive(dir), options: { exports?: boolean; images?: boolean } = {}): { ledger: SiteLedger | null; issues: ScenarioIssue[] } {
  const issues: ScenarioIssue[] = [];
  const files: { scenario: ResolvedScenario; doc: TablesDocument }[] = [];
  const seen = new Map<string, string>();
  for (const file of scenarioFiles(dir)) {
    const shown = displayPath(file);
    const text = readFileSync(file, "utf8");
    try {
      const scenario = loadScenario(text, shown);
      if (seen.has(scenario.id)) {
        issues.push({ file: shown, line: 1, column: 1, path: "id", message: `scenario id ${scenario.id} is also used by ${seen.get(scenario.id)}` });
        continue;
      }
      seen.set(scenario.id, shown);
      files.push({ scenario, doc: buildTablesDocument(scenario) });
    } catch (e) {
      if (e instanceof ScenarioInputError) issues.push(...e.issues);
      else throw e;
    }
  }
  const archive = readArchive(archiveDir);
  for (const a of archive.issues) issues.push({ file: a.file, line: 1, column: 1, path: "", message: a.message });
  if (issues.length > 0) return { ledger: null, issues };
  const renderers = cachedRenderers();
  const formats = options.images === false ? EXPORT_FORMATS.filter((f) => f !== "png" && f !== "svg") : EXPORT_FORMATS;
  const exporter: PageExporter = (doc, base, page) => exportFiles(doc, base, page, formats, renderers);
  const pages = sitePages(files, archive.archives, options.exports === false ? null : exporter, TOOL_VERSION);
  return { ledger: { ...pages, docs: pages.live.map((p) => p.doc), archive: displayPath(archiveDir) }, issues: [] };
}

let current: SiteLedger | null = null;

/** The ledger handed to Eleventy by `cosmoledger build` (so the site is built from exactly what was checked). */
export function setSiteLedger(ledger: SiteLedger | null): void {
  current = ledger;
}

export function getSiteLedger(): SiteLedger | null {
  return current;
}
