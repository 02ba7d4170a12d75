// The page's charts, bundled for the browser at build time (bin/bundleCli.mjs -> dist/bundle/charts.js, copied to
// assets/charts.js). It draws the presentation's chart data (the inline "chart-data" element) with the configuration
// builder the exported images use (src/presentation/chartConfiguration.ts), adding only what a page needs:
// responsiveness, hover, the font and the markers on the legend. It computes nothing but the ratio view's division.
import { CHART_STYLE } from "../../presentation/chartStyle.js";
import {
  chartConfiguration,
  chartFrame,
  legendMarkers,
  type ChartView,
} from "../../presentation/chartConfiguration.js";
import type { ChartData } from "../../presentation/chartData.js";

interface ChartInstance {
  destroy(): void;
}
interface ChartGlobal {
  new (canvas: HTMLCanvasElement, config: unknown): ChartInstance;
  defaults: { animation: boolean; font: { family: string }; color: string };
  helpers: { drawPoint: (ctx: CanvasRenderingContext2D, options: unknown, x: number, y: number) => void };
}
declare const Chart: ChartGlobal | undefined;

type Registry = Record<string, ChartInstance>;
const registry = (): Registry => {
  const w = window as unknown as { cosmoledgerCharts?: Registry };
  w.cosmoledgerCharts ??= {};
  return w.cosmoledgerCharts;
};

/** The shared configuration with what a page adds: responsive size, hover along x, wider legend swatches. */
function pageConfiguration(data: ChartData, view: ChartView) {
  const config = chartConfiguration(chartFrame(data, view));
  return {
    ...config,
    plugins: Chart ? [legendMarkers(Chart.helpers.drawPoint, { radius: 3.5, borderWidth: 1.2, offset: 18 })] : [],
    options: {
      ...config.options,
      responsive: true,
      maintainAspectRatio: false,
      interaction: { mode: "nearest", axis: "x", intersect: false },
      plugins: {
        ...config.options.plugins,
        legend: {
          ...config.options.plugins.legend,
          labels: { ...config.options.plugins.legend.labels, pointStyleWidth: 36 },
        },
      },
    },
  };
}

function indexCharts(): void {
  const element = document.getElementById("index-chart-data");
  if (!element || !Chart) return;
  const scenarios = JSON.parse(element.textContent ?? "[]") as {
    id: string;
    yTitle: string;
    z: (number | null)[];
    models: { label: string; values: (number | null)[] }[];
  }[];
  for (const s of scenarios) {
    const canvas = document.querySelector<HTMLCanvasElement>(`canvas[data-mini="${CSS.escape(s.id)}"]`);
    if (!canvas) continue;
    registry()[s.id] = new Chart(canvas, {
      type: "line",
      data: {
        datasets: s.models.map((m, i) => ({
          label: m.label,
          data: s.z.map((z, j) => ({ x: z, y: m.values[j] })),
          borderColor: CHART_STYLE.colours[i % CHART_STYLE.colours.length],
          borderDash: CHART_STYLE.dashes[i % CHART_STYLE.dashes.length],
          borderWidth: 1.5,
          pointRadius: 0,
        })),
      },
      options: {
        parsing: false,
        responsive: true,
        maintainAspectRatio: false,
        scales: {
          x: { type: "linear", title: { display: true, text: "z" } },
          y: { title: { display: true, text: s.yTitle } },
        },
        // A small legend, so that the overview names its curves as the page's charts do.
        plugins: { legend: { display: true, position: "bottom", labels: { boxWidth: 18, font: { size: 10 } } } },
      },
    });
  }
}

function scenarioCharts(): void {
  const element = document.getElementById("chart-data");
  if (!element || !Chart) return;
  const data = JSON.parse(element.textContent ?? "{}") as ChartData;
  const logYByKey = new Map(data.series.map((s) => [s.key, s.logY]));
  // A what-if model (src/site/browser/whatIfPanel.ts) is drawn after the page's models, in the next colour and line
  // pattern, and left out while the page prints: print shows the archived models only.
  let extra: ChartData["models"][number] | null = null;
  let printing = false;
  const drawn = (): ChartData => (extra && !printing ? { ...data, models: [...data.models, extra] } : data);
  // A chart out of view is redrawn when it comes into view: a what-if change then costs only the charts on screen.
  const redraws: { figure: Element; redraw: () => void; stale: boolean; inView: boolean }[] = [];
  const observer =
    typeof IntersectionObserver === "function"
      ? new IntersectionObserver((entries) => {
          for (const e of entries) {
            const r = redraws.find((x) => x.figure === e.target);
            if (!r) continue;
            r.inView = e.isIntersecting;
            if (r.inView && r.stale) {
              r.stale = false;
              r.redraw();
            }
          }
        })
      : null;
  const redrawAll = () => {
    for (const r of redraws) {
      if (r.inView || printing || !observer) {
        r.stale = false;
        r.redraw();
      } else r.stale = true;
    }
  };
  (window as unknown as { cosmoledgerWhatIfCurve?: (m: typeof extra) => void }).cosmoledgerWhatIfCurve = (m) => {
    extra = m;
    redrawAll();
  };
  window.addEventListener("beforeprint", () => {
    printing = true;
    if (extra) redrawAll();
  });
  window.addEventListener("afterprint", () => {
    printing = false;
    if (extra) redrawAll();
  });
  document.querySelectorAll<HTMLElement>("figure.chart").forEach((figure) => {
    const canvas = figure.querySelector("canvas");
    const series = figure.querySelector<HTMLInputElement | HTMLSelectElement>("[data-series]");
    const logX = figure.querySelector<HTMLInputElement>("[data-log]");
    const ratio = figure.querySelector<HTMLInputElement>("[data-ratio]");
    const logY = figure.querySelector<HTMLInputElement>("[data-logy]");
    const id = figure.getAttribute("data-chart");
    if (!canvas || !series || !logX || !ratio || !logY || !id) return;
    // The y axis starts logarithmic where the quantity spans more than a decade over the plotted range (decided at
    // build time, as for the exported images); the switch overrides it. A ratio is always drawn linear.
    const defaultLogY = () => {
      logY.checked = !!logYByKey.get(series.value);
    };
    defaultLogY();
    const view = (): ChartView => ({ key: series.value, logX: logX.checked, logY: logY.checked, ratio: ratio.checked });
    let chart = new Chart(canvas, pageConfiguration(drawn(), view()));
    registry()[id] = chart;
    const update = () => {
      // A new view is a new configuration from the same builder (axis types, titles and ticks all follow the view).
      chart.destroy();
      chart = new Chart(canvas, pageConfiguration(drawn(), view()));
      registry()[id] = chart;
    };
    // A new or changed what-if curve: the same configuration builder, applied to the chart in place.
    const refresh = () => {
      const config = pageConfiguration(drawn(), view()) as unknown as { data: unknown; options: unknown };
      const live = chart as unknown as { data: unknown; options: unknown; update(mode: string): void };
      live.data = config.data;
      live.options = config.options;
      live.update("none");
    };
    redraws.push({ figure, redraw: refresh, stale: false, inView: false });
    observer?.observe(figure);
    for (const input of [logX, ratio, logY]) input.addEventListener("change", update);
    series.addEventListener("change", () => {
      defaultLogY();
      update();
    });
  });
}

(() => {
  const diffToggle = document.getElementById("show-diffs") as HTMLInputElement | null;
  diffToggle?.addEventListener("change", () => document.body.classList.toggle("hide-diffs", !diffToggle.checked));
  if (!Chart) return;
  Chart.defaults.animation = false;
  Chart.defaults.font.family = "system-ui, 'DejaVu Sans', sans-serif";
  Chart.defaults.color = CHART_STYLE.ink;
  registry();
  indexCharts();
  scenarioCharts();
})();
