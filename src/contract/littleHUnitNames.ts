/**
 * How a quantity scales when lengths are quoted in h^-1 Mpc (h = H0 / 100 km/s/Mpc, each model its own): a length
 * L in Mpc is h L in h^-1 Mpc, a volume V in Mpc^3 (or Gpc^3) is h^3 V in h^-3 Mpc^3, a wavenumber in 1/Mpc is k/h
 * in h Mpc^-1, a number density per Mpc^3 is n/h^3 in h^3 Mpc^-3 (common practice in survey and large-scale-structure
 * work). Dimensionless ratios, times, magnitudes, redshifts and H(z) in km/s/Mpc are unchanged. The power of h by unit:
 */
const H_POWER: Record<string, number> = {
  Mpc: 1,
  kpc: 1,
  "kpc/arcsec": 1,
  "Gpc^3": 3,
  "Mpc^3": 3,
  "Mpc^3/sr": 3,
  "1/Mpc": -1,
  "1/Mpc^3": -3,
};

/** The power of h that converts a quantity in `unit` to h units (0: the quantity does not scale with h). */
export const hPowerOfUnit = (unit: string): number => H_POWER[unit] ?? 0;

/**
 * The power of h of a tables-document key, read from the unit in its name (comoving_distance_Mpc: 1; ..._Gpc3: 3;
 * k_eq_1_Mpc: -1; H_km_s_Mpc: 0). The one place that decides which stored numbers scale with h.
 */
export function hPowerOfKey(key: string): number {
  if (/km_s_Mpc$/.test(key)) return 0; // H(z) stays in km/s/Mpc
  if (/_per_Mpc3$/.test(key)) return -3;
  if (/_1_Mpc$/.test(key)) return -1;
  if (/_Mpc3(_sr)?$/.test(key) || /_Gpc3$/.test(key)) return 3;
  if (/_Mpc$/.test(key) || /_kpc$/.test(key) || /^kpc_per_arcsec/.test(key)) return 1;
  return 0;
}

/** The unit as written in h units: Mpc -> h^-1 Mpc, Gpc^3 -> h^-3 Gpc^3, 1/Mpc -> h/Mpc. */
export function littleHUnit(unit: string): string {
  const p = H_POWER[unit];
  if (p === undefined) return unit;
  if (p === -1) return `h/${unit.slice(2)}`;
  if (p === -3) return `h^3/${unit.slice(2)}`;
  return `h^-${p} ${unit}`;
}

/** Whether a document's scenario asks for lengths in h^-1 Mpc (`h_units: true`, format 3 on). */
export const wantsLittleHUnits = (doc: object) =>
  "inputs" in doc && (doc.inputs as { h_units?: boolean } | undefined)?.h_units === true;
