import type { BackgroundModel } from "./backgroundModel.js";
import { darkEnergyDensityRatio, darkEnergyEquationOfState } from "./darkEnergyDensity.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { massiveNeutrinoParts } from "./massiveNeutrinoDensity.js";

/**
 * 2 q(a) E^2(a) = 2 Omega_r a^-4 + Omega_cb a^-3 + Omega_de f(a) (1 + 3 w(a)) + (rho + 3p)_nu: the acceleration equation
 * a''/a = -(4 pi G / 3) sum (rho + 3p); curvature does not enter. Positive while the expansion decelerates.
 */
export function decelerationSource(model: BackgroundModel, a: number): number {
  const { Omega_r, Omega_cb, Omega_de, w0, wa } = model;
  const de =
    Omega_de === 0 ? 0 : Omega_de * darkEnergyDensityRatio(a, w0, wa) * (1 + 3 * darkEnergyEquationOfState(a, w0, wa));
  let nu = 0;
  if (model.massiveNeutrinos.length > 0) {
    const p = massiveNeutrinoParts(model, a);
    nu = p.rho + p.threeP;
  }
  return (2 * Omega_r) / a ** 4 + Omega_cb / a ** 3 + de + nu;
}

/** Deceleration parameter q = -a a'' / a'^2 at scale factor a (q0 = Omega_r + Omega_m/2 + Omega_de (1 + 3 w0)/2 today). */
export function decelerationParameter(model: BackgroundModel, a = 1): number {
  return decelerationSource(model, a) / (2 * expansionRateSquared(model)(a));
}
