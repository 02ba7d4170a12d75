import { FLATNESS_THRESHOLD, type BackgroundModel } from "../../src/engine/index.js";

/** A background model given directly by its density parameters (for closed-form checks and fixtures). */
export function modelOf(p: {
  H0?: number;
  Om: number;
  Or?: number;
  Ok?: number;
  Ode?: number;
  w0?: number;
  wa?: number;
}): BackgroundModel {
  const Or = p.Or ?? 0;
  const Ode = p.Ode ?? 1 - p.Om - Or - (p.Ok ?? 0);
  const OkRaw = p.Ok ?? 1 - p.Om - Or - Ode;
  const Ok = Math.abs(OkRaw) <= FLATNESS_THRESHOLD ? 0 : OkRaw; // the engine's flatness rule
  return {
    H0_km_s_Mpc: p.H0 ?? 70,
    Omega_m: p.Om,
    Omega_cb: p.Om,
    Omega_b: null,
    Omega_gamma: Or,
    Omega_nu: 0,
    Omega_nu_massive: 0,
    massiveNeutrinos: [],
    T_nu_K: null,
    Omega_r: Or,
    Omega_de: Ode,
    Omega_k: Ok,
    w0: p.w0 ?? -1,
    wa: p.wa ?? 0,
    T_cmb_K: null,
    N_eff: 0,
    geometry: Ok === 0 ? "flat" : Ok > 0 ? "open" : "closed",
  };
}

/** |actual - expected| / |expected|. */
export function relErr(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}
