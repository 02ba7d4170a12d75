import { createRequire } from "node:module";
import { readFileSync } from "node:fs";
import { createCanvas, GlobalFonts, SvgExportFlag, type SKRSContext2D } from "@napi-rs/canvas";
import { Chart, registerables, type ChartConfiguration, type Plugin } from "chart.js";
import * as helpers from "chart.js/helpers";
import type { PresentedDocument } from "../presentation/presentDocument.js";
import { chartData } from "../presentation/chartData.js";
import { formatNumber } from "../presentation/formatNumber.js";
import { escapeHtml, unitText } from "./exportFormats.js";
import { provenanceLine, type ExportProvenance } from "./exportProvenance.js";
import { withPngResolution, withPngText } from "./pngText.js";
import { CHART_STYLE, MARKERS_PER_CURVE } from "../presentation/chartStyle.js";

Chart.register(...registerables);

/** The pages' palette and line patterns (chartStyle.ts), so an exported chart looks like the page's. */
const COLOURS: string[] = [...CHART_STYLE.colours];
const DASHES = CHART_STYLE.dashes.map((d) => [...d]);
const MARKERS: string[] = [...CHART_STYLE.markers];
const FONT = "cosmoledger DejaVu Sans";
const INK = CHART_STYLE.ink;

/** Chart size in CSS pixels; PNGs are drawn at 3x (1800 x 1020 px: 6 x 3.4 inches at 300 dpi), SVG at 1x (vector). */
export const CHART_WIDTH = 600;
export const CHART_HEIGHT = 340;
export const PNG_SCALE = 3;

let fontReady = false;
/** DejaVu Sans from its npm package, so that images are the same on every machine, with or without system fonts. */
function registerFont(): void {
  if (fontReady) return;
  const require = createRequire(import.meta.url);
  for (const file of ["dejavu-sans-latin-400-normal.woff", "dejavu-sans-latin-700-normal.woff"]) {
    GlobalFonts.register(readFileSync(require.resolve(`@fontsource/dejavu-sans/files/${file}`)), FONT);
  }
  fontReady = true;
}

export interface ChartSpec {
  id: string;
  key: string;
  /** The values themselves, or each model divided by the baseline (the page's "ratio to baseline" view). */
  variant: "values" | "ratio";
  title: string;
  yLabel: string;
  alt: string;
  log: boolean;
  /** Logarithmic y axis: the quantity spans more than a decade over the plotted range (never for a ratio). */
  logY: boolean;
  /** The plotted redshift range when the scenario left its grid to the default; null for the whole grid. */
  xRange: [number, number] | null;
  datasets: { label: string; points: { x: number; y: number | null }[] }[];
  /** The 68 % bands of models with a spread (model: its index in datasets), in the units of the curves. */
  bands: { model: number; lo: { x: number; y: number | null }[]; hi: { x: number; y: number | null }[] }[];
}

/** A redshift as a reader gives it: at most six significant figures, no padding (20, not 20.0000). */
const zText = (z: number) => String(Number(z.toPrecision(6)));

/**
 * Every exportable chart of a page, as the page offers them: one per chart and series, and the same as a ratio to
 * the baseline; log redshift axis (the page's default), the redshift range the page plots, and a log y axis where
 * the quantity spans more than a decade. Built from the presentation's chart data, which the page draws too, so an
 * image and the page plot the same numbers in the same units; a model's 68 % band is shaded as on the page.
 */
export function chartSpecs(presented: PresentedDocument): ChartSpec[] {
  const data = chartData(presented);
  const z = data.z as number[];
  const range = data.xRange;
  const specs: ChartSpec[] = [];
  const baseline = data.models.find((m) => m.id === data.baseline) ?? data.models[0];
  for (const c of data.charts) {
    for (const key of c.keys) {
      const s = data.series.find((x) => x.key === key)!;
      const keep = z.map((x) => x > 0 && (!range || (x >= range[0] && x <= range[1])));
      const zs = z.filter((_, i) => keep[i]);
      const title = c.keys.length > 1 || c.title !== s.label ? `${c.title}: ${s.label}` : s.label;
      for (const variant of ["values", "ratio"] as const) {
        const base = baseline.values[key];
        const shown = (y: number | null, i: number) =>
          variant === "values" ? y : y === null || !base[i] ? null : y / (base[i] as number);
        const curve = (ys: (number | null)[]) => z.flatMap((x, i) => (keep[i] ? [{ x, y: shown(ys[i], i) }] : []));
        const datasets = data.models.map((m) => ({ label: m.label, points: curve(m.values[key]) }));
        const bands = data.models.flatMap((m, model) => {
          const b = m.bands?.[key];
          return b ? [{ model, lo: curve(b.lo), hi: curve(b.hi) }] : [];
        });
        const unit = variant === "ratio" ? "" : s.unit;
        const yLabel =
          variant === "ratio"
            ? `${s.label} / baseline (${baseline.label})`
            : s.unit
              ? `${s.label} [${s.unitText}]`
              : s.label;
        const last = datasets.map((d) => d.points.at(-1)?.y).filter((y): y is number => typeof y === "number");
        const at = zs.length ? zText(zs.at(-1)!) : "";
        const rangeText = last.length
          ? `At z = ${at} the values run from ${formatNumber(Math.min(...last))} to ${formatNumber(Math.max(...last))}${unit ? ` ${unitText(unit)}` : ""}.`
          : "";
        const logY = variant === "values" && s.logY;
        const alt =
          `Line chart of ${yLabel} against redshift z from ${zs.length ? zText(zs[0]) : ""} to ${at} (logarithmic axis${logY ? "; logarithmic y axis" : ""}) for ${data.models.length} model${data.models.length === 1 ? "" : "s"}: ${data.models.map((m) => m.label).join(", ")}. ${rangeText}`.trim();
        specs.push({
          id: c.id,
          key,
          variant,
          title: variant === "ratio" ? `${title}, ratio to the baseline` : title,
          yLabel,
          alt,
          log: true,
          logY,
          xRange: range,
          datasets,
          bands,
        });
      }
    }
  }
  return specs;
}

/** The provenance drawn along the foot of an image, in two lines so that the full hash fits. */
function footerLines(p: ExportProvenance): [string, string] {
  const line = provenanceLine(p);
  const cut = line.indexOf(" (");
  return cut > 0 ? [line.slice(0, cut), line.slice(cut + 1)] : [line, ""];
}

/** Log-axis ticks at 1, 2 and 5 times powers of ten only, so that labels do not crowd. */
const logTick = (value: number | string) => {
  const v = Number(value);
  const m = v / 10 ** Math.floor(Math.log10(v) + 1e-9);
  return [1, 2, 5].some((k) => Math.abs(m - k) < 1e-6) ? formatNumber(v, 3).replace(/\.0+$|(\.\d*?)0+$/, "$1") : "";
};

/**
 * Each legend swatch is a short line in the model's colour and dash pattern; this draws the model's marker on its
 * middle, so that the legend shows both, as the curves do (eight models stay apart in greyscale).
 */
const legendMarkers: Plugin<"line"> = {
  id: "legend-markers",
  afterDraw: (chart) => {
    // legendHitBoxes is Chart.js's own record of where it drew each legend item (not in its type declarations).
    type Box = { left: number; top: number; height: number };
    const boxes = (chart.legend as unknown as { legendHitBoxes?: Box[] } | undefined)?.legendHitBoxes ?? [];
    const ctx = chart.ctx;
    boxes.forEach((box, i) => {
      ctx.save();
      ctx.setLineDash([]);
      ctx.strokeStyle = COLOURS[i % COLOURS.length];
      ctx.fillStyle = COLOURS[i % COLOURS.length];
      ctx.lineWidth = 1;
      helpers.drawPoint(
        ctx,
        { pointStyle: MARKERS[i % MARKERS.length] as never, radius: 3, borderWidth: 1, rotation: 0 },
        box.left + 15,
        box.top + box.height / 2,
      );
      ctx.restore();
    });
  },
};

function config(spec: ChartSpec, p: ExportProvenance, scale: number): ChartConfiguration<"line"> {
  const background: Plugin<"line"> = {
    id: "paper",
    beforeDraw: (chart) => {
      const ctx = chart.ctx;
      ctx.save();
      ctx.fillStyle = "#ffffff";
      ctx.fillRect(0, 0, chart.width, chart.height);
      ctx.restore();
    },
    afterDraw: (chart) => {
      const ctx = chart.ctx;
      ctx.save();
      ctx.fillStyle = "#5b6570";
      ctx.font = `7px "${FONT}"`;
      ctx.textAlign = "left";
      ctx.textBaseline = "bottom";
      const [first, second] = footerLines(p);
      ctx.fillText(first, 6, chart.height - 11, chart.width - 12);
      ctx.fillText(second, 6, chart.height - 3, chart.width - 12);
      ctx.restore();
    },
  };
  return {
    type: "line",
    data: {
      datasets: spec.datasets.map((d, i) => ({
        label: d.label,
        data: d.points,
        borderColor: COLOURS[i % COLOURS.length],
        backgroundColor: COLOURS[i % COLOURS.length],
        borderDash: DASHES[i % DASHES.length],
        borderWidth: 1.6,
        // Each model's own marker every few points, offset per model, as on the page.
        pointStyle: MARKERS[i % MARKERS.length],
        pointRadius: d.points.map((_, j) =>
          (j + i) % Math.max(1, Math.round(d.points.length / MARKERS_PER_CURVE)) === 0 ? 3 : 0,
        ),
        pointBorderWidth: 1,
        spanGaps: false,
        fill: false,
      })),
      // Each band after every curve (so that dataset i is still model i): its 16th-percentile curve, then its
      // 84th-percentile curve filled down to it, as on the page.
      ...spec.bands.flatMap((b) => [
        {
          label: "",
          data: b.lo,
          borderWidth: 0,
          pointRadius: 0,
          borderColor: "transparent",
          spanGaps: false,
          fill: false,
        },
        {
          label: "",
          data: b.hi,
          borderWidth: 0,
          pointRadius: 0,
          borderColor: "transparent",
          backgroundColor: `${COLOURS[b.model % COLOURS.length]}33`,
          spanGaps: false,
          fill: "-1",
        },
      ]),
    },
    options: {
      parsing: false,
      responsive: false,
      animation: false,
      devicePixelRatio: scale,
      layout: { padding: { bottom: 20, right: 8 } },
      color: INK,
      scales: {
        x: {
          type: spec.log ? "logarithmic" : "linear",
          min: spec.xRange?.[0],
          max: spec.xRange?.[1],
          title: { display: true, text: "redshift z", color: INK, font: { family: FONT, size: 11 } },
          ticks: {
            color: INK,
            maxRotation: 0,
            autoSkip: false,
            font: { family: FONT, size: 9 },
            callback: spec.log ? logTick : undefined,
          },
        },
        y: {
          type: spec.logY ? "logarithmic" : "linear",
          title: { display: true, text: spec.yLabel, color: INK, font: { family: FONT, size: 11 } },
          ticks: { color: INK, font: { family: FONT, size: 9 } },
        },
      },
      plugins: {
        title: { display: true, text: spec.title, color: INK, font: { family: FONT, size: 13, weight: "bold" } },
        // Legend swatches are short lines in each model's colour and dash pattern, so a greyscale print still maps them.
        legend: {
          position: "bottom",
          labels: {
            color: INK,
            usePointStyle: true,
            pointStyleWidth: 30,
            font: { family: FONT, size: 9 },
            // Chart.js's own labels take a point style's (undashed) look; these carry each line's dash pattern.
            generateLabels: (chart) =>
              chart.data.datasets.slice(0, spec.datasets.length).map((d, i) => ({
                text: String(d.label),
                datasetIndex: i,
                pointStyle: "line",
                fillStyle: COLOURS[i % COLOURS.length],
                strokeStyle: COLOURS[i % COLOURS.length],
                lineWidth: 2,
                lineDash: DASHES[i % DASHES.length],
                fontColor: INK,
                hidden: false,
              })),
          },
        },
      },
    },
    plugins: [background, legendMarkers],
  } as ChartConfiguration<"line">;
}

/**
 * Draws synchronously (no animation) on a canvas of CHART_WIDTH x CHART_HEIGHT; Chart.js, on its basic platform
 * (no DOM), scales the backing store by devicePixelRatio. `encode` runs before the chart is released (destroy clears it).
 */
function drawThen<T>(ctx: SKRSContext2D, spec: ChartSpec, p: ExportProvenance, scale: number, encode: () => T): T {
  const chart = new Chart(ctx as unknown as CanvasRenderingContext2D, config(spec, p, scale));
  try {
    return encode();
  } finally {
    chart.destroy();
  }
}

/**
 * The chart as PNG at print resolution, provenance drawn along its foot. Drawing is synchronous; the PNG encoder runs
 * on libuv's thread pool from a snapshot taken at the call, so several charts encode while the next one is drawn.
 */
export async function chartPng(spec: ChartSpec, p: ExportProvenance): Promise<Buffer> {
  registerFont();
  const canvas = createCanvas(CHART_WIDTH, CHART_HEIGHT);
  const encoding = drawThen(canvas.getContext("2d"), spec, p, PNG_SCALE, () => canvas.encode("png"));
  // 1800 x 1020 px printed at 6 x 3.4 inches: the file says so (pHYs), as its caption claims.
  return withPngText(withPngResolution(await encoding, (CHART_WIDTH * PNG_SCALE) / 6), {
    Title: spec.title,
    Description: spec.alt,
    Source: provenanceLine(p),
    Software: `${p.tool} ${p.tool_version}`,
  });
}

/** The same drawing as SVG (Skia's SVG back end: true vector paths, text as outlines), with title and description for screen readers. */
export function chartSvg(spec: ChartSpec, p: ExportProvenance): string {
  registerFont();
  const canvas = createCanvas(CHART_WIDTH, CHART_HEIGHT, SvgExportFlag.NoPrettyXML);
  const svg = drawThen(canvas.getContext("2d"), spec, p, 1, () => canvas.getContent().toString("utf8"));
  const withFallback = svg.replace(/font-family="DejaVu Sans"/g, 'font-family="DejaVu Sans, Verdana, sans-serif"');
  const esc = escapeHtml;
  return withFallback.replace(
    /<svg\b([^>]*)>/,
    (_open, attrs: string) =>
      `<svg${attrs} role="img" aria-labelledby="title desc"><title id="title">${esc(spec.title)}</title><desc id="desc">${esc(spec.alt)} Source: ${esc(provenanceLine(p))}</desc><metadata>${esc(JSON.stringify(p))}</metadata>`,
  );
}
