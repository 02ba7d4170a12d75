import temml from "temml";

/** TeX to MathML at build time (Temml), so pages need no math script. */
export function renderMath(tex: string, display = true): string {
  return temml.renderToString(tex, { displayMode: display, throwOnError: true });
}

/** The Friedmann equation in the form the engine uses (CPL dark energy, Chevallier & Polarski 2001; Linder 2003). */
export const FRIEDMANN_TEX = String.raw`\frac{H^2(z)}{H_0^2} = \Omega_r (1+z)^4 + \Omega_m (1+z)^3 + \Omega_k (1+z)^2 + \Omega_{de}\,(1+z)^{3(1+w_0+w_a)}\, e^{-3 w_a z/(1+z)}`;

export const CLOSURE_TEX = String.raw`\Omega_k = 1 - \Omega_m - \Omega_r - \Omega_{de}, \qquad \Omega_r = \Omega_\gamma \left[1 + N_{\rm eff}\,\tfrac{7}{8}\left(\tfrac{4}{11}\right)^{4/3}\right]`;
