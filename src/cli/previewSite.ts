import { existsSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { readArchive, type ScenarioArchive } from "../archive/readArchive.js";
import { bytesHashOf, metaOf, type TrustedRecords } from "../archive/trustedRecords.js";
import type { TablesDocument } from "../contract/tablesDocument.js";
import { readRegularFile } from "../common/readRegularFile.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import {
  formatIssue,
  issueLine,
  issueSummary,
  ScenarioInputError,
  type ScenarioIssue,
} from "../scenario/scenarioIssue.js";
import { buildSalt } from "./buildSalt.js";
import { locatedTables } from "../tables/locatedTables.js";
import { ledgerFrom } from "./readLedger.js";
import { idUsedTwice, loadScenarioFile } from "./readScenarioFile.js";
import { renderInBatches } from "./renderSite.js";
import { removeFileAndEmptyFolders } from "./applySiteChanges.js";
import { scenarioFiles } from "./scenarioFiles.js";
import { scenarioWarnings } from "../tables/scenarioWarnings.js";
import { readSiteManifest, SITE_MANIFEST, siteManifestText, type ManifestUnits } from "./siteManifest.js";

/** What one scenario file gave: its scenario and tables document, or its located issues; and its warnings. */
interface FileResult {
  scenario: ResolvedScenario | null;
  doc: TablesDocument | null;
  issues: ScenarioIssue[];
  warnings: ScenarioIssue[];
}

/** The outcome of one rebuild, for the terminal and the open pages. */
export interface PreviewResult {
  /** Located errors (as `check` prints them): nothing was rebuilt and the pages keep their last good numbers. */
  errors: string[];
  warnings: string[];
  summary: string;
  /** Site-relative paths of the pages rendered ("" is the index). */
  rendered: string[];
  /** Pages reused unchanged. */
  reused: number;
}

/**
 * The site of a scenarios folder kept up to date in place for `cosmoledger serve`: a save recomputes only the
 * changed file (documents are kept by the file's text), re-reads the archive only when it changed, and renders
 * only the pages whose key changed (src/site/sitePages.ts); pages and files of removed scenarios are deleted.
 */
export class PreviewSite {
  private files = new Map<string, { text: string; result: FileResult }>();
  private archive: { archives: ScenarioArchive[]; issues: ScenarioIssue[] } | null = null;
  private units: ManifestUnits;
  /** Version files already checked in full, so that a freeze re-reads the archive without checking it all again. */
  private readonly trusted: TrustedRecords = new Map();

  constructor(
    private readonly scenariosDir: string,
    private readonly archiveDir: string,
    private readonly outDir: string,
    private readonly options: { images: boolean },
  ) {
    this.units = readSiteManifest(outDir) ?? new Map();
  }

  /** Forget what was read from the archive (a file in it changed). */
  archiveChanged(): void {
    this.archive = null;
  }

  /** Forget every computed scenario (a file other than a scenario changed, such as a samples file). */
  attachmentChanged(): void {
    this.files.clear();
  }

  /** The archive, checked; versions read before are trusted by the hash of their bytes (src/archive/trustedRecords.ts). */
  private readArchive(): { archives: ScenarioArchive[]; issues: ScenarioIssue[] } {
    const a = readArchive(this.archiveDir, this.trusted);
    for (const x of a.archives)
      for (const r of x.versions) {
        const h = bytesHashOf(r);
        if (h && !this.trusted.has(h)) this.trusted.set(h, metaOf(r));
      }
    return {
      archives: a.archives,
      issues: a.issues.map((i) => ({ file: i.file, line: 1, column: 1, path: "", message: i.message })),
    };
  }

  private readFile(file: string): FileResult {
    const read = readRegularFile(file);
    const text = "why" in read ? null : Buffer.from(read.bytes).toString("latin1");
    const known = text !== null ? this.files.get(file) : undefined;
    if (known && known.text === text) return known.result;
    const result = computeFile(file);
    if (text !== null) this.files.set(file, { text, result });
    return result;
  }

  async rebuild(): Promise<PreviewResult> {
    const results = scenarioFiles(this.scenariosDir).map((f) => this.readFile(f));
    for (const f of [...this.files.keys()]) if (!existsSync(f)) this.files.delete(f);
    const issues = results.flatMap((r) => r.issues);
    const seen = new Map<string, string>();
    const docs: TablesDocument[] = [];
    for (const r of results) {
      if (!r.scenario || !r.doc) continue;
      const twice = idUsedTwice(seen, r.scenario);
      if (twice) issues.push(twice);
      else docs.push(r.doc);
    }
    this.archive ??= this.readArchive();
    issues.push(...this.archive.issues);
    const warnings = results.flatMap((r) => r.warnings).map((w) => `warning: ${formatIssue(w)}`); // as check prints them
    if (issues.length > 0)
      return {
        errors: issues.map(issueLine),
        warnings,
        summary: issueSummary(issues, "the preview was not rebuilt."),
        rendered: [],
        reused: 0,
      };
    if (docs.length === 0 && this.archive.archives.length === 0)
      return {
        errors: [`error: no scenario files (*.yaml) in ${this.scenariosDir}`],
        warnings,
        summary: "No scenario files: the preview was not rebuilt.",
        rendered: [],
        reused: 0,
      };
    const previous = this.units;
    const ledgerOf = (reuse: (path: string, key: string) => boolean) =>
      ledgerFrom(docs, this.archive!.archives, this.archiveDir, {
        images: this.options.images,
        salt: `${buildSalt()}\npreview`,
        reuse,
      });
    const plan = ledgerOf(() => true);
    const toRender = plan.units.filter((u) => previous.get(u.path)?.key !== u.key).map((u) => u.path);
    const built = new Map(
      (await renderInBatches(ledgerOf, toRender, this.outDir, { preview: true })).map((u) => [u.path, u]),
    );
    const units = plan.units.map((u) => built.get(u.path) ?? u);
    const next: ManifestUnits = new Map();
    for (const u of units) next.set(u.path, u.files ? { key: u.key, files: u.files } : previous.get(u.path)!);
    // Files the site no longer has: pages of removed scenarios, versions or diffs, and exports a page dropped.
    const kept = new Set([...next.values()].flatMap((u) => u.files));
    for (const u of previous.values())
      for (const f of u.files) if (!kept.has(f)) removeFileAndEmptyFolders(this.outDir, f);
    this.units = next;
    writeFileSync(
      join(this.outDir, SITE_MANIFEST),
      siteManifestText([...next].map(([path, u]) => ({ path, ...u })).sort((a, b) => (a.path < b.path ? -1 : 1))),
    );
    const rendered = [...built.keys()];
    return {
      errors: [],
      warnings,
      summary: "",
      rendered: ["", ...rendered],
      reused: units.length - rendered.length,
    };
  }
}

function computeFile(file: string): FileResult {
  const loaded = loadScenarioFile(file);
  if (!loaded.scenario) return { scenario: null, doc: null, issues: loaded.issues, warnings: [] };
  try {
    const doc = locatedTables(loaded.scenario);
    return { scenario: loaded.scenario, doc, issues: [], warnings: scenarioWarnings(loaded.scenario, doc) };
  } catch (e) {
    if (!(e instanceof ScenarioInputError)) throw e;
    return { scenario: null, doc: null, issues: e.issues, warnings: [] };
  }
}
