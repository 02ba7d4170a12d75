import type { Band } from "../contract/tablesDocument.js";
import { formatNumber } from "./formatNumber.js";

/** What an interval says when every draw gives the same printed value. */
export const NO_SPREAD = "no spread at the digits shown";

/** Index of each reported percentile in a band's `q` (the document's draws.percentiles: 2.5, 16, 50, 84, 97.5). */
export const P16 = 1;
export const P50 = 2;
export const P84 = 3;

/** A median with its central 68 % interval, printed to the digits the interval supports. */
export interface IntervalText {
  median: number;
  plus: number;
  minus: number;
  /** The 16th and 84th percentiles themselves (full precision, as stored). */
  p16: number;
  p84: number;
  /**
   * Every draw gives the same value to the digits a page prints (a target's placement quantity, a length in h^-1 Mpc
   * that does not depend on the varied H0): no interval is printed, only that it has no spread.
   */
  fixed: boolean;
  /** "13.797 +0.023 −0.023" (or "(1.23 +0.04 −0.05) × 10^9"). */
  text: string;
  /** LaTeX, for a math environment: "13.797^{+0.023}_{-0.023}". */
  tex: string;
}

/**
 * The median of a band and its 68 % interval (16th to 84th percentile) as +upper -lower. Digits: two significant
 * figures of the smaller half-width, the median rounded to the same decimal place (the rounding rule of the Review
 * of Particle Physics in its simplest form; common practice). Null when the band is null; `fixed` when the 16th and
 * 84th percentiles print alike at the pages' six significant figures.
 */
export function intervalOf(band: Band | null | undefined): IntervalText | null {
  if (!band) return null;
  const median = band.q[P50];
  const p16 = band.q[P16];
  const p84 = band.q[P84];
  const plus = p84 - median;
  const minus = median - p16;
  if (!Number.isFinite(median) || !Number.isFinite(p16) || !Number.isFinite(p84)) return null;
  // Percentiles that print alike at the pages' digits carry no information, only rounding noise: say so instead.
  if (formatNumber(p16) === formatNumber(p84))
    return { median, plus, minus, p16, p84, fixed: true, text: NO_SPREAD, tex: `\\mbox{${NO_SPREAD}}` };
  const smaller = Math.min(plus, minus) > 0 ? Math.min(plus, minus) : Math.max(plus, minus);
  if (!(smaller > 0) || !Number.isFinite(median)) return null;
  const scale = Math.abs(median);
  const exponent = scale >= 1e6 || (scale > 0 && scale < 1e-3) ? Math.floor(Math.log10(scale)) : 0;
  const f = 10 ** exponent;
  // Twelve significant figures first, so that 0.3 - 0.2 = 0.09999999999999998 counts as 0.1.
  const decimals = Math.max(0, 1 - Math.floor(Math.log10(Number((smaller / f).toPrecision(12)))));
  const fix = (x: number) => (x / f).toFixed(Math.min(decimals, 20));
  const core = `${fix(median)} +${fix(plus)} \u2212${fix(minus)}`;
  const texCore = `${fix(median)}^{+${fix(plus)}}_{-${fix(minus)}}`;
  return exponent === 0
    ? { median, plus, minus, p16, p84, fixed: false, text: core, tex: texCore }
    : {
        median,
        plus,
        minus,
        p16,
        p84,
        fixed: false,
        text: `(${core}) \u00d7 10^${exponent}`,
        tex: `${texCore}\\times 10^{${exponent}}`,
      };
}
