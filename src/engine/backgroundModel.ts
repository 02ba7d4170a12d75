import { photonDensityParameter } from "./photonDensityParameter.js";
import { masslessNeutrinoDensityParameter } from "./masslessNeutrinoDensityParameter.js";
import { CONSTANTS } from "./constants.js";
import { FD_ENERGY_MASSLESS, FD_NUMBER, lnEnergyRatio } from "./fermiDiracEnergy.js";

/** |Omega_k| at or below this is treated as exactly flat (Omega_k set to 0). */
export const FLATNESS_THRESHOLD = 1e-12;

/** Default CMB temperature today: Fixsen 2009, ApJ 707, 916. */
export const DEFAULT_T_CMB_K = 2.7255;
/** Default effective number of neutrino species: Bennett et al. 2021, JCAP 04, 073. */
export const DEFAULT_N_EFF = 3.044;

export type Geometry = "flat" | "open" | "closed";

/** How the curvature of a model is fixed: exactly one of these. */
export type CurvatureSpec =
  | { kind: "flat" }
  | { kind: "Omega_k"; Omega_k: number }
  | { kind: "Omega_de"; Omega_de: number };

/** Radiation: photons at T_cmb plus N_eff massless neutrino species, or none at all. */
export type RadiationSpec = { T_cmb_K: number; N_eff: number } | null;

/** Baryon density today, as a fraction of critical or as the physical density omega_b = Omega_b h^2. */
export type BaryonSpec = { Omega_b: number } | { omega_b: number } | null;

export interface BackgroundModelInput {
  H0_km_s_Mpc: number;
  /** All non-relativistic matter today, massive neutrinos included. */
  Omega_m: number;
  curvature: CurvatureSpec;
  w0: number;
  wa: number;
  radiation: RadiationSpec;
  baryons?: BaryonSpec;
  /** Masses of the massive neutrino species in eV (at most 3; zeros count as massless). */
  m_nu_eV?: readonly number[];
}

/** One massive neutrino species: its massless-equivalent density today and ln y0 = ln(m c^2 / k T_nu0). */
export interface MassiveNeutrino {
  readonly m_eV: number;
  /** (N_eff/3) (7/8) (4/11)^(4/3) Omega_gamma: the density it would have today if it were massless. */
  readonly Omega_rel: number;
  readonly lnY0: number;
}

/** A fully resolved FLRW background: every density parameter today, closure applied. */
export interface BackgroundModel {
  readonly H0_km_s_Mpc: number;
  /** All non-relativistic matter today: Omega_cb + Omega_nu_massive. */
  readonly Omega_m: number;
  /** Cold dark matter plus baryons: the part that scales exactly as a^-3. */
  readonly Omega_cb: number;
  /** Baryons today, or null when not given. */
  readonly Omega_b: number | null;
  readonly Omega_gamma: number;
  /** Massless neutrino species today. */
  readonly Omega_nu: number;
  /** Massive neutrino species today (exact Fermi-Dirac density). */
  readonly Omega_nu_massive: number;
  readonly massiveNeutrinos: readonly MassiveNeutrino[];
  /** Neutrino temperature today (4/11)^(1/3) T_cmb, K; null without radiation. */
  readonly T_nu_K: number | null;
  /** Omega_gamma + Omega_nu: the radiation that is relativistic today (used in closure). */
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

/** sum m / (Omega_nu h^2) in the non-relativistic limit that the trade quotes (Mangano et al. 2005), in eV. */
export const NU_MASS_PER_OMEGA_H2_EV = 93.14;

/**
 * kappa = 93.14 eV / D, where D = sum m / (Omega_nu h^2) of one species at T_nu = (4/11)^(1/3) 2.7255 K carrying the
 * full relativistic density of one species: D = F(0) k T_nu / ((7/8) (4/11)^(4/3) Omega_gamma h^2 (3 zeta(3)/2)),
 * about 94.06 eV from the CODATA constants (so kappa is about 0.99018).
 */
export const NR_CONVENTION_KAPPA = (() => {
  const T_cmb = 2.7255;
  const Omega_gamma_h2 = photonDensityParameter(T_cmb, 100);
  const kT_nu_eV = (CONSTANTS.boltzmann_constant.value * Math.cbrt(4 / 11) * T_cmb) / CONSTANTS.electron_volt.value;
  const perSpeciesH2 = (7 / 8) * (4 / 11) ** (4 / 3) * Omega_gamma_h2;
  const D = 1 / ((perSpeciesH2 * (FD_NUMBER / FD_ENERGY_MASSLESS)) / kT_nu_eV);
  return NU_MASS_PER_OMEGA_H2_EV / D;
})();

/** Resolves a model: radiation from T_cmb and N_eff, then curvature or dark energy from closure (Friedmann equation at z = 0). */
export function makeBackgroundModel(input: BackgroundModelInput): BackgroundModel {
  const { H0_km_s_Mpc, Omega_m, w0, wa, radiation } = input;
  const Omega_gamma = radiation ? photonDensityParameter(radiation.T_cmb_K, H0_km_s_Mpc) : 0;
  const masses = (input.m_nu_eV ?? []).filter((m) => m > 0);
  if (masses.length > 3) throw new RangeError("at most three neutrino species can be massive");
  if (masses.length > 0 && !radiation)
    throw new RangeError("massive neutrinos need thermal radiation (their temperature follows T_cmb)");
  // Convention (README, "Massive neutrinos"): each massive species carries N_eff/3 of the early relativistic
  // neutrino density and turns non-relativistic following the exact Fermi-Dirac integrals, at an effective
  // temperature T_eff = T_nu (N_eff/3) kappa, T_nu = (4/11)^(1/3) T_cmb. Relativistic: rho ~ Omega_rel a^-4, so the
  // N_eff/3 share is kept; non-relativistic: rho ~ Omega_rel (3 zeta(3)/2) / F(0) m / (k T_eff), so kappa sets
  // Omega_nu h^2 = sum m / 93.14 eV at T_cmb = 2.7255 K (Mangano et al. 2005; Lesgourgues & Pastor 2006).
  // The massless species share the rest.
  const perSpecies = radiation ? masslessNeutrinoDensityParameter(radiation.N_eff / 3, Omega_gamma) : 0;
  const Omega_nu = radiation ? perSpecies * (3 - masses.length) : 0;
  const T_nu_K = radiation ? Math.cbrt(4 / 11) * radiation.T_cmb_K : null;
  const lnTeffOverTnu = radiation ? Math.log((radiation.N_eff / 3) * NR_CONVENTION_KAPPA) : 0;
  // Built by push, not Array.prototype.map: once V8 optimises this function its inlined map makes a holey array
  // where the builtin makes a packed one, and every engine function that reads the list would meet a second array
  // shape and throw its optimised code away (seen with --trace-deopt on the spread benchmark).
  const massiveNeutrinos: MassiveNeutrino[] = [];
  for (const m of masses)
    massiveNeutrinos.push({
      m_eV: m,
      Omega_rel: perSpecies,
      lnY0:
        Math.log((m * CONSTANTS.electron_volt.value) / (CONSTANTS.boltzmann_constant.value * T_nu_K!)) - lnTeffOverTnu,
    });
  const Omega_nu_massive = massiveNeutrinos.reduce((sum, n) => sum + n.Omega_rel * Math.exp(lnEnergyRatio(n.lnY0)), 0);
  const Omega_cb = Omega_m - Omega_nu_massive;
  if (Omega_cb < 0)
    throw new RangeError(
      `Omega_m = ${Omega_m} is smaller than the massive-neutrino density ${Omega_nu_massive.toPrecision(4)}`,
    );
  const h = H0_km_s_Mpc / 100;
  const b = input.baryons ?? null;
  const Omega_b = b === null ? null : "Omega_b" in b ? b.Omega_b : b.omega_b / (h * h);
  if (Omega_b !== null && Omega_b > Omega_cb)
    throw new RangeError(
      `Omega_b = ${Omega_b.toPrecision(6)} exceeds the cold matter plus baryons ${Omega_cb.toPrecision(6)}`,
    );
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
    Omega_cb,
    Omega_b,
    Omega_gamma,
    Omega_nu,
    Omega_nu_massive,
    massiveNeutrinos,
    T_nu_K,
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

// V8 gives each field of these objects the representation of the first value stored in it: an integer (w0 = -1,
// Omega_k = 0) fixes the field as a small integer, and the first fractional value met later (another model, a
// draw of a spread) moves every model object to a new shape, so the optimised code of every engine function that
// reads models is thrown away and compiled again (several times per run: --trace-deopt, "wrong map"). Two models
// made here, at load, give every field its final representation (a double, or either a double or null) before
// any code is optimised. Their values are arbitrary and the objects are dropped.
const FRACTIONAL: BackgroundModelInput = {
  H0_km_s_Mpc: 67.5,
  Omega_m: 0.3,
  curvature: { kind: "Omega_k", Omega_k: 0.01 },
  w0: -0.9,
  wa: 0.1,
  radiation: null,
};
makeBackgroundModel(FRACTIONAL);
makeBackgroundModel({
  ...FRACTIONAL,
  radiation: { T_cmb_K: 2.5, N_eff: 3.5 },
  baryons: { Omega_b: 0.05 },
  m_nu_eV: [0.5],
});
