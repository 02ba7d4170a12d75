/** Omega_nu of N_eff massless species: N_eff (7/8) (4/11)^(4/3) Omega_gamma (instantaneous-decoupling temperature ratio; e.g. Weinberg 2008, Cosmology, sec. 3.1). */
export function masslessNeutrinoDensityParameter(N_eff: number, Omega_gamma: number): number {
  return N_eff * (7 / 8) * (4 / 11) ** (4 / 3) * Omega_gamma;
}
