import type { BackgroundModel } from "./backgroundModel.js";
import { massiveNeutrinoDensity } from "./massiveNeutrinoDensity.js";
import { lnEnergyRatio } from "./fermiDiracEnergy.js";

/**
 * E^2(a) = (H/H0)^2 = Omega_r a^-4 + Omega_cb a^-3 + Omega_k a^-2 + Omega_de rho_de(a)/rho_de(1) + rho_nu,massive(a)
 * (Friedmann equation; CPL dark energy, Chevallier & Polarski 2001, Linder 2003), as a function specialised
 * to the model so that the hot loops pay for pow/exp only when the dark energy needs them.
 */
export function expansionRateSquared(model: BackgroundModel): (a: number) => number {
  const base = withoutMassiveNeutrinos(model);
  const list = model.massiveNeutrinos;
  if (list.length === 0) return base;
  if (list.length === 1) {
    // One species (the common case): its constants captured, no loop (same sum as massiveNeutrinoDensity).
    const { Omega_rel: o, lnY0: l } = list[0];
    return (a) => {
      const lnA = Math.log(a);
      return base(a) + o * Math.exp(lnEnergyRatio(l + lnA) - 4 * lnA);
    };
  }
  return (a) => base(a) + massiveNeutrinoDensity(model, a);
}

function withoutMassiveNeutrinos(model: BackgroundModel): (a: number) => number {
  const r = model.Omega_r;
  const m = model.Omega_cb;
  const k = model.Omega_k;
  const de = model.Omega_de;
  const { w0, wa } = model;
  if (de === 0) {
    return (a) => {
      const ia = 1 / a;
      return ia * ia * (k + ia * (m + ia * r));
    };
  }
  if (wa === 0 && w0 === -1) {
    return (a) => {
      const ia = 1 / a;
      return ia * ia * (k + ia * (m + ia * r)) + de;
    };
  }
  if (wa === 0) {
    const p = -3 * (1 + w0);
    return (a) => {
      const ia = 1 / a;
      return ia * ia * (k + ia * (m + ia * r)) + de * Math.exp(p * Math.log(a));
    };
  }
  const p = -3 * (1 + w0 + wa);
  const q = -3 * wa;
  return (a) => {
    const ia = 1 / a;
    return ia * ia * (k + ia * (m + ia * r)) + de * Math.exp(p * Math.log(a) + q * (1 - a));
  };
}
