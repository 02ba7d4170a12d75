import { catalogFor, hasEarlyUniverse } from "../contract/quantityCatalog.js";
import { P16, P84 } from "./formatInterval.js";
import { unitText } from "./formatNumber.js";
import { plottedRedshiftRange, spansMoreThanADecade } from "./chartStyle.js";
import { displayUnit, type PresentedDocument } from "./presentDocument.js";

/** One plotted quantity: its label and unit as shown, and whether its y axis starts logarithmic. */
export interface ChartSeries {
  key: string;
  label: string;
  unit: string;
  unitText: string;
  logY: boolean;
}

/**
 * What every chart of a page plots, for the page's canvas (pageChartData, rounded for size) and for the
 * exported images (src/exports/chartImage.ts) alike: the grid redshifts, each series in display units, each model's
 * curve and, for a model with a spread, its 68 % band (16th and 84th percentiles of its draws, in the same units as
 * its curve). Built once from the presented document; neither renderer converts or picks a value.
 */
export interface ChartData {
  baseline: string;
  baselineLabel: string;
  z: (number | null)[];
  /** The plotted redshift range when the scenario left its grid to the default; null for the whole grid. */
  xRange: [number, number] | null;
  /** The charts of the page (an id, a title and the series it offers), bao only where a model has baryons. */
  charts: { id: string; title: string; keys: string[] }[];
  series: ChartSeries[];
  models: {
    id: string;
    label: string;
    values: Record<string, (number | null)[]>;
    bands?: Record<string, { lo: (number | null)[]; hi: (number | null)[] }>;
  }[];
}

export function chartData(p: PresentedDocument): ChartData {
  const doc = p.doc;
  const { CHARTS, CHART_SERIES } = catalogFor(doc, p.hUnits); // only the series this document's format holds
  const z = doc.models[0].grid.z;
  const xRange = plottedRedshiftRange(doc);
  const column = (m: (typeof doc.models)[number], key: string) =>
    (m.grid as unknown as Record<string, (number | null)[]>)[key];
  const baseline = doc.models.find((m) => m.id === doc.scenario.baseline) ?? doc.models[0];
  const early = hasEarlyUniverse(doc);
  return {
    baseline: baseline.id,
    baselineLabel: baseline.label,
    z,
    xRange,
    charts: CHARTS.filter((c) => c.id !== "bao" || early).map((c) => ({ id: c.id, title: c.title, keys: c.keys })),
    series: CHART_SERIES.map((s) => ({
      key: s.key,
      label: s.label,
      unit: s.unit,
      unitText: unitText(s.unit),
      logY: spansMoreThanADecade(
        z,
        doc.models.map((m) => column(m, s.key)),
        xRange,
      ),
    })),
    models: doc.models.map((m) => {
      const grid = "spread" in m && m.spread ? m.spread.grid : null;
      const bands = grid
        ? Object.fromEntries(
            CHART_SERIES.flatMap((s) => {
              const g = grid[s.key];
              return g ? [[s.key, { lo: g.q[P16], hi: g.q[P84] }]] : [];
            }),
          )
        : null;
      return {
        id: m.id,
        label: m.label,
        values: Object.fromEntries(CHART_SERIES.map((s) => [s.key, column(m, s.key)])),
        ...(bands ? { bands } : {}),
      };
    }),
  };
}

/** Plot points are drawn, not read: six significant figures are more than a screen resolves. */
const round = (x: number | null) => (x === null ? null : Number(x.toPrecision(6)));
const rounded = (xs: (number | null)[]) => xs.map(round);

/** The data the page's charts draw (the presentation's chart data, the same the exported images draw), rounded for size. */
export function pageChartData(p: PresentedDocument) {
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

/** The small overview chart of each scenario on the index: D_L against z, at most about 60 grid points. */
export function overviewChartData(presented: PresentedDocument[]) {
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
