import { csvText } from "../common/userText.js";
import { stringify } from "csv-stringify/sync";
import type { StoredTablesDocument } from "./tablesDocument.js";

/** Empty for null; numbers as numbers; text neutralised against spreadsheet formula injection (OWASP). */
const cell = (v: unknown): string =>
  v === null || v === undefined ? "" : typeof v === "string" ? csvText(v) : String(v);
/**
 * Fields that are always quoted: those holding "#" (some readers take it as a comment anywhere) or a line break (a
 * lone CR too, RFC 4180). One rule for the contract's CSVs and every CSV export.
 */
export const CSV_QUOTED = /[#\r\n]/;

/** RFC 4180 CSV text of rows of fields (csv-stringify): CRLF line ends, CSV_QUOTED fields quoted. */
export const csvRows = (rows: string[][]): string =>
  stringify(rows, { record_delimiter: "\r\n", quoted_match: CSV_QUOTED });

/**
 * One RFC 4180 CSV per table shown on the page (the chart grid stays in tables.json) of the document (csv-stringify),
 * keyed by file name. Numbers at full precision; empty cell = null. Columns are the keys the document itself holds,
 * so a document of an older format gets exactly its own columns (a quantity it lacks is left out, never blank).
 */
export function tablesCsv(doc: StoredTablesDocument): Record<string, string> {
  const ids = doc.models.map((m) => m.id);
  const table = (header: string[], body: unknown[][]) => csvRows([header.map(cell), ...body.map((r) => r.map(cell))]);
  const cellOf = (v: unknown) => (Array.isArray(v) ? v.join(" ") : v);
  const rec = (x: object) => x as Record<string, unknown>;
  const paramKeys = Object.keys(doc.models[0].parameters);
  const summaryKeys = Object.keys(doc.models[0].summary);
  const rowKeys = Object.keys(doc.models[0].redshifts[0] ?? { z: null });
  const files: Record<string, string> = {
    "parameters.csv": table(
      ["parameter", ...ids],
      paramKeys.map((k) => [k, ...doc.models.map((m) => cellOf(rec(m.parameters)[k]))]),
    ),
    "summary.csv": table(
      ["quantity", ...ids],
      summaryKeys.map((k) => [k, ...doc.models.map((m) => rec(m.summary)[k])]),
    ),
    "redshifts.csv": table(
      ["model", ...rowKeys],
      doc.models.flatMap((m) => m.redshifts.map((r) => [m.id, ...rowKeys.map((k) => rec(r)[k])])),
    ),
    "differences.csv": table(
      ["model", "quantity", "absolute", "relative"],
      Object.entries(doc.differences).flatMap(([id, d]) =>
        Object.entries(d.summary).map(([k, v]) => [id, k, v.absolute, v.relative]),
      ),
    ),
  };
  const targets = doc.models.flatMap((m) => m.targets.map((t) => ({ model: m.id, ...t })));
  if (targets.length > 0) {
    const keys = Object.keys(targets[0]);
    files["targets.csv"] = table(
      keys,
      targets.map((t) => keys.map((k) => (t as Record<string, unknown>)[k])),
    );
  }
  const surveys = doc.models.flatMap((m) => m.surveys.map((s) => ({ model: m.id, ...s })));
  if (surveys.length > 0) {
    const keys = Object.keys(surveys[0]);
    files["surveys.csv"] = table(
      keys,
      surveys.map((s) => keys.map((k) => (s as Record<string, unknown>)[k])),
    );
  }
  const spreads = doc.models.filter((m) => "spread" in m && m.spread);
  if (spreads.length > 0 && "draws" in doc && doc.draws) {
    const pct = doc.draws.percentiles.map((p) => `p${String(p).replace(".", "_")}`);
    const header = ["model", "table", "row", "quantity", "value", ...pct, ...pct.map((p) => `mc_error_${p}`)];
    const line = (id: string, where: string, row: unknown, key: string, value: unknown, band: unknown) => {
      const b = band as { q: number[]; mc_error: number[] } | null | undefined;
      return [id, where, row, key, value, ...(b ? [...b.q, ...b.mc_error] : pct.flatMap(() => [null, null]))];
    };
    const body: unknown[][] = [];
    for (const m of spreads) {
      const sp = (m as { spread: NonNullable<Extract<typeof m, { spread?: unknown }>["spread"]> }).spread;
      for (const [k, b] of Object.entries(sp.summary)) body.push(line(m.id, "summary", "", k, rec(m.summary)[k], b));
      sp.redshifts.forEach((bands, i) => {
        for (const [k, b] of Object.entries(bands))
          body.push(line(m.id, "redshifts", m.redshifts[i].z, k, rec(m.redshifts[i])[k], b));
      });
      sp.targets.forEach((bands, i) => {
        for (const [k, b] of Object.entries(bands))
          body.push(line(m.id, "targets", m.targets[i].name, k, rec(m.targets[i])[k], b));
      });
      sp.surveys.forEach((bands, i) => {
        for (const [k, b] of Object.entries(bands))
          body.push(line(m.id, "surveys", m.surveys[i].name, k, rec(m.surveys[i])[k], b));
      });
      // The chart grid's bands stay in tables.json, like the grid itself (spread.grid).
    }
    files["spread.csv"] = table(header, body);
  }
  return files;
}
