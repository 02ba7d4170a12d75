import type { StoredTablesDocument } from "../contract/tablesDocument.js";
import { fateText } from "../contract/quantityCatalog.js";
import { formatExact, formatNumber, formatPercent, unitText } from "../presentation/formatNumber.js";
import { renderMarkdown } from "./renderMarkdown.js";
import { renderMath } from "./renderMath.js";
import { jsonForScriptElement } from "./chartPayload.js";
import { overviewChartData, pageChartData } from "../presentation/chartData.js";

/** The Nunjucks filters of the site: formatting only. Filters marked html return markup (marked safe by the config). */
export const TEXT_FILTERS = {
  /** Whether any model of a document has a massive neutrino (the page then shows the neutrino terms). */
  hasMassiveNeutrinos: (doc: StoredTablesDocument) => doc.models.some((m) => m.parameters.m_nu_eV.length > 0),
  /** A model's fate in words, in the vocabulary of any format. */
  fate: (fate: string) => fateText(fate),
  /**
   * Six significant figures, an em dash for null (computed: undefined or infinite), and "not computed" for a key the
   * document does not have at all (an older format), so that the two can never be confused.
   */
  num: (x: number | null | undefined) => (x === undefined ? "not computed" : formatNumber(x)),
  /** An input exactly as given (no rounding, no padding). */
  exact: (x: number | null) => formatExact(x),
  /** A relative difference as a signed percentage. */
  pct: (x: number | null) => formatPercent(x),
  /** The size of a relative change as a percentage without sign ("1.23 %"). */
  pctAbs: (x: number | null) => formatPercent(x === null ? null : Math.abs(x)).replace(/^\+/, ""),
  /** Whether a relative difference is above 1 % (such cells stand out). */
  notable: (x: number | null) => typeof x === "number" && Math.abs(x) > 0.01,
  /** The first 12 hex digits of a hash. */
  short: (hash: string) => hash.slice(0, 12),
  /** Units as written in keys (Gpc^3) with real superscripts. */
  unit: (u: string) => unitText(u),
  /** A version's creation time (ISO 8601, UTC) as "2026-03-14 09:30 UTC"; times come from the versions, never from the build. */
  when: (iso: string) =>
    /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(iso) ? `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC` : iso,
  /** A version message, or a placeholder when it was frozen without one. */
  message: (m: string) => (m?.trim() ? m : "(no message)"),
  /** Whether any model extends a published set (the models table then cites it). */
  hasPublished: (doc: StoredTablesDocument) =>
    doc.models.some((m) => "published" in m && (m.published?.length ?? 0) > 0),
  /** Whether any model's spread is independent normal over several parameters (marginals without correlations). */
  hasMarginalSpread: (doc: StoredTablesDocument) =>
    doc.models.some((m) => "spread" in m && m.spread?.form === "normal" && m.spread.parameters.length > 1),
  /** A model's parents as a list (extends is one id, a list of ids, or null). */
  parents: (e: string | string[] | null | undefined) => (e == null ? [] : Array.isArray(e) ? e : [e]),
  /** The parameters of a published set whose values were recalled from memory rather than read from the paper. */
  recalled: (t: Record<string, string> | undefined) =>
    Object.entries(t ?? {})
      .filter(([, how]) => how === "recalled from memory")
      .map(([k]) => k),
  /** Source text split into lines, for a numbered listing. */
  lines: (text: string) => text.replace(/\n$/, "").split("\n"),
};

export const HTML_FILTERS = {
  markdown: (text: string | null) => renderMarkdown(text),
  math: (tex: string) => renderMath(tex, true),
  /** A model's LaTeX label (checked to hold mathematics only) as inline MathML; empty when it has none. */
  labelMath: (tex: string | null | undefined) => (tex ? renderMath(tex, false) : ""),
  /** The chart data of a tables document as JSON for an inline data element. */
  chartJson: (doc: Parameters<typeof pageChartData>[0]) => jsonForScriptElement(pageChartData(doc)),
  /** Any value as JSON for an inline data element (<script type="application/json">). */
  scriptJson: (value: unknown) => jsonForScriptElement(value),
  /** The index's overview charts of all scenarios as JSON for an inline data element. */
  indexChartJson: (docs: Parameters<typeof overviewChartData>[0]) => jsonForScriptElement(overviewChartData(docs)),
};
