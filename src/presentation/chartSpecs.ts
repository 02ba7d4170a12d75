import { chartData } from "./chartData.js";
import { chartFrame, type ChartFrame } from "./chartConfiguration.js";
import { formatNumber, unitText } from "./formatNumber.js";
import type { PresentedDocument } from "./presentDocument.js";

/** One exported chart: what it shows (the shared frame of chartConfiguration.ts), its title and alt text. */
export interface ChartSpec extends ChartFrame {
  id: string;
  key: string;
  /** The values themselves, or each model divided by the baseline (the page's "ratio to baseline" view). */
  variant: "values" | "ratio";
  title: string;
  alt: string;
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
  const specs: ChartSpec[] = [];
  for (const c of data.charts) {
    for (const key of c.keys) {
      const s = data.series.find((x) => x.key === key)!;
      const title = c.keys.length > 1 || c.title !== s.label ? `${c.title}: ${s.label}` : s.label;
      for (const variant of ["values", "ratio"] as const) {
        // The page's default view: log redshift axis, log y where the series spans more than a decade.
        const frame = chartFrame(data, { key, logX: true, logY: s.logY, ratio: variant === "ratio" }, 3);
        const curves = frame.datasets.filter((d) => !d.isBand);
        const xs = curves[0]?.data.map((p) => p.x) ?? [];
        const unit = variant === "ratio" ? "" : s.unit;
        const last = curves.map((d) => d.data.at(-1)?.y).filter((y): y is number => typeof y === "number");
        const at = xs.length ? zText(xs.at(-1)!) : "";
        const rangeText = last.length
          ? `At z = ${at} the values run from ${formatNumber(Math.min(...last))} to ${formatNumber(Math.max(...last))}${unit ? ` ${unitText(unit)}` : ""}.`
          : "";
        const logY = variant === "values" && s.logY;
        const alt =
          `Line chart of ${frame.yTitle} against redshift z from ${xs.length ? zText(xs[0]) : ""} to ${at} (logarithmic axis${logY ? "; logarithmic y axis" : ""}) for ${data.models.length} model${data.models.length === 1 ? "" : "s"}: ${data.models.map((m) => m.label).join(", ")}. ${rangeText}`.trim();
        specs.push({
          ...frame,
          id: c.id,
          key,
          variant,
          title: variant === "ratio" ? `${title}, ratio to the baseline` : title,
          alt,
        });
      }
    }
  }
  return specs;
}
