import { join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import type { ScenarioIssue } from "../scenario/scenarioIssue.js";
import { computeTables } from "./computeTables.js";
import { readArchive } from "../archive/readArchive.js";
import { sitePages, type PageExporter } from "../site/sitePages.js";
import { loadScenarioFiles } from "./readScenarioFile.js";
import type { SiteLedger } from "../site/siteLedger.js";
import { EXPORT_FORMATS, exportFiles } from "../exports/exportFiles.js";
import { cachedRenderers } from "../exports/imageCache.js";
import { TOOL_VERSION } from "../common/toolVersion.js";
import { scenarioFiles } from "./scenarioFiles.js";
import { scenarioWarnings } from "./scenarioWarnings.js";

export { scenarioFiles };

/** The archive that belongs to a scenarios folder when none is named: a folder "archive" inside it. */
export const defaultArchive = (scenariosDir: string) => join(scenariosDir, "archive");

/**
 * Reads, validates and computes every scenario of a folder and reads the archive (checking every hash and the
 * chains); either a ledger or the issues that stop the build.
 */
export function readLedger(
  dir: string,
  archiveDir: string = defaultArchive(dir),
  options: { exports?: boolean; images?: boolean } = {},
): { ledger: SiteLedger | null; issues: ScenarioIssue[]; warnings: ScenarioIssue[] } {
  const loaded = loadScenarioFiles(scenarioFiles(dir));
  const issues: ScenarioIssue[] = [...loaded.issues];
  const files = loaded.scenarios.map((scenario) => ({ scenario, doc: computeTables(scenario) }));
  const archive = readArchive(archiveDir);
  for (const a of archive.issues) issues.push({ file: a.file, line: 1, column: 1, path: "", message: a.message });
  const warnings = files.flatMap((f) => scenarioWarnings(f.scenario, f.doc));
  if (issues.length > 0) return { ledger: null, issues, warnings };
  const renderers = cachedRenderers();
  const formats = options.images === false ? EXPORT_FORMATS.filter((f) => f !== "png" && f !== "svg") : EXPORT_FORMATS;
  const exporter: PageExporter = (doc, base, page) => exportFiles(doc, base, page, formats, renderers);
  const pages = sitePages(
    files.map((f) => f.doc),
    archive.archives,
    options.exports === false ? null : exporter,
    TOOL_VERSION,
  );
  return {
    ledger: { ...pages, docs: pages.live.map((p) => p.presented), archive: displayPath(archiveDir) },
    issues: [],
    warnings,
  };
}
