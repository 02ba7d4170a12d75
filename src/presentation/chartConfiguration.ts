import { CHART_STYLE, MARKERS_PER_CURVE } from "./chartStyle.js";
import type { ChartData } from "./chartData.js";

/** What a reader chose to see of a chart: which series, log or linear axes, values or the ratio to the baseline. */
export interface ChartView {
  key: string;
  logX: boolean;
  /** Ignored for a ratio, which is always drawn on a linear axis. */
  logY: boolean;
  ratio: boolean;
}

export interface ChartPoint {
  x: number;
  y: number | null;
}

/** One Chart.js line dataset: a model's curve, or one edge of its 68 % band (isBand). Plain data, no functions. */
export interface ChartDataset {
  label: string;
  data: ChartPoint[];
  borderColor: string;
  backgroundColor?: string;
  borderDash?: number[];
  borderWidth: number;
  pointStyle?: string;
  pointRadius: number | number[];
  pointBorderWidth?: number;
  spanGaps: false;
  fill: false | "-1";
  isBand?: true;
}

/** The y axis is logarithmic only for values, never for a ratio. */
const logYOf = (view: ChartView) => view.logY && !view.ratio;

/**
 * The curves of every model, then the bands of the models with a spread (the 16th-percentile edge unfilled, the
 * 84th filled down to it), for one view of a chart: dataset i is model i, so legends and markers follow the models.
 * Points outside the plotted range, at z = 0 on a log axis, and at values a log y axis cannot show are left out or
 * made gaps; a ratio divides by the baseline's value at the same redshift. The page and the exported images both
 * draw exactly these datasets.
 */
export function chartDatasets(data: ChartData, view: ChartView, markerRadius = 3.5): ChartDataset[] {
  const baseline = data.models.find((m) => m.id === data.baseline) ?? data.models[0];
  const base = baseline.values[view.key];
  const range = data.xRange;
  const keep = data.z.map((x) => x !== null && (!view.logX || x > 0) && (!range || (x >= range[0] && x <= range[1])));
  const logY = logYOf(view);
  const shown = (y: number | null, j: number): number | null => {
    let v = y;
    if (view.ratio) v = v === null || !base[j] ? null : v / (base[j] as number);
    return logY && !(v !== null && v > 0) ? null : v;
  };
  const points = (ys: (number | null)[]) =>
    data.z.flatMap((x, j) => (keep[j] ? [{ x: x as number, y: shown(ys[j], j) }] : []));
  const colour = (i: number) => CHART_STYLE.colours[i % CHART_STYLE.colours.length];
  const curves: ChartDataset[] = data.models.map((m, i) => {
    const d = points(m.values[view.key]);
    const every = Math.max(1, Math.round(d.length / MARKERS_PER_CURVE));
    return {
      label: m.label,
      data: d,
      borderColor: colour(i),
      backgroundColor: colour(i),
      borderDash: [...CHART_STYLE.dashes[i % CHART_STYLE.dashes.length]],
      borderWidth: 2,
      // Each model's own marker every few points, offset per model so that markers do not sit on each other.
      pointStyle: CHART_STYLE.markers[i % CHART_STYLE.markers.length],
      pointRadius: d.map((_, j) => ((j + i) % every === 0 ? markerRadius : 0)),
      pointBorderWidth: 1.2,
      spanGaps: false,
      fill: false,
    };
  });
  const bands: ChartDataset[] = data.models.flatMap((m, i) => {
    const band = m.bands?.[view.key];
    if (!band) return [];
    // A band edge is a gap wherever either edge cannot be drawn, so that the fill never closes over a gap.
    const lo = points(band.lo);
    const hi = points(band.hi);
    lo.forEach((p, j) => {
      if (p.y === null || hi[j].y === null) p.y = hi[j].y = null;
    });
    const common = {
      borderWidth: 0,
      pointRadius: 0,
      borderColor: "transparent",
      spanGaps: false,
      isBand: true,
    } as const;
    return [
      { ...common, label: `${m.label}: 16th percentile`, data: lo, fill: false },
      { ...common, label: `${m.label}: 84th percentile`, data: hi, backgroundColor: `${colour(i)}33`, fill: "-1" },
    ];
  });
  return [...curves, ...bands];
}

/** The y-axis title of a view: the series with its unit as shown, or the ratio to the baseline. */
export function yAxisTitle(data: ChartData, view: ChartView): string {
  const s = data.series.find((x) => x.key === view.key)!;
  return view.ratio
    ? `${s.label} / baseline (${data.baselineLabel})`
    : s.unitText
      ? `${s.label} [${s.unitText}]`
      : s.label;
}

/** On a log axis only 1, 2 and 5 times a power of ten are labelled, so that labels do not crowd; "" elsewhere. */
export function logTickLabel(value: number): string {
  const m = value / 10 ** Math.floor(Math.log10(value) + 1e-9);
  return [1, 2, 5].some((k) => Math.abs(m - k) < 1e-6) ? String(Number(value.toPrecision(3))) : "";
}

/** Legend entries for the models only (never the bands): a short line in each model's colour and dash pattern. */
export function legendEntries(datasets: readonly { label?: string; isBand?: boolean }[]) {
  return datasets
    .filter((d) => !d.isBand)
    .map((d, i) => ({
      text: String(d.label),
      datasetIndex: i,
      pointStyle: "line" as const,
      fillStyle: CHART_STYLE.colours[i % CHART_STYLE.colours.length],
      strokeStyle: CHART_STYLE.colours[i % CHART_STYLE.colours.length],
      lineWidth: 2,
      lineDash: [...CHART_STYLE.dashes[i % CHART_STYLE.dashes.length]],
      hidden: false,
    }));
}

/** Everything one view of a chart draws: the view, the plotted redshift range, the y-axis title and the datasets. */
export interface ChartFrame {
  view: ChartView;
  xRange: [number, number] | null;
  yTitle: string;
  datasets: ChartDataset[];
}

/** One view of a chart drawn from the presentation's chart data. */
export const chartFrame = (data: ChartData, view: ChartView, markerRadius = 3.5): ChartFrame => ({
  view,
  xRange: data.xRange,
  yTitle: yAxisTitle(data, view),
  datasets: chartDatasets(data, view, markerRadius),
});

/**
 * The Chart.js configuration of one view, shared by the page (src/site/browser/charts.ts) and the exported images
 * (src/exports/chartImage.ts): datasets, axis types, range and titles, log-axis tick labels, a legend of the models
 * and tooltips that skip the bands. Each renderer adds only what its medium needs (fonts and size for an image,
 * responsiveness and interaction for the page).
 */
export function chartConfiguration(frame: ChartFrame) {
  const { view, datasets } = frame;
  const data = { xRange: frame.xRange };
  return {
    type: "line" as const,
    data: { datasets },
    options: {
      parsing: false as const,
      normalized: true,
      animation: false as const,
      scales: {
        x: {
          type: view.logX ? ("logarithmic" as const) : ("linear" as const),
          // The scenario's own redshift range when it left the grid to its default (chartStyle.ts decides).
          min: data.xRange ? data.xRange[0] : undefined,
          max: data.xRange ? data.xRange[1] : undefined,
          title: { display: true, text: "redshift z" },
          ticks: {
            maxRotation: 0,
            ...(view.logX
              ? { autoSkip: false, callback: (value: number | string) => logTickLabel(Number(value)) }
              : {}),
          },
        },
        y: {
          type: logYOf(view) ? ("logarithmic" as const) : ("linear" as const),
          title: { display: true, text: frame.yTitle },
          // A log y axis is labelled at 1, 2 and 5 times a power of ten only (labels like 8,000 beside 10,000 crowd).
          ...(logYOf(view)
            ? { ticks: { autoSkip: false, callback: (value: number | string) => logTickLabel(Number(value)) } }
            : {}),
        },
      },
      plugins: {
        tooltip: { filter: (item: { dataset: { isBand?: boolean } }) => !item.dataset.isBand },
        legend: {
          position: "bottom" as const,
          labels: {
            usePointStyle: true,
            generateLabels: (chart: { data: { datasets: { label?: string; isBand?: boolean }[] } }) =>
              legendEntries(chart.data.datasets),
          },
        },
      },
    },
  };
}

/** Where Chart.js drew each legend item (its own record, not in its type declarations). */
type LegendBox = { left: number; top: number; height: number };

/**
 * A plugin that draws each model's marker on the middle of its legend line, so that the legend shows both, as the
 * curves do (eight models stay apart in greyscale). `drawPoint` is Chart.js's helper of the renderer's copy.
 */
export function legendMarkers(
  drawPoint: (ctx: CanvasRenderingContext2D, options: object, x: number, y: number) => void,
  size: { radius: number; borderWidth: number; offset: number },
) {
  return {
    id: "legend-markers",
    afterDraw: (chart: { legend?: unknown; ctx: CanvasRenderingContext2D }) => {
      const boxes = (chart.legend as { legendHitBoxes?: LegendBox[] } | undefined)?.legendHitBoxes ?? [];
      const ctx = chart.ctx;
      boxes.forEach((box, i) => {
        ctx.save();
        ctx.setLineDash([]);
        ctx.strokeStyle = CHART_STYLE.colours[i % CHART_STYLE.colours.length];
        ctx.fillStyle = CHART_STYLE.colours[i % CHART_STYLE.colours.length];
        ctx.lineWidth = 1;
        drawPoint(
          ctx,
          {
            pointStyle: CHART_STYLE.markers[i % CHART_STYLE.markers.length],
            radius: size.radius,
            borderWidth: size.borderWidth,
            rotation: 0,
          },
          box.left + size.offset,
          box.top + box.height / 2,
        );
        ctx.restore();
      });
    },
  };
}
