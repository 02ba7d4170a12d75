import { closest, distance } from "fastest-levenshtein";
import type { RowKey, SummaryKey, TargetKey } from "../contract/tablesDocument.js";
import {
  REDSHIFT_GROUPS,
  SUMMARY_QUANTITIES,
  TARGET_QUANTITIES,
  type QuantityInfo,
} from "../contract/quantityCatalog.js";

export interface QuoteQuantity {
  short: string;
  /** The catalogue's label and unit (src/contract/quantityCatalog.ts), the words of the pages and exports. */
  label: string;
  unit: string;
  row?: RowKey;
  target?: TargetKey;
  summary?: SummaryKey;
}

type Source = Omit<QuoteQuantity, "label" | "unit">;

/** The short names of our own, each with the contract keys it reads (per-redshift row, target row or summary). */
const SOURCES: Source[] = [
  { short: "z", row: "z", target: "z" },
  { short: "D_C", row: "comoving_distance_Mpc", target: "comoving_distance_Mpc" },
  { short: "D_M", row: "transverse_comoving_distance_Mpc" },
  { short: "D_A", row: "angular_diameter_distance_Mpc", target: "angular_diameter_distance_Mpc" },
  { short: "D_L", row: "luminosity_distance_Mpc", target: "luminosity_distance_Mpc" },
  { short: "mu", row: "distance_modulus_mag", target: "distance_modulus_mag" },
  { short: "scale", row: "kpc_per_arcsec_proper", target: "kpc_per_arcsec_proper" },
  { short: "scale_comoving", row: "kpc_per_arcsec_comoving" },
  { short: "lookback", row: "lookback_time_Gyr", target: "lookback_time_Gyr" },
  { short: "age", row: "age_Gyr", target: "age_Gyr" },
  { short: "light_travel", row: "light_travel_distance_Mpc" },
  { short: "V_C", row: "comoving_volume_Gpc3" },
  { short: "dV", row: "comoving_volume_element_Mpc3_sr" },
  { short: "H", row: "H_km_s_Mpc" },
  { short: "E", row: "E" },
  { short: "Omega_m_z", row: "Omega_m_z" },
  { short: "hubble_radius", row: "hubble_radius_Mpc" },
  { short: "horizon", row: "particle_horizon_Mpc" },
  { short: "D", row: "growth_factor", target: "growth_factor" },
  { short: "f", row: "growth_rate", target: "growth_rate" },
  { short: "sigma8_z", row: "sigma8_z", target: "sigma8_z" },
  { short: "fsigma8", row: "f_sigma8", target: "f_sigma8" },
  { short: "size", target: "angular_size_arcsec" },
  { short: "mag", target: "apparent_magnitude" },
  { short: "flux", target: "bolometric_flux_erg_s_cm2" },
  { short: "age0", summary: "age_Gyr" },
  { short: "q0", summary: "deceleration_q0" },
  { short: "R_curv", summary: "curvature_radius_Mpc" },
  { short: "horizon0", summary: "particle_horizon_Mpc" },
  { short: "f0", summary: "growth_rate_0" },
  { short: "S8", summary: "S8" },
];

/** A quantity's catalogue entry: the per-redshift tables first, then today's quantities, then the targets'. */
function catalogueEntry(q: Source): QuantityInfo {
  const all: QuantityInfo[] = q.row
    ? REDSHIFT_GROUPS.flatMap((g) => g.quantities)
    : q.summary
      ? SUMMARY_QUANTITIES
      : TARGET_QUANTITIES;
  const key = q.row === "z" ? undefined : (q.row ?? q.summary ?? q.target);
  const found = key === undefined ? TARGET_QUANTITIES.find((x) => x.key === "z") : all.find((x) => x.key === key);
  if (!found) throw new Error(`quote quantity ${q.short} has no catalogue entry`);
  return found;
}

/**
 * The quantities `quote` prints: a short name of our own and the contract keys it reads, labelled and united by the
 * catalogue, so that a quote and a page name a quantity in the same words. Short names follow trade notation where
 * it exists (D_A, D_L, mu).
 */
export const QUOTE_QUANTITIES: QuoteQuantity[] = SOURCES.map((q) => {
  const { label, unit } = catalogueEntry(q);
  return { ...q, label, unit };
});

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
