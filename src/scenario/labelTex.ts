import { createRequire } from "node:module";

/**
 * A model's LaTeX label (label_tex) may hold mathematics only: letters, digits, spacing, sub- and superscripts,
 * braces, and the commands listed here, none of which reads a file, writes one, runs anything or redefines TeX.
 * Anything else (a %, a line break, \input, \write18, \def, ^^ character codes) is refused where it is written.
 * What passes is also well formed for both renderers that set it: every command has its arguments, a sub- or
 * superscript has one and is not doubled, text arguments hold text, and the page's math renderer (Temml) accepts
 * it. The LaTeX exports need amsmath for \text, \tfrac and \dfrac, and say so.
 */
const SYMBOLS = new Set(
  (
    "alpha beta gamma delta epsilon varepsilon zeta eta theta vartheta iota kappa lambda mu nu xi pi varpi rho varrho " +
    "sigma varsigma tau upsilon phi varphi chi psi omega Gamma Delta Theta Lambda Xi Pi Sigma Upsilon Phi Psi Omega " +
    "prime pm mp times cdot le ge leq geq approx sim simeq propto infty odot star ast circ ell hbar partial nabla " +
    "quad qquad"
  ).split(" "),
);
/** Commands and the number of arguments they take (a brace group or one token each). */
const ARGUMENTS: Record<string, number> = {
  frac: 2,
  tfrac: 2,
  dfrac: 2,
  sqrt: 1,
  hat: 1,
  bar: 1,
  tilde: 1,
  vec: 1,
  dot: 1,
  ddot: 1,
  overline: 1,
  underline: 1,
  mathrm: 1,
  mathit: 1,
  mathbf: 1,
  mathsf: 1,
  mathcal: 1,
  text: 1,
  textrm: 1,
  textit: 1,
};
/** Switches that change the font of what follows (no argument). */
const SWITCHES = new Set(["rm", "it", "bf"]);
/** Commands whose argument is text mode: letters, digits, spaces and punctuation only. */
const TEXT_MODE = new Set(["text", "textrm", "textit"]);

class LabelProblem extends Error {}

/** A recursive-descent reading of the label's mathematics; throws LabelProblem at the first fault. */
class MathReader {
  i = 0;
  constructor(readonly tex: string) {}

  /** A sequence of atoms up to the end or a closing brace. */
  list(inGroup: boolean): void {
    for (;;) {
      this.spaces();
      const c = this.tex[this.i];
      if (c === undefined) {
        if (inGroup) throw new LabelProblem("has a { without its }");
        return;
      }
      if (c === "}") {
        if (!inGroup) throw new LabelProblem("has a } without its {");
        return;
      }
      this.atom();
      // Scripts of this atom: at most one ^ and one _, each with an argument.
      let sup = false;
      let sub = false;
      for (;;) {
        this.spaces();
        const s = this.tex[this.i];
        if (s === "'") {
          this.i++;
          continue;
        }
        if (s !== "^" && s !== "_") break;
        if ((s === "^" && sup) || (s === "_" && sub))
          throw new LabelProblem(`has a double ${s === "^" ? "superscript" : "subscript"} (write x^{12} or {x^1}^2)`);
        if (s === "^") sup = true;
        else sub = true;
        this.i++;
        this.argument(`${s === "^" ? "a superscript" : "a subscript"}`);
      }
    }
  }

  spaces(): void {
    while (this.tex[this.i] === " ") this.i++;
  }

  /** One atom: a character, a group or a command with its arguments. */
  atom(): void {
    const c = this.tex[this.i];
    if (c === "^" || c === "_")
      throw new LabelProblem(`has a ${c === "^" ? "superscript" : "subscript"} with nothing before it`);
    if (c === "{") {
      this.i++;
      this.list(true);
      this.i++; // the closing brace
      return;
    }
    if (c === "\\") {
      this.command();
      return;
    }
    this.i++;
  }

  /** The argument of a command or script: a brace group, a command or one character. */
  argument(what: string): void {
    this.spaces();
    const c = this.tex[this.i];
    if (c === undefined || c === "}" || c === "^" || c === "_")
      throw new LabelProblem(`${what} needs an argument (write it in braces)`);
    this.atom();
  }

  command(): void {
    const rest = this.tex.slice(this.i + 1);
    const name = /^[A-Za-z]+/.exec(rest)?.[0];
    if (name === undefined) {
      const next = rest[0];
      if (next === undefined) throw new LabelProblem("ends with a lone backslash");
      if (!",;! {}_".includes(next))
        throw new LabelProblem(`may not contain \\${next} (allowed: \\, \\; \\! \\{ \\} \\_)`);
      this.i += 2;
      return;
    }
    this.i += 1 + name.length;
    if (SYMBOLS.has(name) || SWITCHES.has(name)) return;
    const count = ARGUMENTS[name];
    if (count === undefined)
      throw new LabelProblem(
        `may not use \\${name}; allowed commands: Greek letters, \\mathrm, \\text, \\frac and other mathematics`,
      );
    if (name === "sqrt" && this.tex[this.i] === "[") {
      const end = this.tex.indexOf("]", this.i);
      if (end < 0) throw new LabelProblem("has \\sqrt[ without its ]");
      const index = this.tex.slice(this.i + 1, end);
      if (!/^[A-Za-z0-9 ]+$/.test(index)) throw new LabelProblem("\\sqrt[n] takes letters or digits only as n");
      this.i = end + 1;
    }
    for (let k = 0; k < count; k++) {
      if (TEXT_MODE.has(name)) this.textArgument(name);
      else this.argument(`\\${name}`);
    }
  }

  /** The argument of \text: a brace group of plain text (no commands, scripts or nested braces). */
  textArgument(name: string): void {
    this.spaces();
    if (this.tex[this.i] !== "{") throw new LabelProblem(`\\${name} needs its text in braces: \\${name}{...}`);
    const end = this.tex.indexOf("}", this.i);
    if (end < 0) throw new LabelProblem("has a { without its }");
    const body = this.tex.slice(this.i + 1, end);
    if (!/^[A-Za-z0-9 .,:;!?()'+\-=/*<>|[\]@]*$/.test(body))
      throw new LabelProblem(
        `\\${name}{...} holds text only: letters, digits, spaces and punctuation (no commands, ^, _ or braces)`,
      );
    this.i = end + 1;
  }
}

let temml: { renderToString: (tex: string, options: object) => string } | null = null;

/**
 * Why `tex` cannot be a label, or null when it can. A frozen version's source (`frozen`, when verify recomputes it)
 * passed the rules of the release that froze it; only the characters that could reach TeX as commands are checked
 * again, so that an archived version keeps verifying.
 */
export function labelTexProblem(tex: string, frozen = false): string | null {
  if (/[^ -~]/.test(tex)) return "may hold printable ASCII only (write Greek letters as \\alpha, \\Lambda, ...)";
  if (/[%#$&~]/.test(tex)) return "may not contain %, #, $, & or ~ (it is set in math mode already)";
  if (tex.includes("^^")) return "may not contain ^^ (TeX character codes)";
  if (frozen) return null;
  try {
    new MathReader(tex).list(false);
  } catch (e) {
    if (e instanceof LabelProblem) return e.message;
    throw e;
  }
  // The page's renderer, with errors thrown, as the site calls it (loaded only when a label is given).
  temml ??= createRequire(import.meta.url)("temml") as NonNullable<typeof temml>;
  try {
    temml.renderToString(tex, { displayMode: false, throwOnError: true });
  } catch (e) {
    return `the page's math renderer refuses it: ${(e as Error).message.replace(/\s+/g, " ").slice(0, 160)}`;
  }
  return null;
}
