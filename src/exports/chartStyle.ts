/**
 * The one palette and set of line patterns of every chart: drawn on the pages (content/assets/charts.js reads them
 * from the page's inline `chart-style` data) and in exported images (chartImage.ts). Eight models stay apart in
 * greyscale by their patterns; the ink is the text colour.
 */
export const CHART_STYLE = {
  colours: ["#0b6e69", "#c2571a", "#6a3d9a", "#7a8b1f", "#2f3e9e", "#a8324a", "#5d6d7e", "#b8860b"],
  dashes: [[], [9, 4], [2, 3], [12, 3, 2, 3], [5, 5], [1, 2], [14, 4, 4, 4], [3, 6]],
  ink: "#1d232a",
} as const;
