import { stringify } from "csv-stringify/sync";
import { ROW_KEYS } from "./buildTablesDocument.js";
import type { TablesDocument } from "./tablesDocument.js";

const cell = (v: unknown): string => (v === null || v === undefined ? "" : String(v));

/** One RFC 4180 CSV per table shown on the page (the chart grid stays in tables.json) of the document (csv-stringify), keyed by file name. Numbers at full precision; empty cell = null. */
export function tablesCsv(doc: TablesDocument): Record<string, string> {
  const ids = doc.models.map((m) => m.id);
  const table = (header: string[], body: unknown[][]) => stringify([header, ...body.map((r) => r.map(cell))], { record_delimiter: "\r\n" });
  const cellOf = (v: unknown) => (Array.isArray(v) ? v.join(" ") : v);
  const paramKeys = Object.keys(doc.models[0].parameters) as (keyof TablesDocument["models"][0]["parameters"])[];
  const summaryKeys = Object.keys(doc.models[0].summary);
  const files: Record<string, string> = {
    "parameters.csv": table(["parameter", ...ids], paramKeys.map((k) => [k, ...doc.models.map((m) => cellOf(m.parameters[k]))])),
    "summary.csv": table(["quantity", ...ids], summaryKeys.map((k) => [k, ...doc.models.map((m) => m.summary[k])])),
    "redshifts.csv": table(["model", ...ROW_KEYS], doc.models.flatMap((m) => m.redshifts.map((r) => [m.id, ...ROW_KEYS.map((k) => r[k])]))),
    "differences.csv": table(["model", "quantity", "absolute", "relative"], Object.entries(doc.differences).flatMap(([id, d]) =>
      Object.entries(d.summary).map(([k, v]) => [id, k, v.absolute, v.relative]))),
  };
  const targets = doc.models.flatMap((m) => m.targets.map((t) => ({ model: m.id, ...t })));
  if (targets.length > 0) {
    const keys = Object.keys(targets[0]);
    files["targets.csv"] = table(keys, targets.map((t) => keys.map((k) => (t as Record<string, unknown>)[k])));
  }
  const surveys = doc.models.flatMap((m) => m.surveys.map((s) => ({ model: m.id, ...s })));
  if (surveys.length > 0) {
    const keys = Object.keys(surveys[0]);
    files["surveys.csv"] = table(keys, surveys.map((s) => keys.map((k) => (s as Record<string, unknown>)[k])));
  }
  return files;
}
