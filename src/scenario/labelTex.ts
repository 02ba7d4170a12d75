/**
 * A model's LaTeX label (label_tex) may hold mathematics only: letters, digits, spacing, sub- and superscripts,
 * braces, and the commands listed here, none of which reads a file, writes one, runs anything or redefines TeX.
 * Anything else (a %, a line break, \input, \write18, \def, ^^ character codes) is refused where it is written.
 */
const COMMANDS = new Set(
  (
    "alpha beta gamma delta epsilon varepsilon zeta eta theta vartheta iota kappa lambda mu nu xi pi varpi rho varrho " +
    "sigma varsigma tau upsilon phi varphi chi psi omega Gamma Delta Theta Lambda Xi Pi Sigma Upsilon Phi Psi Omega " +
    "mathrm mathit mathbf mathsf mathcal text textrm textit rm it bf prime pm mp times cdot le ge leq geq approx sim " +
    "simeq propto infty odot star ast circ ell hbar partial nabla sqrt frac tfrac dfrac hat bar tilde vec dot ddot " +
    "overline underline quad qquad"
  ).split(" "),
);

/** Why `tex` cannot be a label, or null when it can. */
export function labelTexProblem(tex: string): string | null {
  if (/[^ -~]/.test(tex)) return "may hold printable ASCII only (write Greek letters as \\alpha, \\Lambda, ...)";
  if (/[%#$&~]/.test(tex)) return "may not contain %, #, $, & or ~ (it is set in math mode already)";
  if (tex.includes("^^")) return "may not contain ^^ (TeX character codes)";
  let depth = 0;
  for (let i = 0; i < tex.length; i++) {
    const c = tex[i];
    if (c === "{") depth++;
    else if (c === "}" && --depth < 0) return "has a } without its {";
    else if (c === "\\") {
      const name = /^[A-Za-z]+/.exec(tex.slice(i + 1))?.[0];
      if (name === undefined) {
        if (!",;! {}_".includes(tex[i + 1] ?? ""))
          return `may not contain \\${tex[i + 1] ?? ""} (allowed: \\, \\; \\! \\{ \\} \\_)`;
        i++;
      } else {
        if (!COMMANDS.has(name))
          return `may not use \\${name}; allowed commands: Greek letters, \\mathrm, \\text, \\frac and other mathematics`;
        i += name.length;
      }
    }
  }
  return depth === 0 ? null : "has a { without its }";
}
