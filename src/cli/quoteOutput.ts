import type { StoredModelTables } from "../contract/tablesDocument.js";
import { unitText } from "../presentation/formatNumber.js";
import { numberCell } from "../presentation/presentTables.js";
import { displayUnit, presentationNotes, unitNotes, type PresentedDocument } from "../presentation/presentDocument.js";
import type { PresentationTable } from "../presentation/presentTables.js";
import type { ExportProvenance } from "../exports/exportProvenance.js";
import type { QuoteQuantity } from "./quoteQuantities.js";
import { targetName, type Placement } from "./quoteRequest.js";

/** Where each number of a quote comes from, per model: a redshift row, a target row or today's summary. */
export interface QuoteSources {
  /** The tables document of the equivalent scenario, as presented (in h units when the scenario asks for them). */
  presented: PresentedDocument;
  /** For placements that are not redshifts: each model's row at the redshift its target was solved to (or null), presented alike. */
  solvedRows: Map<string, (StoredModelTables["redshifts"][number] | null)[]>;
}

export interface QuoteSection {
  heading: string;
  /** unit: the quantity's unit as presented (h^-1 Mpc for Mpc in h units). */
  rows: { quantity: QuoteQuantity; unit: string; values: (number | null)[] }[];
  /** Per model, why a placement has no numbers there (not reached), or null. */
  notes: (string | null)[];
}

/**
 * The quote as sections of rows (quantities) by columns (models): one section per placement, and "today" for summary
 * quantities. Numbers are read from the tables document, never recomputed here.
 */
export function quoteSections(
  src: QuoteSources,
  modelIds: string[],
  placements: Placement[],
  quantities: QuoteQuantity[],
  everyPlacementIsATarget: boolean,
): QuoteSection[] {
  const models = modelIds.map((id) => src.presented.doc.models.find((m) => m.id === id)!);
  const unit = (q: QuoteQuantity) => displayUnit(src.presented, q.unit);
  const sections: QuoteSection[] = [];
  const perPlacement = quantities.filter((q) => q.row || q.target);
  let zIndex = 0;
  let targetIndex = 0;
  placements.forEach((p, pi) => {
    const isZ = p.by === "z";
    const rowAt = isZ ? zIndex++ : -1;
    const targetAt = !isZ || everyPlacementIsATarget ? targetIndex++ : -1;
    // In a section headed "z = 2" a row of the redshift would only repeat the heading.
    const rows = perPlacement
      .filter((q) => !(isZ && q.short === "z"))
      .map((q) => ({
        quantity: q,
        unit: unit(q),
        values: models.map((m) => {
          const target = targetAt >= 0 ? (m.targets[targetAt] as unknown as Record<string, number | null>) : null;
          if (q.target && target && (!isZ || !q.row)) return target[q.target] ?? null;
          if (!q.row) return null;
          const row = (isZ ? m.redshifts[rowAt] : (src.solvedRows.get(m.id)?.[pi] ?? null)) as unknown as Record<
            string,
            number | null
          > | null;
          return row ? (row[q.row] ?? null) : null;
        }),
      }));
    const notes = models.map((m) => (targetAt >= 0 ? (m.targets[targetAt]?.note ?? null) : null));
    sections.push({ heading: targetName(p), rows, notes });
  });
  const today = quantities.filter((q) => q.summary);
  if (today.length > 0)
    sections.push({
      heading: "today",
      rows: today.map((q) => ({
        quantity: q,
        unit: unit(q),
        values: models.map(
          (m) => ((m.summary as unknown as Record<string, number | null>)[q.summary!] as number | null) ?? null,
        ),
      })),
      notes: models.map(() => null),
    });
  return sections;
}

/** The quote as one export table (rows "z = 2: D_A", columns the models), for the CSV, JSON, Markdown and LaTeX writers. */
export function quoteTable(
  sections: QuoteSection[],
  columns: { id: string; label: string }[],
  presented: PresentedDocument,
): PresentationTable {
  return {
    id: "quote",
    title: "Quick quote",
    anchor: "quote",
    spans: null,
    stub: "Quantity",
    columns: columns.map((c) => ({ label: c.label, unit: "" })),
    rows: sections.flatMap((s) =>
      s.rows.map((r) => ({
        label: `${s.heading}: ${r.quantity.label}`,
        unit: r.unit,
        cells: r.values.map(numberCell),
      })),
    ),
    notes: presentationNotes(presented),
  };
}

/**
 * An aligned terminal table: a heading line per placement, then one line per quantity with its unit and each
 * model's value at the digits the pages print; notes (a placement a model cannot reach) follow the section.
 */
export function quoteTerminal(
  sections: QuoteSection[],
  columns: { id: string; label: string; cites?: string[] }[],
  provenance: ExportProvenance,
  presented: PresentedDocument,
): string {
  const nameWidth = Math.max(8, ...sections.flatMap((s) => s.rows.map((r) => r.quantity.short.length)));
  const unitWidth = Math.max(4, ...sections.flatMap((s) => s.rows.map((r) => unitText(r.unit).length)));
  const texts = sections.map((s) => s.rows.map((r) => r.values.map((v) => numberCell(v).text)));
  const widths = columns.map((c, ci) =>
    Math.max(c.id.length, ...texts.flatMap((s) => s.map((r) => [...r[ci]].length)), 8),
  );
  const pad = (s: string, w: number) => s + " ".repeat(Math.max(0, w - [...s].length));
  const left = (s: string, w: number) => " ".repeat(Math.max(0, w - [...s].length)) + s;
  const lines: string[] = [];
  lines.push(`${pad("", nameWidth + unitWidth + 5)}${columns.map((c, i) => left(c.id, widths[i])).join("  ")}`);
  sections.forEach((s, si) => {
    lines.push(s.heading);
    s.rows.forEach((r, ri) => {
      const unit = unitText(r.unit);
      lines.push(
        `  ${pad(r.quantity.short, nameWidth)} ${pad(unit ? `[${unit}]` : "", unitWidth + 2)}${texts[si][ri].map((t, i) => left(t, widths[i])).join("  ")}`,
      );
    });
    s.notes.forEach((n, i) => {
      if (n) lines.push(`  note (${columns[i].id}): ${n}`);
    });
  });
  const legend = columns.filter((c) => c.label !== c.id).map((c) => `  ${c.id}: ${c.label}`);
  if (legend.length > 0) lines.push("models:", ...legend);
  const cited = columns.flatMap((c) => (c.cites ?? []).map((line) => `  ${c.id}: ${line}`));
  if (cited.length > 0) lines.push("published sets:", ...cited);
  // Warnings go to standard error (as check prints them); how the numbers are shown stays with them.
  for (const n of unitNotes(presented)) lines.push(`note: ${n}`);
  lines.push(
    `${provenance.tool} ${provenance.tool_version}, engine ${provenance.engine_version}; inputs SHA-256 ${provenance.inputs_sha256.slice(0, 12)}; FLRW background and linear growth only (see the README's cautions)`,
  );
  return `${lines.join("\n")}\n`;
}
