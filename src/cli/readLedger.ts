import { join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import type { ScenarioIssue } from "../scenario/scenarioIssue.js";
import { locatedTables } from "../tables/locatedTables.js";
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
import { scenarioWarnings } from "../tables/scenarioWarnings.js";

export { scenarioFiles };

/** The archive that belongs to a scenarios folder when none is named: a folder "archive" inside it. */
export const defaultArchive = (scenariosDir: string) => join(scenariosDir, "archive");

/** What a site is built from: every scenario file computed, and the checked archive; or the issues that stop it. */
export interface SiteInputs {
  docs: TablesDocument[];
  archives: ScenarioArchive[];
  issues: ScenarioIssue[];
  warnings: ScenarioIssue[];
}

/**
 * Reads, validates and computes every scenario of a folder and reads the archive (checking every hash and the
 * chains; with `trusted`, files a previous build checked are trusted by the hash of their bytes).
 */
export function readSiteInputs(dir: string, archiveDir: string, trusted?: TrustedRecords): SiteInputs {
  const loaded = loadScenarioFiles(scenarioFiles(dir));
  const issues: ScenarioIssue[] = [...loaded.issues];
  const files = loaded.scenarios.map((scenario) => ({ scenario, doc: locatedTables(scenario) }));
  const archive = readArchive(archiveDir, trusted);
  for (const a of archive.issues) issues.push({ file: a.file, line: 1, column: 1, path: "", message: a.message });
  const warnings = files.flatMap((f) => scenarioWarnings(f.scenario, f.doc));
  return { docs: files.map((f) => f.doc), archives: archive.archives, issues, warnings };
}

/** readSiteInputs, then the ledger of every page; either a ledger or the issues that stop the build. */
export function readLedger(
  dir: string,
  archiveDir: string = defaultArchive(dir),
  options: LedgerOptions = {},
): { ledger: SiteLedger | null; issues: ScenarioIssue[]; warnings: ScenarioIssue[] } {
  const inputs = readSiteInputs(dir, archiveDir, options.trusted);
  if (inputs.issues.length > 0) return { ledger: null, issues: inputs.issues, warnings: inputs.warnings };
  return {
    ledger: ledgerFrom(inputs.docs, inputs.archives, archiveDir, options),
    issues: [],
    warnings: inputs.warnings,
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
