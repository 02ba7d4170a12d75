import { CONSTANTS, MPC_M } from "./constants.js";

/**
 * Omega_gamma today for a blackbody at T_cmb_K: rho_gamma = (pi^2/15) (k T)^4 / (hbar c)^3 (Stefan-Boltzmann law),
 * divided by the critical energy density 3 H0^2 c^2 / (8 pi G) (Friedmann equation).
 */
export function photonDensityParameter(T_cmb_K: number, H0_km_s_Mpc: number): number {
  const k = CONSTANTS.boltzmann_constant.value;
  const hbar = CONSTANTS.planck_constant.value / (2 * Math.PI);
  const c = CONSTANTS.speed_of_light.value;
  const G = CONSTANTS.gravitational_constant.value;
  const kT = k * T_cmb_K;
  const rhoGamma_J_m3 = ((Math.PI ** 2 / 15) * kT ** 4) / (hbar * c) ** 3;
  const H0_s = (H0_km_s_Mpc * 1000) / MPC_M;
  const rhoCrit_J_m3 = (3 * H0_s * H0_s * c * c) / (8 * Math.PI * G);
  return rhoGamma_J_m3 / rhoCrit_J_m3;
}
