import serialize from "serialize-javascript";
import type { StoredTablesDocument } from "../contract/tablesDocument.js";
import { catalogFor } from "../contract/quantityCatalog.js";
import { unitText } from "../contract/formatNumber.js";
import { P16, P84 } from "../contract/formatInterval.js";
import { plottedRedshiftRange, spansMoreThanADecade } from "../exports/chartStyle.js";

/** Plot points are drawn, not read: six significant figures are more than a screen resolves. */
const round = (x: number | null) => (x === null ? null : Number(x.toPrecision(6)));

/** The data the page's charts draw, taken from the grid of the tables document and rounded for size. */
export function chartPayload(doc: StoredTablesDocument) {
  const z = doc.models[0].grid.z.map(round);
  const { CHART_SERIES } = catalogFor(doc); // only the series this document's format holds
  const grid = (m: (typeof doc.models)[number], key: string) =>
    (m.grid as unknown as Record<string, (number | null)[]>)[key];
  const xRange = plottedRedshiftRange(doc);
  return {
    baseline: doc.scenario.baseline,
    z,
    xRange,
    series: CHART_SERIES.map((s) => ({
      ...s,
      unitText: unitText(s.unit),
      logY: spansMoreThanADecade(
        doc.models[0].grid.z,
        doc.models.map((m) => grid(m, s.key)),
        xRange,
      ),
    })),
    models: doc.models.map((m) => {
      // A model with a spread brings its 68 % band (16th and 84th percentiles of its draws) for each series.
      const grid = "spread" in m && m.spread ? m.spread.grid : null;
      const bands = grid
        ? Object.fromEntries(
            CHART_SERIES.flatMap((s) => {
              const g = grid[s.key];
              return g ? [[s.key, { lo: g.q[P16].map(round), hi: g.q[P84].map(round) }]] : [];
            }),
          )
        : null;
      return {
        id: m.id,
        label: m.label,
        values: Object.fromEntries(
          CHART_SERIES.map((s) => [s.key, (m.grid as unknown as Record<string, (number | null)[]>)[s.key].map(round)]),
        ),
        ...(bands ? { bands } : {}),
      };
    }),
  };
}

/**
 * JSON safe to place inside a <script> element: serialize-javascript in JSON mode escapes <, >, / and the line
 * separators U+2028 and U+2029, so no text can close the element or start markup.
 */
export function jsonForScriptElement(value: unknown): string {
  return serialize(value, { isJSON: true });
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
