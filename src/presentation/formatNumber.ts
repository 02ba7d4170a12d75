/** Significant digits shown on the pages: the engine is accurate to 1e-10, so all six are supported. */
export const DISPLAY_DIGITS = 6;

const SUPERSCRIPT: Record<string, string> = {
  "-": "\u207b",
  "0": "\u2070",
  "1": "\u00b9",
  "2": "\u00b2",
  "3": "\u00b3",
  "4": "\u2074",
  "5": "\u2075",
  "6": "\u2076",
  "7": "\u2077",
  "8": "\u2078",
  "9": "\u2079",
};

/** A number's printed parts: sign, digits and (for scientific notation) the power of ten; null for no number. */
export interface NumberParts {
  negative: boolean;
  mantissa: string;
  exponent: number | null;
}

/**
 * The digits a page prints for `x` rounded to `digits` significant figures: fixed notation for 1e-3 <= |x| < 1e6,
 * otherwise mantissa and power of ten. Every output format (HTML, Markdown, LaTeX) is built from these parts.
 */
export function numberParts(x: number | null | undefined, digits = DISPLAY_DIGITS): NumberParts | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  if (x === 0) return { negative: false, mantissa: "0", exponent: null };
  // Decide the notation on the rounded value: 999999.7 rounds to 1.00000e6 and prints as 1.00000 x 10^6.
  const ax = Number(Math.abs(x).toPrecision(digits));
  if (ax >= 1e-3 && ax < 1e6) {
    const s = ax.toPrecision(digits);
    return { negative: x < 0, mantissa: s.includes("e") ? Number(s).toString() : s, exponent: null };
  }
  const [mantissa, exponent] = ax.toExponential(digits - 1).split("e");
  return { negative: x < 0, mantissa, exponent: Number(exponent) };
}

/**
 * Whether a column of numbers prints in scientific notation as a whole: when any of its values would, so that one
 * column never mixes 0.00103223 with 8.59504 x 10^-4.
 */
export function columnIsScientific(values: readonly (number | null | undefined)[], digits = DISPLAY_DIGITS): boolean {
  return values.some((x) => numberParts(x, digits)?.exponent != null);
}

/** numberParts, in scientific notation when `scientific` (the column's style), else as numberParts chooses. */
export function numberPartsIn(
  x: number | null | undefined,
  scientific: boolean,
  digits = DISPLAY_DIGITS,
): NumberParts | null {
  const p = numberParts(x, digits);
  if (p === null || !scientific || p.exponent !== null || x === 0) return p;
  const [mantissa, exponent] = Math.abs(x as number)
    .toExponential(digits - 1)
    .split("e");
  return { negative: (x as number) < 0, mantissa, exponent: Number(exponent) };
}

/** The parts of an input exactly as given (shortest round-trip form). */
export function exactParts(x: number | null | undefined): NumberParts | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  const [mantissa, exponent] = String(Math.abs(x)).split("e");
  return { negative: x < 0, mantissa, exponent: exponent === undefined ? null : Number(exponent) };
}

/** Parts as page text: true minus sign, "m × 10" and a superscript exponent; no number is an em dash. */
export function partsText(p: NumberParts | null): string {
  if (p === null) return "\u2014";
  const sign = p.negative ? "\u2212" : "";
  if (p.exponent === null) return sign + p.mantissa;
  const e = String(p.exponent)
    .split("")
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join("");
  return `${sign}${p.mantissa} \u00d7 10${e}`;
}

/**
 * A number rounded to `digits` significant figures, as plain text: fixed notation for 1e-3 <= |x| < 1e6,
 * otherwise m x 10^e with a superscript exponent. null (an infinite or undefined quantity) prints as an em dash.
 */
export function formatNumber(x: number | null | undefined, digits = DISPLAY_DIGITS): string {
  return partsText(numberParts(x, digits));
}

/** A relative difference as a signed percentage with three significant figures ("+1.23 %", a no-break space before the sign, so that a page never breaks a line inside it); null prints as an em dash. */
export function formatPercent(relative: number | null | undefined): string {
  if (relative === null || relative === undefined || !Number.isFinite(relative)) return "\u2014";
  if (relative === 0) return "0\u00a0%";
  const p = relative * 100;
  const s = Math.abs(p) >= 1e-3 ? Math.abs(p).toPrecision(3) : Math.abs(p).toExponential(2);
  return `${p < 0 ? "\u2212" : "+"}${s}\u00a0%`;
}

/** An input value exactly as given (shortest round-trip form), with a true minus sign and a superscript exponent. */
export function formatExact(x: number | null | undefined): string {
  return partsText(exactParts(x));
}

/** Units as pages and exports write them: the key's ^2 and ^3 as superscripts (Gpc^3 -> Gpc³). */
export const unitText = (u: string) =>
  u.replace(/\^(-?)([123])/g, (_, minus: string, d: string) => `${minus ? "\u207b" : ""}${SUPERSCRIPT[d]}`);
