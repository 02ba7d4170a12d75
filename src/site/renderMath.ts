import temml from "temml";

/** TeX to MathML at build time (Temml), so pages need no math script. */
export function renderMath(tex: string, display = true): string {
  return temml.renderToString(tex, { displayMode: display, throwOnError: true });
}

/** The Friedmann equation in the form the engine uses (CPL dark energy, Chevallier & Polarski 2001; Linder 2003). */
export const FRIEDMANN_TEX = String.raw`\frac{H^2(z)}{H_0^2} = \Omega_r (1+z)^4 + \Omega_m (1+z)^3 + \Omega_k (1+z)^2 + \Omega_{de}\,(1+z)^{3(1+w_0+w_a)}\, e^{-3 w_a z/(1+z)}`;

export const CLOSURE_TEX = String.raw`\Omega_k = 1 - \Omega_m - \Omega_r - \Omega_{de}, \qquad \Omega_r = \Omega_\gamma \left[1 + N_{\rm eff}\,\tfrac{7}{8}\left(\tfrac{4}{11}\right)^{4/3}\right]`;

/**
 * With massive neutrinos (the engine's convention, README "Massive neutrinos"): N_nu massive species each carry
 * N_eff/3 of the massless neutrino density and the ratio F(y)/F(0) of Fermi-Dirac energy integrals,
 * y = m_i / (k T_nu,0) / (1 + z); the massless share of radiation is what is left of N_eff.
 */
export const NEUTRINO_TEX = String.raw`\frac{H^2(z)}{H_0^2} = \Omega_\gamma (1+z)^4 \left[1 + \tfrac{7}{8}\left(\tfrac{4}{11}\right)^{4/3} N_{\rm eff}\,\tfrac{3 - N_\nu}{3}\right] + \sum_{i=1}^{N_\nu} \tfrac{N_{\rm eff}}{3}\,\tfrac{7}{8}\left(\tfrac{4}{11}\right)^{4/3} \Omega_\gamma (1+z)^4\,\frac{F(y_i)}{F(0)} + \Omega_{cb} (1+z)^3 + \Omega_k (1+z)^2 + \Omega_{de}\,(\ldots)`;
export const FERMI_DIRAC_TEX = String.raw`F(y) = \int_0^\infty \frac{x^2 \sqrt{x^2 + y^2}}{e^x + 1}\,dx, \qquad y_i = \frac{m_i c^2}{k_B T_{\rm eff}}\,\frac{1}{1+z}, \qquad T_{\rm eff} = \left(\tfrac{4}{11}\right)^{1/3} T_{\rm CMB}\,\tfrac{N_{\rm eff}}{3}\,\kappa, \quad \kappa:\ \Omega_\nu h^2 = \tfrac{\sum m_\nu}{93.14\,{\rm eV}}`;
