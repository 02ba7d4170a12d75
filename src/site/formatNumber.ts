/** Significant digits shown on the pages: the engine is accurate to 1e-10, so all six are supported. */
export const DISPLAY_DIGITS = 6;

const SUPERSCRIPT: Record<string, string> = { "-": "\u207b", "0": "\u2070", "1": "\u00b9", "2": "\u00b2", "3": "\u00b3", "4": "\u2074", "5": "\u2075", "6": "\u2076", "7": "\u2077", "8": "\u2078", "9": "\u2079" };

/**
 * A number rounded to `digits` significant figures, as plain text: fixed notation for 1e-3 <= |x| < 1e6,
 * otherwise m x 10^e with a superscript exponent. null (an infinite or undefined quantity) prints as an em dash.
 */
export function formatNumber(x: number | null | undefined, digits = DISPLAY_DIGITS): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "\u2014";
  if (x === 0) return "0";
  const ax = Math.abs(x);
  const sign = x < 0 ? "\u2212" : "";
  if (ax >= 1e-3 && ax < 1e6) {
    const s = ax.toPrecision(digits);
    return sign + (s.includes("e") ? Number(s).toString() : s);
  }
  const [mantissa, exponent] = ax.toExponential(digits - 1).split("e");
  const e = String(Number(exponent)).split("").map((c) => SUPERSCRIPT[c] ?? c).join("");
  return `${sign}${mantissa} \u00d7 10${e}`;
}

/** A relative difference as a signed percentage with three significant figures ("+1.23 %"); null prints as an em dash. */
export function formatPercent(relative: number | null | undefined): string {
  if (relative === null || relative === undefined || !Number.isFinite(relative)) return "\u2014";
  if (relative === 0) return "0 %";
  const p = relative * 100;
  const s = Math.abs(p) >= 1e-3 ? Math.abs(p).toPrecision(3) : Math.abs(p).toExponential(2);
  return `${p < 0 ? "\u2212" : "+"}${s} %`;
}

/** An input value exactly as given (shortest round-trip form), with a true minus sign and a superscript exponent. */
export function formatExact(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "\u2014";
  const [mantissa, exponent] = String(Math.abs(x)).split("e");
  const sign = x < 0 ? "\u2212" : "";
  if (exponent === undefined) return sign + mantissa;
  const e = String(Number(exponent)).split("").map((c) => SUPERSCRIPT[c] ?? c).join("");
  return `${sign}${mantissa} \u00d7 10${e}`;
}
