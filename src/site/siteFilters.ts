import { formatExact, formatNumber, formatPercent } from "./formatNumber.js";
import { renderMarkdown } from "./renderMarkdown.js";
import { renderMath } from "./renderMath.js";
import { chartPayload, indexChartPayload, jsonForScriptElement } from "./chartPayload.js";

/** The Nunjucks filters of the site: formatting only. Filters marked html return markup (marked safe by the config). */
export const TEXT_FILTERS = {
  /** Six significant figures, or an em dash for null. */
  num: (x: number | null) => formatNumber(x),
  /** An input exactly as given (no rounding, no padding). */
  exact: (x: number | null) => formatExact(x),
  /** A relative difference as a signed percentage. */
  pct: (x: number | null) => formatPercent(x),
  /** Whether a relative difference is above 1 % (such cells stand out). */
  notable: (x: number | null) => typeof x === "number" && Math.abs(x) > 0.01,
  /** The first 12 hex digits of a hash. */
  short: (hash: string) => hash.slice(0, 12),
  /** Units as written in keys (Gpc^3) with real superscripts. */
  unit: (u: string) => u.replace(/\^3/g, "\u00b3").replace(/\^2/g, "\u00b2"),
  /** Source text split into lines, for a numbered listing. */
  lines: (text: string) => text.replace(/\n$/, "").split("\n"),
};

export const HTML_FILTERS = {
  markdown: (text: string | null) => renderMarkdown(text),
  math: (tex: string) => renderMath(tex, true),
  /** The chart data of a tables document as JSON for an inline data element. */
  chartJson: (doc: Parameters<typeof chartPayload>[0]) => jsonForScriptElement(chartPayload(doc)),
  /** The index's overview charts of all scenarios as JSON for an inline data element. */
  indexChartJson: (docs: Parameters<typeof indexChartPayload>[0]) => jsonForScriptElement(indexChartPayload(docs)),
};
