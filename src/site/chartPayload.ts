import serialize from "serialize-javascript";
import { chartData } from "../presentation/chartData.js";
import { displayUnit, type PresentedDocument } from "../presentation/presentDocument.js";
import { unitText } from "../presentation/formatNumber.js";

/** Plot points are drawn, not read: six significant figures are more than a screen resolves. */
const round = (x: number | null) => (x === null ? null : Number(x.toPrecision(6)));
const rounded = (xs: (number | null)[]) => xs.map(round);

/** The data the page's charts draw (the presentation's chart data, the same the exported images draw), rounded for size. */
export function chartPayload(p: PresentedDocument) {
  const data = chartData(p);
  return {
    ...data,
    z: rounded(data.z),
    models: data.models.map((m) => ({
      ...m,
      values: Object.fromEntries(Object.entries(m.values).map(([k, v]) => [k, rounded(v)])),
      ...(m.bands
        ? {
            bands: Object.fromEntries(
              Object.entries(m.bands).map(([k, b]) => [k, { lo: rounded(b.lo), hi: rounded(b.hi) }]),
            ),
          }
        : {}),
    })),
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
export function indexChartPayload(presented: PresentedDocument[]) {
  return presented.map((p) => {
    const doc = p.doc;
    const n = doc.models[0].grid.z.length;
    const step = Math.max(1, Math.ceil(n / 60));
    const pick = (xs: (number | null)[]) => xs.filter((_, i) => i % step === 0 || i === n - 1).map(round);
    return {
      id: doc.scenario.id,
      z: pick(doc.models[0].grid.z),
      yTitle: `D_L [${unitText(displayUnit(p, "Mpc"))}]`,
      models: doc.models.map((m) => ({ label: m.label, values: pick(m.grid.luminosity_distance_Mpc) })),
    };
  });
}
