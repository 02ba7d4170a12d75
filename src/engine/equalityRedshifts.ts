import type { BackgroundModel } from "./backgroundModel.js";
import { brentRoot } from "./brentRoot.js";
import { darkEnergyDensityRatio } from "./darkEnergyDensity.js";
import { massiveNeutrinoParts } from "./massiveNeutrinoDensity.js";

/** Matter-like density rho_m(a)/rho_crit,0: cold matter and baryons plus the rho - 3p part of massive neutrinos. */
function matterLike(model: BackgroundModel, a: number): number {
  if (model.massiveNeutrinos.length === 0) return model.Omega_cb / a ** 3;
  return model.Omega_cb / a ** 3 + massiveNeutrinoParts(model, a).matter;
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
 * matter, or the densities never cross within 1e-13 < a < 1e13. A model that turns around at `aMax` never reaches
 * a larger scale factor, so the future side is searched only up to it (a crossing beyond it is null: not reached).
 */
export function matterDarkEnergyEqualityRedshift(model: BackgroundModel, aMax: number | null = null): number | null {
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
  // Outward in both directions at once, each side's last value kept. |dh/du| is at most the dark energy's log-slope
  // bound plus 3 (matter-like density falls as a^-3, neutrinos' rho - 3p between a^-2 and a^-3; 0.01 spare), so from
  // a value h the sign cannot change within |h| / bound: grid points inside half that are skipped, except the last
  // (so a crossing is bracketed by the same neighbours). The future side skips only for constant w (the CPL slope
  // 3 wa a grows without bound there).
  const pastBound = Math.abs(3 * (1 + w0 + wa)) + 3 * Math.abs(wa) + 3.01;
  const futureBound = wa === 0 ? Math.abs(3 * (1 + w0)) + 3.01 : Infinity;
  // The future side ends at the turnaround of a recollapsing model (u = ln aMax).
  const futureEnd = aMax === null ? Infinity : Math.log(aMax);
  const reach = (value: number, bound: number) => (Number.isFinite(value) ? (0.5 * Math.abs(value)) / bound : 0);
  let past = h0;
  let future = h0;
  let pastProven = reach(h0, pastBound);
  let futureProven = futureEnd <= 0 ? Infinity : reach(h0, futureBound);
  for (let i = 1; i * step <= 30; i++) {
    const next = (i + 1) * step;
    if (!(next < pastProven)) {
      const uPast = -1 * i * step;
      const hPast = h(uPast);
      if (past > 0 !== hPast > 0 || hPast === 0) return Math.expm1(-brentRoot(h, -1 * (i - 1) * step, uPast, 0));
      past = hPast;
      pastProven = i * step + reach(hPast, pastBound);
    }
    if (!(next < futureProven)) {
      const uFuture = Math.min(1 * i * step, futureEnd);
      const hFuture = h(uFuture);
      if (future > 0 !== hFuture > 0 || hFuture === 0) return Math.expm1(-brentRoot(h, 1 * (i - 1) * step, uFuture, 0));
      future = hFuture;
      futureProven = uFuture >= futureEnd ? Infinity : i * step + reach(hFuture, futureBound);
    }
    if (pastProven > 30 + step && futureProven > 30 + step) return null; // no crossing within the range
  }
  return null;
}
