/**
 * The one palette and set of line patterns of every chart, on the pages and in exported images alike (both through
 * chartConfiguration.ts; the page's script is bundled from src/site/browser/charts.ts). Eight models stay apart in
 * greyscale by their patterns; the ink is the text colour.
 */
export const CHART_STYLE = {
  colours: ["#0b6e69", "#c2571a", "#6a3d9a", "#7a8b1f", "#2f3e9e", "#a8324a", "#5d6d7e", "#b8860b"],
  dashes: [[], [9, 4], [2, 3], [12, 3, 2, 3], [5, 5], [1, 2], [14, 4, 4, 4], [3, 6]],
  /** A point marker per model (Chart.js point styles), drawn every few points and in the legend. */
  markers: ["circle", "rect", "triangle", "rectRot", "crossRot", "star", "cross", "rectRounded"],
  ink: "#1d232a",
} as const;

/** Markers are drawn at about this many points along each curve (every point would hide the dash pattern). */
export const MARKERS_PER_CURVE = 9;

/**
 * The redshift range a chart plots: the scenario's table redshifts when it left the grid to its default (a survey at
 * z = 4 to 12 is drawn from 4 to 12), the whole grid when the scenario set it. Null for the whole grid.
 */
export function plottedRedshiftRange(doc: {
  scenario: { redshifts: number[]; defaults_applied: string[] };
}): [number, number] | null {
  if (!doc.scenario.defaults_applied.includes("grid.z_max")) return null; // the scenario chose its grid
  const positive = doc.scenario.redshifts.filter((z) => z > 0);
  if (positive.length < 2) return null;
  const lo = Math.min(...positive);
  const hi = Math.max(...positive);
  return hi > lo ? [lo, hi] : null;
}

/**
 * Whether a quantity is drawn on a logarithmic y axis by default: when its positive values over the plotted range
 * span more than a decade (D_L from z = 0.01 to 10); a series with values of both signs or zeros stays linear.
 */
export function spansMoreThanADecade(
  z: readonly (number | null)[],
  series: readonly (readonly (number | null)[])[],
  range: [number, number] | null,
): boolean {
  let lo = Infinity;
  let hi = -Infinity;
  for (const ys of series)
    for (let i = 0; i < z.length; i++) {
      const x = z[i];
      const y = ys[i];
      if (x === null || y === null || !(x > 0)) continue;
      if (range && (x < range[0] || x > range[1])) continue;
      if (!(y > 0)) return false;
      lo = Math.min(lo, y);
      hi = Math.max(hi, y);
    }
  return hi > 10 * lo;
}
