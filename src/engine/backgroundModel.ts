import { photonDensityParameter } from "./photonDensityParameter.js";
import { masslessNeutrinoDensityParameter } from "./masslessNeutrinoDensityParameter.js";

/** |Omega_k| at or below this is treated as exactly flat (Omega_k set to 0). */
export const FLATNESS_THRESHOLD = 1e-12;

/** Default CMB temperature today: Fixsen 2009, ApJ 707, 916. */
export const DEFAULT_T_CMB_K = 2.7255;
/** Default effective number of neutrino species: Bennett et al. 2021, JCAP 04, 073. */
export const DEFAULT_N_EFF = 3.044;

export type Geometry = "flat" | "open" | "closed";

/** How the curvature of a model is fixed: exactly one of these. */
export type CurvatureSpec = { kind: "flat" } | { kind: "Omega_k"; Omega_k: number } | { kind: "Omega_de"; Omega_de: number };

/** Radiation: photons at T_cmb plus N_eff massless neutrino species, or none at all. */
export type RadiationSpec = { T_cmb_K: number; N_eff: number } | null;

export interface BackgroundModelInput {
  H0_km_s_Mpc: number;
  Omega_m: number;
  curvature: CurvatureSpec;
  w0: number;
  wa: number;
  radiation: RadiationSpec;
}

/** A fully resolved FLRW background: every density parameter today, closure applied. */
export interface BackgroundModel {
  readonly H0_km_s_Mpc: number;
  readonly Omega_m: number;
  readonly Omega_gamma: number;
  readonly Omega_nu: number;
  /** Omega_gamma + Omega_nu: the radiation density today. */
  readonly Omega_r: number;
  readonly Omega_de: number;
  /** Exactly 0 when |1 - Omega_m - Omega_r - Omega_de| <= FLATNESS_THRESHOLD. */
  readonly Omega_k: number;
  readonly w0: number;
  readonly wa: number;
  /** null when radiation is switched off. */
  readonly T_cmb_K: number | null;
  readonly N_eff: number;
  readonly geometry: Geometry;
}

/** Resolves a model: radiation from T_cmb and N_eff, then curvature or dark energy from closure (Friedmann equation at z = 0). */
export function makeBackgroundModel(input: BackgroundModelInput): BackgroundModel {
  const { H0_km_s_Mpc, Omega_m, w0, wa, radiation } = input;
  const Omega_gamma = radiation ? photonDensityParameter(radiation.T_cmb_K, H0_km_s_Mpc) : 0;
  const Omega_nu = radiation ? masslessNeutrinoDensityParameter(radiation.N_eff, Omega_gamma) : 0;
  const Omega_r = Omega_gamma + Omega_nu;
  let Omega_de: number;
  let Omega_k: number;
  switch (input.curvature.kind) {
    case "flat":
      Omega_de = 1 - Omega_m - Omega_r;
      Omega_k = 0;
      break;
    case "Omega_k":
      Omega_k = input.curvature.Omega_k;
      Omega_de = 1 - Omega_m - Omega_r - Omega_k;
      break;
    case "Omega_de":
      Omega_de = input.curvature.Omega_de;
      Omega_k = 1 - Omega_m - Omega_r - Omega_de;
      break;
  }
  if (Math.abs(Omega_k) <= FLATNESS_THRESHOLD) Omega_k = 0;
  const geometry: Geometry = Omega_k === 0 ? "flat" : Omega_k > 0 ? "open" : "closed";
  return {
    H0_km_s_Mpc,
    Omega_m,
    Omega_gamma,
    Omega_nu,
    Omega_r,
    Omega_de,
    Omega_k,
    w0,
    wa,
    T_cmb_K: radiation ? radiation.T_cmb_K : null,
    N_eff: radiation ? radiation.N_eff : 0,
    geometry,
  };
}
