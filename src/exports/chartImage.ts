import { createRequire } from "node:module";
import { readFileSync } from "node:fs";
import { createCanvas, GlobalFonts, SvgExportFlag, type SKRSContext2D } from "@napi-rs/canvas";
import { Chart, registerables, type ChartConfiguration, type Plugin } from "chart.js";
import * as helpers from "chart.js/helpers";
import { chartConfiguration, legendMarkers } from "../presentation/chartConfiguration.js";
import type { ChartSpec } from "../presentation/chartSpecs.js";
import { escapeHtml } from "./exportFormats.js";
import { provenanceLine, type ExportProvenance } from "./exportProvenance.js";
import { withPngResolution, withPngText } from "./pngText.js";
import { CHART_STYLE } from "../presentation/chartStyle.js";

export type { ChartSpec };

Chart.register(...registerables);

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

/** The provenance drawn along the foot of an image, in two lines so that the full hash fits. */
function footerLines(p: ExportProvenance): [string, string] {
  const line = provenanceLine(p);
  const cut = line.indexOf(" (");
  return cut > 0 ? [line.slice(0, cut), line.slice(cut + 1)] : [line, ""];
}

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
  // The shared configuration (the page draws the same), with what a printed image needs: fixed size and scale,
  // DejaVu Sans at print sizes, a title, a white paper and the provenance along its foot.
  const shared = chartConfiguration(spec);
  const font = (size: number) => ({ family: FONT, size });
  const curves = spec.datasets.map((d) => (d.isBand ? d : { ...d, borderWidth: 1.6, pointBorderWidth: 1 }));
  return {
    ...shared,
    data: { datasets: curves },
    options: {
      ...shared.options,
      responsive: false,
      devicePixelRatio: scale,
      layout: { padding: { bottom: 20, right: 8 } },
      color: INK,
      scales: {
        x: {
          ...shared.options.scales.x,
          title: { ...shared.options.scales.x.title, color: INK, font: font(11) },
          ticks: { ...shared.options.scales.x.ticks, color: INK, autoSkip: false, font: font(9) },
        },
        y: {
          ...shared.options.scales.y,
          title: { ...shared.options.scales.y.title, color: INK, font: font(11) },
          ticks: { ...(shared.options.scales.y as { ticks?: object }).ticks, color: INK, font: font(9) },
        },
      },
      plugins: {
        ...shared.options.plugins,
        title: { display: true, text: spec.title, color: INK, font: { family: FONT, size: 13, weight: "bold" } },
        legend: {
          ...shared.options.plugins.legend,
          labels: {
            ...shared.options.plugins.legend.labels,
            color: INK,
            pointStyleWidth: 30,
            font: font(9),
          },
        },
      },
    },
    plugins: [background, legendMarkers(helpers.drawPoint as never, { radius: 3, borderWidth: 1, offset: 15 })],
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
