// The scenario pipeline for a page's what-if panel: the same modules `compute` runs (parse, validate, resolve,
// compute) and the presentation every output uses, bundled for the browser by bin/bundleCli.mjs with a browser
// stand-in for the one Node built-in they reach (SHA-256, ./nodeCryptoShim.ts). A what-if scenario names no samples
// file and no spread, so the helper thread of spreads is never reached.
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError, formatIssue, issueLine } from "../scenario/scenarioIssue.js";
import { locatedTables } from "../tables/locatedTables.js";
import type { BuildOptions } from "../tables/buildTablesDocument.js";
import { scenarioWarnings } from "../tables/scenarioWarnings.js";
import type { ModelTables, TablesDocument } from "../contract/tablesDocument.js";
import { presentDocument, unitNotes } from "../presentation/presentDocument.js";
import {
  chartDataTables,
  geometryCards,
  presentationTables,
  rowKeys,
  type GeometryCard,
  type PresentationCell,
  type PresentationTable,
} from "../presentation/presentTables.js";
import { pageChartData } from "../presentation/chartData.js";
import { whatIfFileName, whatIfScenario, type WhatIfChanges, type WhatIfStart } from "./whatIfScenario.js";

/** The what-if model's label in the page's tables, charts and geometry cards. */
export const WHAT_IF_PAGE_LABEL = "What-if (not archived)";

export { whatIfScenario } from "./whatIfScenario.js";

/** The tables document of a scenario text, or the located problems in the words of `check`. */
export function whatIfTables(text: string, file: string): { doc: TablesDocument } | { problems: string[] } {
  try {
    const scenario = loadScenario(text, file);
    return { doc: locatedTables(scenario) };
  } catch (e) {
    if (e instanceof ScenarioInputError) return { problems: e.issues.map(issueLine) };
    throw e;
  }
}

export interface WhatIfRequest {
  /** The page's scenario source text, the name `check` reports it under and the scenario's id. */
  source: string;
  file: string;
  id: string;
  start: WhatIfStart;
  changes: WhatIfChanges;
}

/** The what-if model's share of one page table: its column heads and, per row (by row key), its cells. */
export interface WhatIfTable {
  columns: { label: string; unit: string }[];
  rows: { key: string; cells: PresentationCell[] }[];
}

export type WhatIfResult = {
  /** The scenario text computed, and the model block "Copy as YAML" gives. */
  text: string;
  block: string;
  file: string;
} & (
  | {
      ok: true;
      modelId: string;
      label: string;
      /** Per page table id (data-table), the what-if model's columns in the presentation every output uses. */
      tables: Record<string, WhatIfTable>;
      /** The what-if model's curve for the page's charts (the same rounding as the page's chart data). */
      chart: { id: string; label: string; values: Record<string, (number | null)[]> };
      geometry: GeometryCard;
      /** What the numbers cannot say (h units with this model's H0) and the warnings, in the words of `check`. */
      notes: string[];
      /** The model's resolved inputs and how each came to be (set, inherited, default, derived). */
      parameters: Record<string, unknown>;
      provenance: Record<string, string>;
    }
  | { ok: false; problems: string[] }
);

/**
 * The columns of model `index` in a table whose columns are models (optionally after leading columns such as the
 * method of the early-universe table, and possibly several per model, as the charts' data tables have). Tables
 * with column spans (a whole redshift group, for its exports) are not shown on pages and are left out.
 */
function modelColumns(t: PresentationTable, models: number, index: number): number[] | null {
  if (t.spans && t.spans.length > 1) return null;
  const lead = t.columns.length % models;
  const per = (t.columns.length - lead) / models;
  if (per < 1) return null;
  return Array.from({ length: per }, (_, j) => lead + index * per + j);
}

function share(t: PresentationTable, models: number, index: number): WhatIfTable | null {
  const cols = modelColumns(t, models, index);
  // Only columns that name the what-if (its label, or "label: series" in a chart's data table): a table laid out
  // otherwise is left without a what-if column rather than given another model's numbers.
  if (!cols?.every((c) => t.columns[c].label.startsWith(WHAT_IF_PAGE_LABEL))) return null;
  const keys = rowKeys(t.rows);
  return {
    columns: cols.map((c) => ({ label: t.columns[c].label, unit: t.columns[c].unit })),
    rows: t.rows.map((r, i) => ({ key: keys[i], cells: cols.map((c) => r.cells[c]) })),
  };
}

/**
 * The tables of the models a what-if keeps (the baseline, the starting point and its ancestors), from the last
 * computation: they come before the what-if in the computed text, which they do not depend on, and the text
 * without the what-if (WhatIfScenario.kept) is the same for every change from one starting point. Cloned out,
 * since the compute step completes a model's tables in place.
 */
let keptTables: { text: string; byIndex: Map<number, ModelTables> } = { text: "", byIndex: new Map() };

function reusingKeptModels(kept: string, whatIfIndex: number): BuildOptions["modelTablesOf"] {
  if (keptTables.text !== kept) keptTables = { text: kept, byIndex: new Map() };
  const { byIndex } = keptTables;
  return (index, compute) => {
    if (index === whatIfIndex) return compute();
    let tables = byIndex.get(index);
    if (!tables) {
      tables = compute();
      byIndex.set(index, structuredClone(tables));
      return tables;
    }
    return structuredClone(tables);
  };
}

/** Computes a page's what-if model and presents it as the page presents its own models. */
export function whatIf(request: WhatIfRequest): WhatIfResult {
  const s = whatIfScenario(request.source, request.start, request.changes, request.id);
  const file = whatIfFileName(request.file);
  const head = { text: s.text, block: s.block, file };
  let doc: TablesDocument;
  let warnings: string[];
  let index: number;
  try {
    const scenario = loadScenario(s.text, file);
    index = scenario.models.findIndex((m) => m.id === s.modelId);
    doc = locatedTables(scenario, { modelTablesOf: reusingKeptModels(s.kept, index) });
    // The what-if model's own warnings (the page shows those of its models already), as `check` prints them.
    const at = `models[${index}]`;
    warnings = scenarioWarnings(scenario, doc)
      .filter((w) => w.path === at || w.path.startsWith(`${at}.`))
      .map((w) => `warning: ${formatIssue(w)}`);
  } catch (e) {
    if (e instanceof ScenarioInputError) return { ...head, ok: false, problems: e.issues.map(issueLine) };
    throw e;
  }
  // On the page the model is named for what it is; the copied block keeps the plain label.
  (doc.models[index] as { label: string }).label = WHAT_IF_PAGE_LABEL;
  const presented = presentDocument(doc);
  const n = doc.models.length;
  const tables: Record<string, WhatIfTable> = {};
  for (const t of [...presentationTables(presented), ...Object.values(chartDataTables(presented))]) {
    const part = share(t, n, index);
    if (part) tables[t.id] = part;
  }
  const chart = pageChartData(presented).models[index];
  const model = doc.models[index];
  return {
    ...head,
    ok: true,
    modelId: s.modelId,
    label: model.label,
    tables,
    chart: { id: chart.id, label: chart.label, values: chart.values },
    geometry: geometryCards(presented)[index],
    notes: [...unitNotes(presented), ...warnings],
    parameters: model.parameters as unknown as Record<string, unknown>,
    provenance: model.provenance as unknown as Record<string, string>,
  };
}
