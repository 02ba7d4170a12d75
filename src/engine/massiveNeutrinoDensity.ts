import type { BackgroundModel } from "./backgroundModel.js";
import { lnEnergyRatio, lnMatterRatio, lnPressureRatio } from "./fermiDiracEnergy.js";

/**
 * rho_nu(a) / rho_crit,0 summed over massive species: Omega_rel a^-4 R(y0 a), R = F(y)/F(0) the Fermi-Dirac energy
 * ratio (exact integral, interpolated; see fermiDiracEnergy.ts). 0 when there are none.
 */
export function massiveNeutrinoDensity(model: BackgroundModel, a: number): number {
  const list = model.massiveNeutrinos;
  if (list.length === 0) return 0;
  const lnA = Math.log(a);
  let sum = 0;
  for (const n of list) sum += n.Omega_rel * Math.exp(lnEnergyRatio(n.lnY0 + lnA) - 4 * lnA);
  return sum;
}

/**
 * The massive neutrinos split into their radiation-like part 3p and matter-like part rho - 3p (`matter`, relative to
 * rho_crit,0), and the acceleration source rho + 3p: rho = Omega_rel a^-4 F(y)/F(0) and 3p = Omega_rel a^-4 P(y)/F(0)
 * (Fermi-Dirac energy and pressure integrals; equivalently 3p/rho = 1 - d ln F / d ln y).
 */
export function massiveNeutrinoParts(
  model: BackgroundModel,
  a: number,
): { rho: number; threeP: number; matter: number } {
  let rho = 0;
  let threeP = 0;
  let matter = 0;
  const lnA = Math.log(a);
  for (const n of model.massiveNeutrinos) {
    const lnY = n.lnY0 + lnA;
    const r = n.Omega_rel * Math.exp(lnEnergyRatio(lnY) - 4 * lnA);
    rho += r;
    // 3p from its own integral (P/F), not from the slope of the energy table: full relative accuracy when p << rho.
    threeP += n.Omega_rel * Math.exp(lnPressureRatio(lnY) - 4 * lnA);
    // rho - 3p from its own integral too (M = F - P as one integrand): where the species is still mostly
    // relativistic it is a small difference of two large numbers, which a subtraction would lose.
    matter += n.Omega_rel * Math.exp(lnMatterRatio(lnY) - 4 * lnA);
  }
  return { rho, threeP, matter };
}
