import {
  holdsSameInputs,
  resolvesAlike,
  VERSION_FORMAT,
  type StoredVersionRecord,
  type VersionRecord,
} from "../contract/versionRecord.js";
import { versionDiff, type VersionDiff } from "../archive/versionDiff.js";
import type { ScenarioArchive } from "../archive/readArchive.js";
import type { StoredTablesDocument, TablesDocument } from "../contract/tablesDocument.js";
import { catalogFor, type DocumentCatalog } from "../contract/quantityCatalog.js";
import { tablesCsv } from "../contract/tablesCsv.js";
import { presentDocument, type PresentedDocument } from "../presentation/presentDocument.js";
import {
  chartDataTables,
  geometryCards,
  presentationTables,
  type GeometryCard,
  type PresentationTable,
} from "../presentation/presentTables.js";
import { presentationNotes } from "../presentation/presentDocument.js";
import type { ExportContent, ExportIndex } from "../exports/exportFiles.js";
import { formatPercent } from "../presentation/formatNumber.js";
import { jsonForScriptElement } from "./chartPayload.js";
import type { ExportProvenance } from "../exports/exportProvenance.js";
import { createHash } from "node:crypto";
import { tablesFormatOf } from "../archive/trustedRecords.js";

/** Makes the exports of one page (the site passes exportFiles with cached chart renderers). */
export type PageExporter = (
  presented: PresentedDocument,
  base: Omit<ExportProvenance, "page">,
  pageAddress: string,
) => { files: { name: string; content: ExportContent }[]; index: ExportIndex };

/** A frozen version as pages show it. */
export interface VersionInfo {
  n: number;
  created: string;
  message: string;
  sha256: string;
  previous_sha256: string | null;
  engine: string;
  format: string;
  path: string;
}

/**
 * What a scenario page shows:
 * - "unarchived": the scenario file, never frozen;
 * - "latest": the scenario file, identical to its latest frozen version;
 * - "draft": the scenario file, which differs from its latest frozen version;
 * - "frozen": one frozen version, exactly as frozen (address <id>/vN/);
 * - "archived-only": the latest frozen version of a scenario whose file is gone.
 */
export type PageStatus = "unarchived" | "latest" | "draft" | "frozen" | "archived-only";

export interface ScenarioPage {
  id: string;
  path: string;
  root: string;
  status: PageStatus;
  /** The page's document as presented: every number in the units the page shows (src/presentation/). */
  presented: PresentedDocument;
  /** presented.doc, for the page's text (titles, labels, ids, hashes). */
  doc: StoredTablesDocument;
  /** Every table of the page, by id, built once by the presentation layer (the exports render the same objects). */
  tables: Record<string, PresentationTable>;
  /** The tables of the page in page order (each redshift quantity's table among them). */
  tableList: PresentationTable[];
  /** The data table under each chart, by chart id. */
  chartTables: Record<string, PresentationTable>;
  /** "Geometry of space": one card per model. */
  geometry: GeometryCard[];
  /** What the numbers cannot say (h units with each model's H0, warnings), shown above the tables. */
  notes: string[];
  source: string;
  /** The catalogue filtered to the quantities this page's document holds, and the labels of those it lacks. */
  catalog: DocumentCatalog;
  /** The document's contract format (cosmoledger.tables/N). */
  format: string;
  /** The version this page shows (frozen, latest, archived-only), else null. */
  version: VersionInfo | null;
  /** The latest version and the number of versions (null and 0 on a frozen page, which must not depend on later versions). */
  latest: VersionInfo | null;
  versionCount: number;
  /** File names offered for download beside the page. */
  downloads: string[];
  /** For a draft: the page comparing the latest version with the draft. */
  draftDiffPath: string | null;
  /** For a draft: whether it resolves to the latest version's inputs (it differs only in comments or layout). */
  draftSameNumbers?: boolean;
  /** For a draft: the file is the latest version's own text; only the engine that computes it is newer. */
  draftEngineOnly?: boolean;
  /** The page's exports (files under <path>exports/) and the text behind its copy buttons; null when exports are off. */
  exports: ExportIndex | null;
}

export interface HistoryEntry extends VersionInfo {
  diffPath: string | null;
  summary: string;
}
export interface HistoryPage {
  id: string;
  title: string;
  path: string;
  root: string;
  entries: HistoryEntry[];
  draft: boolean;
  draftDiffPath: string | null;
  pairs: { from: number | "draft"; to: number | "draft"; path: string }[];
}
export interface DiffPage {
  id: string;
  title: string;
  path: string;
  root: string;
  from: VersionInfo | null;
  to: VersionInfo | null;
  fromLabel: string;
  toLabel: string;
  diff: VersionDiff;
}

/**
 * One rendered page and the files that go with it (downloads, exports). Its key is a hash of everything the page is
 * made from (records' hashes, the scenario file's text and inputs, the build's salt: tool, templates, options), so
 * an equal key means equal files and an incremental build may reuse them.
 */
export interface SiteUnit {
  path: string;
  key: string;
  /** The unit's files (site-relative), or null when the unit was reused (the caller knows its files). */
  files: string[] | null;
}

/** Which units may be reused instead of built: true when the files of (path, key) are already at hand. */
export type ReuseUnit = (path: string, key: string) => boolean;

export interface SitePages {
  /** The pages to render (a reused page is not among them). */
  pages: ScenarioPage[];
  /** Every page of the site, built or reused, with its key. */
  units: SiteUnit[];
  /** The page of each scenario at /<id>/, in id order (the index lists these, reused or not). */
  live: ScenarioPage[];
  histories: HistoryPage[];
  diffs: DiffPage[];
  downloads: { path: string; text: string }[];
  /** Export files (text, and images drawn when written) of the built pages, written beside them after Eleventy has run. */
  exportFiles: { path: string; content: ExportContent }[];
}

/** Above this many versions a scenario gets diff pages for consecutive versions and for each version against the latest only. */
export const ALL_PAIRS_LIMIT = 30;

const info = (r: StoredVersionRecord): VersionInfo => ({
  n: r.version,
  created: r.created,
  message: r.message,
  sha256: r.sha256,
  previous_sha256: r.previous_sha256,
  engine: r.engine.version,
  format: tablesFormatOf(r),
  path: `${r.scenario_id}/v${r.version}/`,
});
const diffPath = (id: string, a: number | "draft", b: number | "draft") =>
  `${id}/diff/${a === "draft" ? "draft" : `v${a}`}-${b === "draft" ? "draft" : `v${b}`}/`;

/** The draft as an unsealed record (from its tables document alone, which holds its source and inputs), so that it can be compared with versions. */
function draftRecord(doc: TablesDocument, n: number): VersionRecord {
  return {
    format: VERSION_FORMAT,
    scenario_id: doc.scenario.id,
    version: n,
    created: "",
    message: "",
    previous_sha256: null,
    tool: { name: "cosmoledger", version: "" },
    source: { path: doc.scenario.source_path, text: doc.scenario.source_text },
    attachments: [],
    inputs: doc.inputs,
    engine: doc.engine,
    tables: doc,
    sha256: "",
  };
}

function summarise(d: VersionDiff): string {
  const parts: string[] = [];
  const models = new Set(d.inputs.filter((c) => c.model !== null).map((c) => c.model));
  const scenarioKeys = d.inputs.filter((c) => c.model === null).map((c) => c.key);
  if (models.size > 0) parts.push(`inputs changed in ${models.size} model${models.size === 1 ? "" : "s"}`);
  if (scenarioKeys.length > 0) parts.push(`scenario ${scenarioKeys.join(", ")} changed`);
  if (d.modelsAdded.length) parts.push(`added ${d.modelsAdded.join(", ")}`);
  if (d.modelsRemoved.length) parts.push(`removed ${d.modelsRemoved.join(", ")}`);
  if (d.engine.changed) parts.push(`engine ${d.engine.before} \u2192 ${d.engine.after}`);
  if (d.format.changed)
    parts.push(
      `data format ${d.format.before.replace("cosmoledger.", "")} \u2192 ${d.format.after.replace("cosmoledger.", "")}${d.format.quantitiesAdded.length ? ` (${d.format.quantitiesAdded.length} quantities added)` : ""}`,
    );
  if (parts.length === 0) parts.push(d.source.length ? "source text only (comments or layout)" : "no change");
  const l = d.largest;
  if (l && l.relative !== null && l.relative > 0)
    parts.push(
      `largest output change ${formatPercent(l.relative).replace(/^\+/, "")} (${l.label}, ${l.model}, ${l.where})`,
    );
  return parts.join("; ");
}

const shownOnce = new WeakMap<StoredTablesDocument, ReturnType<typeof present>>();

/**
 * What a page shows of a stored document: the presented document and its tables (downloads keep the contract's
 * Mpc). Presented once per document object: a preview that keeps its documents between rebuilds presents only the
 * changed ones again.
 */
function shown(stored: StoredTablesDocument): ReturnType<typeof present> {
  let s = shownOnce.get(stored);
  if (!s) {
    s = present(stored);
    shownOnce.set(stored, s);
  }
  return s;
}

function present(stored: StoredTablesDocument) {
  const presented = presentDocument(stored);
  const tableList = presentationTables(presented);
  return {
    presented,
    doc: presented.doc,
    tableList,
    tables: Object.fromEntries(tableList.map((t) => [t.id, t])),
    geometry: geometryCards(presented),
    chartTables: chartDataTables(presented),
    catalog: catalogFor(stored, presented.hUnits),
    notes: presentationNotes(presented),
  };
}

function downloadsOf(
  path: string,
  doc: StoredTablesDocument,
  record: StoredVersionRecord | null,
): { path: string; text: string }[] {
  const files = [
    { path: `${path}tables.json`, text: `${JSON.stringify(doc)}\n` },
    ...Object.entries(tablesCsv(doc)).map(([name, text]) => ({ path: path + name, text })),
  ];
  if (record) files.push({ path: `${path}version.json`, text: `${JSON.stringify(record)}\n` });
  return files;
}

/** The key of a unit: a hash of the build's salt and of what the page is made from. */
export function unitKey(salt: string, parts: unknown): string {
  return createHash("sha256").update(salt).update("\n").update(JSON.stringify(parts)).digest("hex");
}

/** What a draft's pages are made from (its file's path and text, and its resolved inputs, samples included). */
const draftKey = (d: TablesDocument) =>
  createHash("sha256")
    .update(JSON.stringify([d.scenario.source_path, d.scenario.source_text, d.scenario.inputs_sha256]))
    .digest("hex");

/**
 * Every page of the site from the scenario files (already computed) and the checked archive: the live page of each
 * scenario, one page per frozen version, a history page and diff pages per archived scenario, and the downloads.
 * Frozen versions are shown from their stored tables, never recomputed. A unit that `reuse` accepts is not built:
 * only its key is computed (the live pages are presented all the same, for the index).
 */
export function sitePages(
  docs: TablesDocument[],
  archives: ScenarioArchive[],
  exporter: PageExporter | null = null,
  toolVersion = "",
  options: { salt?: string; reuse?: ReuseUnit } = {},
): SitePages {
  const salt = JSON.stringify([options.salt ?? "", toolVersion, exporter !== null]);
  const reuse = options.reuse ?? (() => false);
  const units: SiteUnit[] = [];
  const kept = (path: string, key: string) => {
    if (!reuse(path, key)) return false;
    units.push({ path, key, files: null });
    return true;
  };
  const built = (page: { path: string }, key: string, files: string[]) =>
    units.push({ path: page.path, key, files: [`${page.path}index.html`, ...files] });
  const exportFiles: SitePages["exportFiles"] = [];
  const attachExports = (page: ScenarioPage): string[] => {
    if (!exporter) return [];
    const v = page.version;
    const base = {
      tool: "cosmoledger",
      tool_version: toolVersion,
      scenario_id: page.id,
      scenario_title: page.doc.scenario.title,
      version: v ? v.n : null,
      version_sha256: v ? v.sha256 : null,
      inputs_sha256: page.doc.scenario.inputs_sha256,
      engine_version: page.doc.engine.version,
    };
    const made = exporter(page.presented, base, `${page.path}index.html`);
    page.exports = made.index;
    const files = [
      ...made.files.map((f) => ({ path: `${page.path}exports/${f.name}`, content: f.content })),
      { path: `${page.path}exports/copy.js`, content: copyScript(made.index) },
    ];
    exportFiles.push(...files);
    return files.map((f) => f.path);
  };
  const pages: ScenarioPage[] = [];
  const live: ScenarioPage[] = [];
  const histories: HistoryPage[] = [];
  const diffs: DiffPage[] = [];
  const downloads: { path: string; text: string }[] = [];
  const ids = [
    ...new Set([...docs.map((d) => d.scenario.id), ...archives.filter((a) => a.versions.length > 0).map((a) => a.id)]),
  ].sort();
  for (const id of ids) {
    const file = docs.find((d) => d.scenario.id === id);
    const versions = archives.find((a) => a.id === id)?.versions ?? [];
    const latest = versions.at(-1) ?? null;
    const isDraft = !!(file && latest && !holdsSameInputs(latest, file));
    const draftDiffPath = isDraft && latest ? diffPath(id, latest.version, "draft") : null;
    const latestInfo = latest ? info(latest) : null;
    for (const r of versions) {
      // A frozen page is made from its record alone (which version is the latest comes from <id>/latest.js), so it
      // is rendered once per release of the tool and reused after every later freeze.
      const key = unitKey(salt, ["frozen", r.sha256]);
      if (kept(`${id}/v${r.version}/`, key)) continue;
      const page: ScenarioPage = {
        id,
        path: `${id}/v${r.version}/`,
        root: "../../",
        status: "frozen",
        ...shown(r.tables),
        source: r.source.text,
        format: r.tables.format,
        version: info(r),
        latest: null,
        versionCount: 0,
        downloads: [],
        draftDiffPath: null,
        exports: null,
      };
      const exported = attachExports(page);
      const files = downloadsOf(page.path, r.tables, r);
      page.downloads = files.map((f) => f.path.slice(page.path.length));
      downloads.push(...files);
      pages.push(page);
      built(page, key, [...files.map((f) => f.path), ...exported]);
    }
    const status: PageStatus = !file ? "archived-only" : !latest ? "unarchived" : isDraft ? "draft" : "latest";
    const doc = file ?? latest!.tables;
    const livePage: ScenarioPage = {
      id,
      path: `${id}/`,
      root: "../",
      status,
      ...shown(doc),
      source: file ? file.scenario.source_text : latest!.source.text,
      format: doc.format,
      version: status === "latest" || status === "archived-only" ? info(latest!) : null,
      latest: latest ? info(latest) : null,
      versionCount: versions.length,
      downloads: [],
      draftDiffPath,
      draftSameNumbers: isDraft && latest && file ? resolvesAlike(latest, file) : false,
      draftEngineOnly:
        isDraft && latest && file
          ? latest.source.text === file.scenario.source_text && latest.tables.engine.version !== file.engine.version
          : false,
      exports: null,
    };
    const liveKey = unitKey(salt, ["live", status, file ? draftKey(file) : null, latestInfo, versions.length]);
    live.push(livePage);
    if (!kept(livePage.path, liveKey)) {
      const exported = attachExports(livePage);
      const liveFiles = downloadsOf(livePage.path, doc, null);
      livePage.downloads = liveFiles.map((f) => f.path.slice(livePage.path.length));
      if (latestInfo) liveFiles.push({ path: `${id}/latest.js`, text: latestScript(latestInfo) });
      downloads.push(...liveFiles);
      pages.push(livePage);
      built(livePage, liveKey, [...liveFiles.map((f) => f.path), ...exported]);
    }
    if (versions.length === 0) continue;

    const title = doc.scenario.title;
    const points: { label: number | "draft"; record: StoredVersionRecord }[] = versions.map((r) => ({
      label: r.version,
      record: r,
    }));
    if (isDraft && file) points.push({ label: "draft", record: draftRecord(file, latest!.version + 1) });
    const pairs: HistoryPage["pairs"] = [];
    const all = points.length <= ALL_PAIRS_LIMIT;
    const pointKey = (p: (typeof points)[number]) => (p.label === "draft" ? draftKey(file!) : p.record.sha256);
    const consecutive = new Map<string, VersionDiff>();
    for (let i = 0; i < points.length; i++)
      for (let j = i + 1; j < points.length; j++) {
        if (!all && j !== i + 1 && j !== points.length - 1) continue;
        const a = points[i];
        const b = points[j];
        const path = diffPath(id, a.label, b.label);
        pairs.push({ from: a.label, to: b.label, path });
        if (kept(path, unitKey(salt, ["diff", title, a.label, b.label, pointKey(a), pointKey(b)]))) continue;
        const diff = versionDiff(a.record, b.record);
        if (j === i + 1) consecutive.set(path, diff);
        diffs.push({
          id,
          title,
          path,
          root: "../../../",
          from: info(a.record),
          to: b.label === "draft" ? null : info(b.record),
          fromLabel: `version ${a.label}`,
          toLabel: b.label === "draft" ? "unfrozen draft" : `version ${b.label}`,
          diff,
        });
        built({ path }, unitKey(salt, ["diff", title, a.label, b.label, pointKey(a), pointKey(b)]), []);
      }
    const historyPath = `${id}/history/`;
    const historyKey = unitKey(salt, ["history", title, points.map(pointKey), draftDiffPath, pairs]);
    if (kept(historyPath, historyKey)) continue;
    const entries: HistoryEntry[] = versions.map((r, i) => {
      if (i === 0) return { ...info(r), diffPath: null, summary: "first version" };
      const path = diffPath(id, versions[i - 1].version, r.version);
      const d = consecutive.get(path) ?? versionDiff(versions[i - 1], r);
      return { ...info(r), diffPath: path, summary: summarise(d) };
    });
    const history: HistoryPage = {
      id,
      title,
      path: historyPath,
      root: "../../",
      entries: entries.reverse(),
      draft: isDraft,
      draftDiffPath,
      pairs,
    };
    histories.push(history);
    built(history, historyKey, []);
  }
  units.sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  return { pages, units, live, histories, diffs, downloads, exportFiles };
}

/** Which version of a scenario is the latest, for its frozen pages (content/assets/latest-version.js). Data only. */
function latestScript(latest: VersionInfo): string {
  return `// Generated by cosmoledger: the latest frozen version of this scenario. Data only.\nwindow.cosmoledgerLatest = ${jsonForScriptElement({ n: latest.n, path: latest.path })};\n`;
}

/** The copy-to-clipboard texts of a page as a script that only assigns data (loaded with a script element, so it works from file://). */
function copyScript(index: ExportIndex): string {
  const data = { tables: index.copy, assumptions: { md: index.assumptions.plain, tex: index.assumptions.latex } };
  return `// Generated by cosmoledger: the Markdown and LaTeX behind this page's copy buttons. Data only.\nwindow.cosmoledgerCopy = ${jsonForScriptElement(data)};\n`;
}
