import type { StoredTablesDocument } from "../contract/tablesDocument.js";
import { catalogFor } from "../contract/quantityCatalog.js";

/** Plot points are drawn, not read: six significant figures are more than a screen resolves. */
const round = (x: number | null) => (x === null ? null : Number(x.toPrecision(6)));

/** The data the page's charts draw, taken from the grid of the tables document and rounded for size. */
export function chartPayload(doc: StoredTablesDocument) {
  const z = doc.models[0].grid.z.map(round);
  const { CHART_SERIES } = catalogFor(doc); // only the series this document's format holds
  return {
    baseline: doc.scenario.baseline,
    z,
    series: CHART_SERIES,
    models: doc.models.map((m) => ({
      id: m.id,
      label: m.label,
      values: Object.fromEntries(
        CHART_SERIES.map((s) => [s.key, (m.grid as unknown as Record<string, (number | null)[]>)[s.key].map(round)]),
      ),
    })),
  };
}

/** JSON safe to place inside a <script type="application/json"> element: <, > and & are escaped. */
export function jsonForScriptElement(value: unknown): string {
  return JSON.stringify(value)
    .replace(/</g, "\\u003c")
    .replace(/>/g, "\\u003e")
    .replace(/&/g, "\\u0026")
    .replace(/\u2028/g, "\\u2028")
    .replace(/\u2029/g, "\\u2029");
}

/** The small overview chart of each scenario on the index: D_L against z, at most about 60 grid points. */
export function indexChartPayload(docs: StoredTablesDocument[]) {
  return docs.map((doc) => {
    const n = doc.models[0].grid.z.length;
    const step = Math.max(1, Math.ceil(n / 60));
    const pick = (xs: (number | null)[]) => xs.filter((_, i) => i % step === 0 || i === n - 1).map(round);
    return {
      id: doc.scenario.id,
      z: pick(doc.models[0].grid.z),
      models: doc.models.map((m) => ({ label: m.label, values: pick(m.grid.luminosity_distance_Mpc) })),
    };
  });
}
