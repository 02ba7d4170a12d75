import type { BackgroundModel } from "./backgroundModel.js";
import { decelerationSource } from "./decelerationParameter.js";
import { firstNonPositive, positiveReach } from "./scanForSign.js";
import { massiveNeutrinoParts } from "./massiveNeutrinoDensity.js";

/**
 * Redshift at which the present phase of accelerated expansion began (q changed sign from + to -), or null when the
 * model is not accelerating today or has accelerated throughout its past (scanned back to a = e^-170).
 * Flat Lambda-CDM without radiation: (2 Omega_L / Omega_m)^(1/3) - 1.
 */
export function accelerationOnsetRedshift(model: BackgroundModel): number | null {
  if (!(decelerationSource(model, 1) < 0)) return null;
  const g = (u: number) => -decelerationSource(model, Math.exp(u));
  const reach = model.wa === 0 ? (u: number) => accelerationReach(model, u) : undefined;
  const u = firstNonPositive(g, 0, -12, 0.005, reach) ?? firstNonPositive(g, -12, -170, 0.05, reach);
  return u === null ? null : Math.expm1(-u);
}

/**
 * For constant w: how far back from ln a = u the acceleration lasts for certain. -(source) is a sum of terms of fixed
 * sign, radiation -2 Omega_r a^-4, matter -Omega_cb a^-3, massive neutrinos -(rho + 3p) (log-slope between -4 and -3;
 * 0.01 more for interpolation) and dark energy -Omega_de (1 + 3 w0) a^(-3 (1 + w0)) (acceleration equation).
 */
function accelerationReach(model: BackgroundModel, u: number): number {
  const a = Math.exp(u);
  const nu = model.massiveNeutrinos.length > 0 ? massiveNeutrinoParts(model, a) : null;
  const terms = [
    -2 * model.Omega_r * a ** -4,
    -model.Omega_cb * a ** -3,
    nu ? -(nu.rho + nu.threeP) : 0,
    model.Omega_de === 0 ? 0 : -model.Omega_de * (1 + 3 * model.w0) * a ** (-3 * (1 + model.w0)),
  ];
  let P = 0;
  let N = 0;
  for (const t of terms) {
    if (t > 0) P += t;
    else N -= t;
  }
  return positiveReach(P, N, Math.max(4.01, Math.abs(3 * (1 + model.w0))));
}
