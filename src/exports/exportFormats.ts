import escapeHtmlText from "escape-html";
import { csvRows } from "../contract/tablesCsv.js";
import { latexPackages } from "../presentation/latexPackages.js";
import { type NumberParts, unitText } from "../presentation/formatNumber.js";
import type { PresentationCell, PresentationTable } from "../presentation/presentTables.js";
import { provenanceLine, versionLabel, type ExportProvenance } from "./exportProvenance.js";
import { csvText, latexText, oneLine } from "../common/userText.js";

export { CSV_QUOTED } from "../contract/tablesCsv.js";

export const EXPORT_FORMAT = "cosmoledger.export/1";

export { unitText };
const labelWithUnit = (label: string, unit: string) => (unit ? `${label} [${unitText(unit)}]` : label);
/** Which span each column sits under (null when the table has no spans). */
const spanOf = (t: PresentationTable, column: number) => {
  if (!t.spans) return null;
  let end = 0;
  for (const s of t.spans) {
    end += s.columns;
    if (column < end) return s;
  }
  return null;
};
/**
 * The header as one row of cells: the stub, then each column; under several spans a column is named after its
 * quantity too ("Comoving distance D_C [Mpc]: Flat"), since CSV and Markdown have a single header row.
 */
const header = (t: PresentationTable) => [
  t.stub,
  ...t.columns.map((c, i) => {
    const own = labelWithUnit(c.label, c.unit);
    const span = t.spans && t.spans.length > 1 ? spanOf(t, i) : null;
    return span ? `${labelWithUnit(span.label, span.unit)}: ${own}` : own;
  }),
];
/** The table's heading: its title, with the quantity's unit for a table of one quantity. */
const heading = (t: PresentationTable) =>
  t.spans?.length === 1 && t.spans[0].unit ? `${t.title} [${unitText(t.spans[0].unit)}]` : t.title;

/** Columns that hold a 68 % interval in some row (their CSV gets median and interval columns after the rest). */
const intervalColumns = (t: PresentationTable) =>
  t.columns.map((_, i) => i).filter((i) => t.rows.some((r) => r.cells[i]?.interval !== undefined));
/** A cell as text with its interval: "13.7958 (68 %: 13.797 +0.023 −0.023)". */
const withInterval = (c: PresentationCell, text: string) => (c.interval ? `${text} (68 %: ${c.interval.text})` : text);

/**
 * RFC 4180 CSV (csv-stringify) at full precision, empty cell = null; provenance in leading "#" comment lines.
 * Any field holding "#" is quoted, so that readers that treat "#" as a comment anywhere on a line keep it.
 */
export function tableCsv(t: PresentationTable, p: ExportProvenance): string {
  const comments = [
    `# ${oneLine(heading(t))}`,
    `# source: ${oneLine(provenanceLine(p))}`,
    ...t.notes.map((n) => `# note: ${oneLine(n)}`),
    "# numbers at full precision; an empty cell is an infinite or undefined quantity",
  ];
  // Numbers stay numbers; text (labels, names, notes) is neutralised against formula injection.
  const value = (c: PresentationCell) =>
    c.value === null ? "" : c.kind === "number" ? String(c.value) : csvText(String(c.value));
  // A model with a spread adds, per column, the median and the 16th and 84th percentiles of its draws.
  const banded = intervalColumns(t);
  const head = header(t);
  const extra = banded.flatMap((i) => [
    `${head[i + 1]}: median of draws`,
    `${head[i + 1]}: 16th percentile`,
    `${head[i + 1]}: 84th percentile`,
  ]);
  const bands = (r: PresentationTable["rows"][number]) =>
    banded.flatMap((i) => {
      const iv = r.cells[i]?.interval;
      return iv ? [String(iv.median), String(iv.p16), String(iv.p84)] : ["", "", ""];
    });
  const rows = [
    [...head, ...extra].map(csvText),
    ...t.rows.map((r) => [csvText(labelWithUnit(r.label, r.unit)), ...r.cells.map(value), ...bands(r)]),
  ];
  const body = csvRows(rows);
  return `${comments.join("\r\n")}\r\n${body}`;
}

/** JSON: provenance, then the table with raw values (full precision) and the page's text for every cell. */
export function tableJson(t: PresentationTable, p: ExportProvenance): string {
  return `${JSON.stringify(
    {
      format: EXPORT_FORMAT,
      provenance: { ...p, version_label: versionLabel(p), line: provenanceLine(p) },
      table: {
        id: t.id,
        title: t.title,
        spans: t.spans,
        stub: t.stub,
        columns: t.columns,
        notes: t.notes,
        rows: t.rows.map((r) => ({
          label: r.label,
          unit: r.unit,
          values: r.cells.map((c) => c.value),
          text: r.cells.map((c) => c.text),
          ...(r.cells.some((c) => c.interval)
            ? {
                intervals_68: r.cells.map((c) =>
                  c.interval
                    ? {
                        median: c.interval.median,
                        p16: c.interval.p16,
                        p84: c.interval.p84,
                        text: c.interval.text,
                        fixed: c.interval.fixed,
                      }
                    : null,
                ),
              }
            : {}),
        })),
      },
    },
    null,
    2,
  )}\n`;
}

/** Characters that Markdown (CommonMark with GFM tables) could read as markup; each is backslash-escaped. */
const MARKDOWN_SPECIAL = /[\\`*_[\]<>|~&!#$^{}]/g;
export const escapeMarkdown = (s: string) => oneLine(s).replace(MARKDOWN_SPECIAL, (c) => `\\${c}`);

/** A GFM pipe table as wiki engines read it, cells as the page prints them, with a title line and a source line. */
export function tableMarkdown(t: PresentationTable, p: ExportProvenance): string {
  const row = (cells: string[]) => `| ${cells.map(escapeMarkdown).join(" | ")} |`;
  const align = `| ${["---", ...t.columns.map(() => "---:")].join(" | ")} |`;
  const lines = [
    `**${escapeMarkdown(heading(t))}**`,
    "",
    row(header(t)),
    align,
    ...t.rows.map((r) => row([labelWithUnit(r.label, r.unit), ...r.cells.map((c) => withInterval(c, c.text))])),
    "",
    `Source: ${escapeMarkdown(provenanceLine(p))}`,
    ...t.notes.flatMap((n) => ["", `Note: ${escapeMarkdown(n)}`]),
    "",
  ];
  return lines.join("\n");
}

/**
 * Plain text for pasting into an e-mail or a document: aligned columns (spaces), the printed digits and units, a
 * title line and a source line. One line per row; user text is kept on one line.
 */
export function tablePlainText(t: PresentationTable, p: ExportProvenance): string {
  const head = header(t).map(oneLine);
  const body = t.rows.map((r) => [
    oneLine(labelWithUnit(r.label, r.unit)),
    ...r.cells.map((c) => oneLine(withInterval(c, c.text || "—"))),
  ]);
  const widths = head.map((h, i) => Math.max([...h].length, ...body.map((r) => [...r[i]].length)));
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i])))
      .join("  ")
      .trimEnd();
  return [
    oneLine(heading(t)),
    "",
    line(head),
    ...body.map(line),
    "",
    `Source: ${oneLine(provenanceLine(p))}`,
    ...t.notes.map((n) => `Note: ${oneLine(n)}`),
    "",
  ].join("\n");
}

/** Text for LaTeX (userText.ts): compiles with pdflatex and never reaches TeX as a command. */
export const escapeLatex = latexText;

/** A number in LaTeX with the digits the page shows: 0.306, $-0.015$, $7.76720\times10^{-5}$; no number is ---. */
export function latexNumber(p: NumberParts | null): string {
  if (p === null) return "---";
  if (p.exponent === null) return p.negative ? `$-${p.mantissa}$` : p.mantissa;
  return `$${p.negative ? "-" : ""}${p.mantissa}\\times10^{${p.exponent}}$`;
}
const latexUnit = (u: string) => escapeLatex(u).replace(/\\textasciicircum\{\}(-?\d)/g, "\\textsuperscript{$1}");
const latexLabel = (label: string, unit: string) =>
  unit ? `${escapeLatex(label)} [${latexUnit(unit)}]` : escapeLatex(label);

/** A tabular with booktabs rules (\usepackage{booktabs}); units in the header; provenance in % comments above it. */
export function tableLatex(t: PresentationTable, p: ExportProvenance): string {
  const parts = latexParts(t);
  const lines = [
    // A comment ends only at a line break, and oneLine leaves none (TeX skips the rest of a comment line unread).
    `% ${oneLine(heading(t))}`,
    `% source: ${oneLine(provenanceLine(p))}`,
    ...t.notes.map((n) => `% note: ${oneLine(n)}`),
    // Every package the fragment needs, and no other: booktabs, and amsmath when a model's label uses \text.
    `% needs ${latexPackages(t.columns.map((c) => c.tex))
      .map((name) => `\\usepackage{${name}}`)
      .join(" ")}`,
    ...(parts.length > 1
      ? [
          `% in ${parts.length} tabulars of at most ${LATEX_COLUMNS} value columns (${LATEX_COLUMNS_WITH_INTERVALS} with 68 % intervals), so that each fits a landscape A4 page in \\footnotesize`,
        ]
      : []),
  ];
  parts.forEach((part, k) => {
    if (k > 0) lines.push("", "\\medskip", "");
    lines.push(...latexTabular(part));
  });
  lines.push("");
  return lines.join("\n");
}

/** Value columns one tabular holds at most: about what fits a landscape A4 text width in \footnotesize. */
const LATEX_COLUMNS = 8;
/** The same with 68 % intervals beside the values (each cell about twice as wide). */
const LATEX_COLUMNS_WITH_INTERVALS = 4;

/**
 * A wide table (a whole group: several quantities times the models) as parts that each fit a page: whole quantity
 * blocks together as far as they fit, a block wider than a part split by models. A table that fits is one part.
 */
function latexParts(t: PresentationTable): PresentationTable[] {
  const banded = t.rows.some((r) => r.cells.some((c) => c.interval));
  const most = banded ? LATEX_COLUMNS_WITH_INTERVALS : LATEX_COLUMNS;
  if (t.columns.length <= most) return [t];
  const slice = (from: number, to: number, spans: PresentationTable["spans"]): PresentationTable => ({
    ...t,
    spans,
    columns: t.columns.slice(from, to),
    rows: t.rows.map((r) => ({ ...r, cells: r.cells.slice(from, to) })),
  });
  const parts: PresentationTable[] = [];
  if (!t.spans) {
    for (let from = 0; from < t.columns.length; from += most) parts.push(slice(from, from + most, null));
    return parts;
  }
  let from = 0;
  let group: { label: string; unit: string; columns: number }[] = [];
  let width = 0;
  const flush = () => {
    if (group.length > 0) parts.push(slice(from, from + width, group));
    from += width;
    group = [];
    width = 0;
  };
  for (const s of t.spans) {
    if (s.columns > most) {
      flush();
      for (let k = 0; k < s.columns; k += most) {
        const n = Math.min(most, s.columns - k);
        parts.push(slice(from + k, from + k + n, [{ ...s, columns: n }]));
      }
      from += s.columns;
      continue;
    }
    if (width + s.columns > most) flush();
    group.push(s);
    width += s.columns;
  }
  flush();
  return parts;
}

/** One booktabs tabular of a (part of a) table: spans, column heads, rows. */
function latexTabular(t: PresentationTable): string[] {
  const n = t.columns.length;
  // A spread adds the median and its 68 % interval as X^{+a}_{-b} after the value.
  const cell = (c: PresentationCell) =>
    (c.kind === "number" ? latexNumber(c.parts) : wrapped(escapeLatex(c.text), c.text, 16, "2.2cm")) +
    (c.interval ? ` ($${c.interval.tex.replace(/\u2212/g, "-")}$)` : "");
  const lines = [`\\begin{tabular}{l${"r".repeat(n)}}`, "\\toprule"];
  if (t.spans) {
    // One \multicolumn per quantity over its model columns, each underlined by its own \cmidrule.
    let first = 2;
    const rules: string[] = [];
    const cells = t.spans.map((s) => {
      rules.push(`\\cmidrule(lr){${first}-${first + s.columns - 1}}`);
      first += s.columns;
      return `\\multicolumn{${s.columns}}{c}{${latexLabel(s.label, s.unit)}}`;
    });
    lines.push(` & ${cells.join(" & ")} \\\\`, rules.join(" "));
  }
  lines.push(
    // A model's label_tex was checked to hold mathematics only (src/scenario/labelTex.ts); set in math mode.
    `${escapeLatex(t.stub)} & ${t.columns.map((c) => (c.tex ? `$${c.tex}$` : wrapped(latexLabel(c.label, c.unit), c.label + c.unit, 12, "2cm"))).join(" & ")} \\\\`,
    "\\midrule",
  );
  for (const r of t.rows)
    lines.push(
      `${wrapped(latexLabel(r.label, r.unit), r.label + r.unit, 30, "3.6cm")} & ${r.cells.map(cell).join(" & ")} \\\\`,
    );
  lines.push("\\bottomrule", "\\end{tabular}");
  return lines;
}

/**
 * Long text in a cell (a note, a method, a long row label) wraps inside a box of the given width instead of widening
 * the whole column past the page (plain LaTeX: \parbox, ragged right).
 */
const wrapped = (tex: string, plain: string, longest: number, width: string) =>
  plain.length > longest ? `\\parbox[t]{${width}}{\\raggedright ${tex}}` : tex;

/** Text for HTML content and attribute values (escape-html: & < > " '). */
export const escapeHtml = (s: string) => escapeHtmlText(s);

/** A self-contained HTML fragment for a wiki: one figure with the table, inline styles only, the source as its caption. */
export function tableHtml(t: PresentationTable, p: ExportProvenance): string {
  const th = "padding:2px 8px;border-bottom:1px solid #888;text-align:left";
  const td = "padding:2px 8px;text-align:right;font-variant-numeric:tabular-nums";
  const out = [
    // A wide table scrolls inside its own figure on a narrow screen, never the page that holds it.
    `<figure class="cosmoledger-export" style="margin:0;max-width:100%;overflow-x:auto" data-scenario="${escapeHtml(p.scenario_id)}" data-version="${escapeHtml(versionLabel(p))}" data-table="${escapeHtml(t.id)}">`,
    `<table style="border-collapse:collapse">`,
    `<caption style="text-align:left;font-weight:bold">${escapeHtml(heading(t))}</caption>`,
    "<thead>",
  ];
  if (t.spans)
    out.push(
      `<tr><th></th>${t.spans.map((s) => `<th scope="colgroup" colspan="${s.columns}" style="${th};text-align:center">${escapeHtml(labelWithUnit(s.label, s.unit))}</th>`).join("")}</tr>`,
    );
  const own = [t.stub, ...t.columns.map((c) => labelWithUnit(c.label, c.unit))];
  out.push(
    `<tr>${own.map((h) => `<th scope="col" style="${th}">${escapeHtml(h)}</th>`).join("")}</tr>`,
    "</thead>",
    "<tbody>",
  );
  for (const r of t.rows) {
    out.push(
      `<tr><th scope="row" style="${th};border-bottom:0">${escapeHtml(labelWithUnit(r.label, r.unit))}</th>${r.cells.map((c) => `<td style="${c.kind === "number" ? td : "padding:2px 8px"}">${escapeHtml(c.text)}${c.interval ? `<br><small>68 %: ${escapeHtml(c.interval.text)}</small>` : ""}</td>`).join("")}</tr>`,
    );
  }
  out.push(
    "</tbody>",
    "</table>",
    `<figcaption style="font-size:smaller">Source: ${escapeHtml(provenanceLine(p))}${t.notes.map((n) => `<br>Note: ${escapeHtml(n)}`).join("")}</figcaption>`,
    "</figure>",
    "",
  );
  return out.join("\n");
}
