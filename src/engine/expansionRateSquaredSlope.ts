import type { BackgroundModel } from "./backgroundModel.js";
import { darkEnergyDensityRatio } from "./darkEnergyDensity.js";

/** dE^2/da, differentiating the Friedmann equation term by term (CPL: d ln f / da = -3 (1 + w0 + wa)/a + 3 wa). */
export function expansionRateSquaredSlope(model: BackgroundModel, a: number): number {
  const { Omega_r, Omega_m, Omega_k, Omega_de, w0, wa } = model;
  const f = Omega_de === 0 ? 0 : darkEnergyDensityRatio(a, w0, wa);
  const dlnf = -3 * (1 + w0 + wa) / a + 3 * wa;
  return -4 * Omega_r / a ** 5 - 3 * Omega_m / a ** 4 - 2 * Omega_k / a ** 3 + Omega_de * f * dlnf;
}
