import { join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import type { ScenarioIssue } from "../scenario/scenarioIssue.js";
import { computeTables } from "./computeTables.js";
import { readArchive, type ScenarioArchive } from "../archive/readArchive.js";
import type { TablesDocument } from "../contract/tablesDocument.js";
import type { TrustedRecords } from "../archive/trustedRecords.js";
import { sitePages, type PageExporter, type ReuseUnit } from "../site/sitePages.js";
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
 * chains); either a ledger or the issues that stop the build. `salt` and `reuse` let a build skip the pages it
 * already has (src/site/sitePages.ts, SiteUnit).
 */
export function readLedger(
  dir: string,
  archiveDir: string = defaultArchive(dir),
  options: LedgerOptions = {},
): { ledger: SiteLedger | null; issues: ScenarioIssue[]; warnings: ScenarioIssue[]; archives: ScenarioArchive[] } {
  const loaded = loadScenarioFiles(scenarioFiles(dir));
  const issues: ScenarioIssue[] = [...loaded.issues];
  const files = loaded.scenarios.map((scenario) => ({ scenario, doc: computeTables(scenario) }));
  const archive = readArchive(archiveDir, options.trusted);
  for (const a of archive.issues) issues.push({ file: a.file, line: 1, column: 1, path: "", message: a.message });
  const warnings = files.flatMap((f) => scenarioWarnings(f.scenario, f.doc));
  if (issues.length > 0) return { ledger: null, issues, warnings, archives: [] };
  return {
    ledger: ledgerFrom(
      files.map((f) => f.doc),
      archive.archives,
      archiveDir,
      options,
    ),
    issues: [],
    warnings,
    archives: archive.archives,
  };
}

export interface LedgerOptions {
  exports?: boolean;
  images?: boolean;
  salt?: string;
  reuse?: ReuseUnit;
  toolVersion?: string;
  /** Version files a previous build of the same site checked in full (src/archive/trustedRecords.ts). */
  trusted?: TrustedRecords;
}

/** The site's ledger from computed scenario files and a checked archive (the step after reading, shared with serve). */
export function ledgerFrom(
  docs: TablesDocument[],
  archives: ScenarioArchive[],
  archiveDir: string,
  options: LedgerOptions = {},
): SiteLedger {
  const renderers = cachedRenderers();
  const formats = options.images === false ? EXPORT_FORMATS.filter((f) => f !== "png" && f !== "svg") : EXPORT_FORMATS;
  const exporter: PageExporter = (doc, base, page) => exportFiles(doc, base, page, formats, renderers);
  const pages = sitePages(
    docs,
    archives,
    options.exports === false ? null : exporter,
    options.toolVersion ?? TOOL_VERSION,
    {
      salt: JSON.stringify([options.salt ?? "", formats]),
      reuse: options.reuse,
    },
  );
  return { ...pages, docs: pages.live.map((p) => p.presented), archive: displayPath(archiveDir) };
}
