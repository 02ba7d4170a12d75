import { closest, distance } from "fastest-levenshtein";
import type { RowKey, SummaryKey, TargetKey } from "../contract/tablesDocument.js";

/**
 * The quantities `quote` prints: a short name of our own, the contract key (per-redshift row, target row or today's
 * summary), a label and a unit. Short names follow trade notation where it exists (D_A, D_L, mu).
 */
export interface QuoteQuantity {
  short: string;
  label: string;
  unit: string;
  row?: RowKey;
  target?: TargetKey;
  summary?: SummaryKey;
}

export const QUOTE_QUANTITIES: QuoteQuantity[] = [
  { short: "z", label: "Redshift", unit: "", row: "z", target: "z" },
  {
    short: "D_C",
    label: "Comoving distance D_C",
    unit: "Mpc",
    row: "comoving_distance_Mpc",
    target: "comoving_distance_Mpc",
  },
  { short: "D_M", label: "Transverse comoving distance D_M", unit: "Mpc", row: "transverse_comoving_distance_Mpc" },
  {
    short: "D_A",
    label: "Angular-diameter distance D_A",
    unit: "Mpc",
    row: "angular_diameter_distance_Mpc",
    target: "angular_diameter_distance_Mpc",
  },
  {
    short: "D_L",
    label: "Luminosity distance D_L",
    unit: "Mpc",
    row: "luminosity_distance_Mpc",
    target: "luminosity_distance_Mpc",
  },
  { short: "mu", label: "Distance modulus", unit: "mag", row: "distance_modulus_mag", target: "distance_modulus_mag" },
  {
    short: "scale",
    label: "Proper scale",
    unit: "kpc/arcsec",
    row: "kpc_per_arcsec_proper",
    target: "kpc_per_arcsec_proper",
  },
  { short: "scale_comoving", label: "Comoving scale", unit: "kpc/arcsec", row: "kpc_per_arcsec_comoving" },
  {
    short: "lookback",
    label: "Lookback time",
    unit: "Gyr",
    row: "lookback_time_Gyr",
    target: "lookback_time_Gyr",
  },
  { short: "age", label: "Age at z", unit: "Gyr", row: "age_Gyr", target: "age_Gyr" },
  { short: "light_travel", label: "Light-travel distance", unit: "Gly", row: "light_travel_distance_Gly" },
  { short: "V_C", label: "Comoving volume inside z (full sky)", unit: "Gpc^3", row: "comoving_volume_Gpc3" },
  { short: "dV", label: "dV_C/dz/dOmega", unit: "Mpc^3/sr", row: "comoving_volume_element_Mpc3_sr" },
  { short: "H", label: "Hubble rate H(z)", unit: "km/s/Mpc", row: "H_km_s_Mpc" },
  { short: "E", label: "E(z) = H/H0", unit: "", row: "E" },
  { short: "Omega_m_z", label: "Omega_m(z)", unit: "", row: "Omega_m_z" },
  { short: "hubble_radius", label: "Hubble radius c/H(z)", unit: "Mpc", row: "hubble_radius_Mpc" },
  { short: "horizon", label: "Comoving particle horizon at z", unit: "Mpc", row: "particle_horizon_Mpc" },
  { short: "size", label: "Angular size of size_kpc", unit: "arcsec", target: "angular_size_arcsec" },
  { short: "mag", label: "Apparent magnitude (no K-corr.)", unit: "mag", target: "apparent_magnitude" },
  { short: "flux", label: "Bolometric flux", unit: "erg/s/cm^2", target: "bolometric_flux_erg_s_cm2" },
  { short: "age0", label: "Age today", unit: "Gyr", summary: "age_Gyr" },
  { short: "q0", label: "Deceleration parameter q0", unit: "", summary: "deceleration_q0" },
  { short: "R_curv", label: "Curvature radius", unit: "Mpc", summary: "curvature_radius_Mpc" },
  { short: "horizon0", label: "Comoving particle horizon today", unit: "Mpc", summary: "particle_horizon_Mpc" },
];

export { DEFAULT_QUOTE_QUANTITIES } from "./quoteHelp.js";

/** Thrown for a quantity name that is neither a short name nor a contract key. */
export class UnknownQuantityError extends Error {}

/** The quantities named (short names or contract keys, in the order given), or an error with a did-you-mean. */
export function resolveQuantities(names: string[]): QuoteQuantity[] {
  const all = QUOTE_QUANTITIES.flatMap((q) => [q.short, q.row, q.target].filter((n): n is string => !!n));
  return names.map((name) => {
    const q = QUOTE_QUANTITIES.find((x) => x.short === name || x.row === name || x.target === name);
    if (q) return q;
    const sameLetters = all.find((n) => n.toLowerCase() === name.toLowerCase());
    const near = sameLetters ?? closest(name, all);
    const hint =
      distance(name.toLowerCase(), near.toLowerCase()) <= Math.max(2, Math.floor(name.length / 3))
        ? ` did you mean ${near}?`
        : "";
    throw new UnknownQuantityError(
      `unknown quantity "${name}".${hint} Valid: ${QUOTE_QUANTITIES.map((x) => x.short).join(", ")} (or their contract keys)`,
    );
  });
}
