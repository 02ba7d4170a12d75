import { createRequire } from "node:module";
import { readFileSync } from "node:fs";
import { createCanvas, GlobalFonts, SvgExportFlag, type SKRSContext2D } from "@napi-rs/canvas";
import { Chart, registerables, type ChartConfiguration, type Plugin } from "chart.js";
import type { StoredTablesDocument } from "../contract/tablesDocument.js";
import { catalogFor, hasEarlyUniverse } from "../contract/quantityCatalog.js";
import { formatNumber } from "../contract/formatNumber.js";
import { escapeHtml, unitText } from "./exportFormats.js";
import { provenanceLine, type ExportProvenance } from "./exportProvenance.js";
import { withPngText } from "./pngText.js";
import { CHART_STYLE } from "./chartStyle.js";

Chart.register(...registerables);

/** The pages' palette and line patterns (chartStyle.ts), so an exported chart looks like the page's. */
const COLOURS: string[] = [...CHART_STYLE.colours];
const DASHES = CHART_STYLE.dashes.map((d) => [...d]);
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
  title: string;
  yLabel: string;
  alt: string;
  log: boolean;
  datasets: { label: string; points: { x: number; y: number | null }[] }[];
}

/** Every exportable chart of a page: one per chart and series, as the page offers them (log redshift axis, the page's default). */
export function chartSpecs(doc: StoredTablesDocument): ChartSpec[] {
  const early = hasEarlyUniverse(doc);
  const z = doc.models[0].grid.z as number[];
  const specs: ChartSpec[] = [];
  const { CHARTS, CHART_SERIES } = catalogFor(doc); // only the series this document's format holds
  for (const c of CHARTS) {
    if (c.id === "bao" && !early) continue;
    for (const key of c.keys) {
      const s = CHART_SERIES.find((x) => x.key === key)!;
      const yLabel = s.unit ? `${s.label} [${unitText(s.unit)}]` : s.label;
      const keep = z.map((x) => x > 0);
      const datasets = doc.models.map((m) => ({
        label: m.label,
        points: z.flatMap((x, i) =>
          keep[i] ? [{ x, y: (m.grid as unknown as Record<string, (number | null)[]>)[key][i] }] : [],
        ),
      }));
      const zs = z.filter((x) => x > 0);
      const last = datasets.map((d) => d.points.at(-1)?.y).filter((y): y is number => typeof y === "number");
      const range = last.length
        ? `At z = ${formatNumber(zs.at(-1)!)} the values run from ${formatNumber(Math.min(...last))} to ${formatNumber(Math.max(...last))}${s.unit ? ` ${unitText(s.unit)}` : ""}.`
        : "";
      const alt =
        `Line chart of ${yLabel} against redshift z from ${formatNumber(zs[0])} to ${formatNumber(zs.at(-1)!)} (logarithmic axis) for ${doc.models.length} model${doc.models.length === 1 ? "" : "s"}: ${doc.models.map((m) => m.label).join(", ")}. ${range}`.trim();
      specs.push({ id: c.id, key, title: `${c.title}: ${s.label}`, yLabel, alt, log: true, datasets });
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
        pointRadius: 0,
        spanGaps: false,
        fill: false,
      })),
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
          type: "linear",
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
              chart.data.datasets.map((d, i) => ({
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
    plugins: [background],
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
  return withPngText(await encoding, {
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
