/**
 * User text (titles, labels, notes, names, tags, authors, messages) on its way into an export. Every format escapes
 * through these, so that no user string can end a comment line, start a formula in a spreadsheet, break a table or
 * reach TeX as a command.
 */

/** Every line break and control character (C0, C1, U+2028/2029) becomes one space: one line, whatever the text. */
// biome-ignore lint/suspicious/noControlCharactersInRegex: control characters are exactly what is removed
export const oneLine = (s: string) => s.replace(/\r\n|[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, " ");

/**
 * A CSV cell of user text, neutralised as OWASP recommends against CSV injection: a cell starting with = + - @, a tab
 * or a carriage return gets a leading apostrophe, so a spreadsheet shows it as text instead of running a formula.
 * Numbers are not passed through here and stay numbers.
 */
export const csvText = (s: string) => (/^[=+\-@\t\r]/.test(s) ? `'${s}` : s);

const GREEK: Record<string, string> = {
  α: "\\alpha",
  β: "\\beta",
  γ: "\\gamma",
  δ: "\\delta",
  ε: "\\epsilon",
  ζ: "\\zeta",
  η: "\\eta",
  θ: "\\theta",
  ι: "\\iota",
  κ: "\\kappa",
  λ: "\\lambda",
  μ: "\\mu",
  ν: "\\nu",
  ξ: "\\xi",
  ο: "o",
  π: "\\pi",
  ρ: "\\rho",
  σ: "\\sigma",
  ς: "\\varsigma",
  τ: "\\tau",
  υ: "\\upsilon",
  φ: "\\phi",
  χ: "\\chi",
  ψ: "\\psi",
  ω: "\\omega",
  Α: "A",
  Β: "B",
  Γ: "\\Gamma",
  Δ: "\\Delta",
  Ε: "E",
  Ζ: "Z",
  Η: "H",
  Θ: "\\Theta",
  Ι: "I",
  Κ: "K",
  Λ: "\\Lambda",
  Μ: "M",
  Ν: "N",
  Ξ: "\\Xi",
  Ο: "O",
  Π: "\\Pi",
  Ρ: "P",
  Σ: "\\Sigma",
  Τ: "T",
  Υ: "\\Upsilon",
  Φ: "\\Phi",
  Χ: "X",
  Ψ: "\\Psi",
  Ω: "\\Omega",
  ϑ: "\\vartheta",
  ϕ: "\\varphi",
  ϵ: "\\epsilon",
  µ: "\\mu",
};
/** LaTeX accent commands for the combining marks that Unicode decomposition (NFD) yields (LaTeX2e's text accents). */
const ACCENT: Record<string, string> = {
  "\u0300": "\\`",
  "\u0301": "\\'",
  "\u0302": "\\^",
  "\u0303": "\\~",
  "\u0304": "\\=",
  "\u0306": "\\u",
  "\u0307": "\\.",
  "\u0308": '\\"',
  "\u030a": "\\r",
  "\u030b": "\\H",
  "\u030c": "\\v",
  "\u0327": "\\c",
  "\u0328": "\\k",
};
/** Letters of LaTeX's own (LaTeX2e, OT1 and T1 encodings). */
const LETTER: Record<string, string> = {
  ß: "\\ss{}",
  æ: "\\ae{}",
  Æ: "\\AE{}",
  œ: "\\oe{}",
  Œ: "\\OE{}",
  ø: "\\o{}",
  Ø: "\\O{}",
  ł: "\\l{}",
  Ł: "\\L{}",
  ı: "\\i{}",
  "\u00a0": "~",
};
const SPECIAL: Record<string, string> = {
  "\\": "\\textbackslash{}",
  "&": "\\&",
  "%": "\\%",
  $: "\\$",
  "#": "\\#",
  _: "\\_",
  "{": "\\{",
  "}": "\\}",
  "~": "\\textasciitilde{}",
  "^": "\\textasciicircum{}",
  "|": "\\textbar{}",
  "<": "\\textless{}",
  ">": "\\textgreater{}",
  "\u2212": "$-$",
  "\u00d7": "$\\times$",
  "\u00b2": "\\textsuperscript{2}",
  "\u00b3": "\\textsuperscript{3}",
  "\u2264": "$\\le$",
  "\u2265": "$\\ge$",
  "\u2013": "--",
  "\u2014": "---",
  "\u00b7": "\\textperiodcentered{}",
  "\u2192": "$\\rightarrow$",
  "\u00b0": "\\textdegree{}",
  "\u2018": "`",
  "\u2019": "'",
  "\u201c": "``",
  "\u201d": "''",
  "\u2026": "\\dots{}",
  "\u00b1": "$\\pm$",
};

/**
 * Text for LaTeX that compiles with plain pdflatex and never reaches TeX as a command: one line; the ten special
 * characters and | < > escaped; Greek letters as math symbols; accented Latin letters as LaTeX accents (from their
 * Unicode decomposition); LaTeX's own letters (ß, æ, ø, ł ...); anything else outside ASCII as "?".
 */
export function latexText(s: string): string {
  let out = "";
  for (const ch of oneLine(s)) {
    if (SPECIAL[ch] !== undefined) out += SPECIAL[ch];
    else if (ch >= " " && ch <= "~") out += ch;
    else if (GREEK[ch] !== undefined) out += GREEK[ch].startsWith("\\") ? `$${GREEK[ch]}$` : GREEK[ch];
    else if (LETTER[ch] !== undefined) out += LETTER[ch];
    else {
      const [base, ...marks] = [...ch.normalize("NFD")];
      if (/^[A-Za-z]$/.test(base) && marks.length > 0 && marks.every((m) => ACCENT[m] !== undefined)) {
        out += marks.reduce((inner, m) => `${ACCENT[m]}{${inner}}`, base === "i" || base === "j" ? `\\${base}` : base);
      } else out += "?";
    }
  }
  return out;
}
