import type { BackgroundModel } from "./backgroundModel.js";
import { brentRoot } from "./brentRoot.js";
import { darkEnergyDensityRatio } from "./darkEnergyDensity.js";
import { massiveNeutrinoParts } from "./massiveNeutrinoDensity.js";

/** Matter-like density rho_m(a)/rho_crit,0: cold matter and baryons plus the rho - 3p part of massive neutrinos. */
function matterLike(model: BackgroundModel, a: number): number {
  if (model.massiveNeutrinos.length === 0) return model.Omega_cb / a ** 3;
  const nu = massiveNeutrinoParts(model, a);
  return model.Omega_cb / a ** 3 + nu.rho - nu.threeP;
}

/** Radiation-like density: photons, massless neutrinos and the 3p part of massive neutrinos. */
function radiationLike(model: BackgroundModel, a: number): number {
  if (model.massiveNeutrinos.length === 0) return model.Omega_r / a ** 4;
  return model.Omega_r / a ** 4 + massiveNeutrinoParts(model, a).threeP;
}

/**
 * Matter-radiation equality, neutrinos counted as radiation while relativistic (their 3p) and as matter once not
 * (their rho - 3p). Without massive neutrinos: 1 + z = Omega_m / Omega_r exactly. null without radiation or matter.
 */
export function matterRadiationEqualityRedshift(model: BackgroundModel): number | null {
  if (model.Omega_m <= 0 || (model.Omega_r <= 0 && model.massiveNeutrinos.length === 0)) return null;
  if (model.massiveNeutrinos.length === 0) return model.Omega_m / model.Omega_r - 1;
  const g = (u: number) => Math.log(matterLike(model, Math.exp(u))) - Math.log(radiationLike(model, Math.exp(u)));
  // Bracket around the massless estimate; the ratio is monotonic in a.
  const rTotal = model.Omega_r + model.massiveNeutrinos.reduce((s, n) => s + n.Omega_rel, 0);
  const guess = Math.log(rTotal / model.Omega_cb);
  let lo = guess - 1;
  let hi = guess + 1;
  while (g(lo) > 0) lo -= 1;
  while (g(hi) < 0) hi += 1;
  return Math.expm1(-brentRoot(g, lo, hi, 1e-15));
}

/**
 * Redshift where the matter-like density equals the CPL dark-energy density (Chevallier & Polarski 2001), the
 * crossing nearest today in ln a; negative when it lies in the future. null when Omega_de <= 0, there is no
 * matter, or the densities never cross within 1e-13 < a < 1e13.
 */
export function matterDarkEnergyEqualityRedshift(model: BackgroundModel): number | null {
  const { Omega_m, Omega_de, w0, wa } = model;
  if (Omega_de <= 0 || Omega_m <= 0) return null;
  // ln(rho_de / rho_m) as a function of u = ln a.
  const h = (u: number) => {
    const a = Math.exp(u);
    return Math.log(Omega_de * darkEnergyDensityRatio(a, w0, wa)) - Math.log(matterLike(model, a));
  };
  const h0 = h(0);
  if (h0 === 0) return 0;
  const step = 0.005;
  // Outward in both directions at once, each side's last value kept (every grid point evaluated once).
  let past = h0;
  let future = h0;
  for (let i = 1; i * step <= 30; i++) {
    const uPast = -1 * i * step;
    const hPast = h(uPast);
    if (past > 0 !== hPast > 0 || hPast === 0) return Math.expm1(-brentRoot(h, -1 * (i - 1) * step, uPast, 0));
    past = hPast;
    const uFuture = 1 * i * step;
    const hFuture = h(uFuture);
    if (future > 0 !== hFuture > 0 || hFuture === 0) return Math.expm1(-brentRoot(h, 1 * (i - 1) * step, uFuture, 0));
    future = hFuture;
  }
  return null;
}
