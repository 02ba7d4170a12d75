/**
 * The packages a LaTeX table needs beyond plain LaTeX: booktabs for its rules, and amsmath when a model's LaTeX
 * label uses \text, \tfrac or \dfrac (src/scenario/labelTex.ts allows those; plain LaTeX has the rest).
 */
export const latexPackages = (labels: readonly (string | null | undefined)[]): string[] => [
  "booktabs",
  ...(labels.some((l) => l && /\\(text|tfrac|dfrac)(?![A-Za-z])/.test(l)) ? ["amsmath"] : []),
];
