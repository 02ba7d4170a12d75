// Where a what-if lands on a scenario page: an extra column in each table (the cells the presentation made, with the
// markup of the page's table macro, content/_includes/presentedTable.njk), an extra geometry card and the curve on
// the charts (src/site/browser/charts.ts). Everything placed carries the class what-if-cell, which print hides and
// clearWhatIf removes.
import { keysOfRows } from "../../presentation/rowKeys.js";
import { partsText, unitText } from "../../presentation/formatNumber.js";
import type { GeometryCard, PresentationCell } from "../../presentation/presentTables.js";

type Cell = Pick<PresentationCell, "kind" | "text" | "difference" | "provenance">;
/** The what-if's share of one page table (src/pageEngine/whatIfEngine.ts, WhatIfTable). */
export interface WhatIfPart {
  columns: { label: string; unit: string }[];
  rows: { key: string; cells: Cell[] }[];
}

const curve = (m: unknown) =>
  (window as unknown as { cosmoledgerWhatIfCurve?: (m: unknown) => void }).cosmoledgerWhatIfCurve?.(m);

/** Takes every placed what-if cell, card and curve off the page. */
export function clearWhatIf(): void {
  for (const e of document.querySelectorAll(".what-if-cell")) e.remove();
  curve(null);
}

/** The markup of a cell as the page's table macro writes it. */
function cellElement(c: Cell): HTMLTableCellElement {
  const td = document.createElement("td");
  td.className = `what-if-cell ${c.kind === "number" ? "num" : "note"}`;
  if (c.difference?.notable) td.classList.add("notable");
  if (c.provenance) {
    td.classList.add(`prov-${c.provenance}`);
    td.title = c.provenance;
  }
  td.append(c.text);
  if (c.difference) {
    const d = document.createElement("span");
    d.className = "diff";
    d.textContent = c.difference.text;
    td.append(d);
  }
  return td;
}

function unitSpan(unit: string, text: string): HTMLSpanElement {
  const u = document.createElement("span");
  u.className = "unit";
  u.textContent = text.replace("%", unitText(unit));
  return u;
}

function placeTables(tables: Record<string, WhatIfPart>): void {
  for (const [id, part] of Object.entries(tables)) {
    const table = document.querySelector<HTMLTableElement>(`table[data-table="${CSS.escape(id)}"]`);
    if (!table) continue;
    const headRow = table.tHead?.rows[0];
    if (headRow)
      for (const c of part.columns) {
        const th = document.createElement("th");
        th.scope = "col";
        th.className = "what-if-cell what-if-head";
        th.append(c.label);
        if (c.unit) th.append(unitSpan(c.unit, " [%]"));
        headRow.append(th);
      }
    const byKey = new Map(part.rows.map((r) => [r.key, r.cells]));
    const rows = [...table.querySelectorAll<HTMLTableRowElement>("tbody tr[data-row]")];
    const keys = keysOfRows(rows.map((r) => r.dataset.row!));
    rows.forEach((tr, i) => {
      // A row the what-if's scenario has no row for (shown because another model of the page has that quantity)
      // holds no value of the what-if: blank as the presentation writes it, an em dash in a row of numbers.
      const blank: Cell = tr.querySelector("td.num")
        ? { kind: "number", text: partsText(null) }
        : { kind: "text", text: "" };
      const cells = byKey.get(keys[i]);
      for (let j = 0; j < part.columns.length; j++) tr.append(cellElement(cells?.[j] ?? blank));
    });
  }
}

/** A geometry card as the page writes its own (content/scenario.njk), warnings included. */
function placeCard(card: GeometryCard): void {
  const holder = document.querySelector("[data-geometry-cards]");
  if (!holder) return;
  const div = document.createElement("div");
  div.className = `geo-card geo-${card.geometry} what-if-cell`;
  const h = document.createElement("h3");
  h.textContent = card.label;
  const kind = document.createElement("p");
  kind.className = "geo-kind";
  kind.textContent = `${card.geometry} (${card.kind})`;
  const dl = document.createElement("dl");
  for (const e of card.entries) {
    const row = document.createElement("div");
    const dt = document.createElement("dt");
    dt.append(e.label);
    if (e.unit) dt.append(" ", unitSpan(e.unit, "[%]"));
    const dd = document.createElement("dd");
    dd.textContent = e.text;
    row.append(dt, dd);
    dl.append(row);
  }
  div.append(h, kind, dl);
  if (card.warnings.length > 0) {
    const ul = document.createElement("ul");
    ul.className = "warnings";
    for (const w of card.warnings) {
      const li = document.createElement("li");
      li.textContent = w;
      ul.append(li);
    }
    div.append(ul);
  }
  holder.append(div);
}

/** Places a computed what-if: its columns, its geometry card and its curve. */
export function placeWhatIf(result: {
  tables: Record<string, WhatIfPart>;
  geometry: GeometryCard;
  chart: unknown;
}): void {
  placeTables(result.tables);
  placeCard(result.geometry);
  curve(result.chart);
}
