import type { BackgroundModel } from "./backgroundModel.js";
import { massiveNeutrinoDensity } from "./massiveNeutrinoDensity.js";
import { lnEnergyRatio } from "./fermiDiracEnergy.js";

/**
 * E^2(a) = (H/H0)^2 = Omega_r a^-4 + Omega_cb a^-3 + Omega_k a^-2 + Omega_de rho_de(a)/rho_de(1) + rho_nu,massive(a)
 * (Friedmann equation; CPL dark energy, Chevallier & Polarski 2001, Linder 2003), as a function of the model that
 * pays for pow/exp only when the dark energy and the neutrinos need them.
 *
 * One function literal for every kind of model, the kind chosen by a branch inside: the hot loops call E^2 through
 * this closure, and closures of several literals (one per kind, as this once was) made V8 throw away and redo the
 * optimised code of its callers again and again when draws of different kinds of model met (a "wrong feedback
 * cell" loop seen with --trace-deopt). The arithmetic of each kind is unchanged, operation for operation.
 */
export function expansionRateSquared(model: BackgroundModel): (a: number) => number {
  const r = model.Omega_r;
  const m = model.Omega_cb;
  const k = model.Omega_k;
  const de = model.Omega_de;
  const { w0, wa } = model;
  const darkEnergy = de === 0 ? NONE : wa === 0 && w0 === -1 ? CONSTANT : wa === 0 ? POWER : CPL;
  const p = wa === 0 ? -3 * (1 + w0) : -3 * (1 + w0 + wa);
  const q = -3 * wa;
  const list = model.massiveNeutrinos;
  const species = list.length;
  // One species (the common case): its constants captured, no loop (same sum as massiveNeutrinoDensity).
  const o = species === 1 ? list[0].Omega_rel : 0;
  const l = species === 1 ? list[0].lnY0 : 0;
  return (a) => {
    const ia = 1 / a;
    let e2 = ia * ia * (k + ia * (m + ia * r));
    if (darkEnergy === CONSTANT) e2 += de;
    else if (darkEnergy === POWER) e2 += de * Math.exp(p * Math.log(a));
    else if (darkEnergy === CPL) e2 += de * Math.exp(p * Math.log(a) + q * (1 - a));
    if (species === 1) {
      const lnA = Math.log(a);
      e2 += o * Math.exp(lnEnergyRatio(l + lnA) - 4 * lnA);
    } else if (species > 1) e2 += massiveNeutrinoDensity(model, a);
    return e2;
  };
}

/** The kinds of dark energy term in E^2. */
const NONE = 0;
const CONSTANT = 1;
const POWER = 2;
const CPL = 3;
