import { C_KM_S, GYR_S, MPC_KM } from "./constants.js";

/** Hubble distance D_H = c / H0 in Mpc (Hogg 1999, eq. 4). */
export function hubbleDistanceMpc(H0_km_s_Mpc: number): number {
  return C_KM_S / H0_km_s_Mpc;
}

/** Hubble time t_H = 1 / H0 in Gyr (Hogg 1999, eq. 3). */
export function hubbleTimeGyr(H0_km_s_Mpc: number): number {
  return MPC_KM / H0_km_s_Mpc / GYR_S;
}
