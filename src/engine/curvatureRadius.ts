import type { BackgroundModel } from "./backgroundModel.js";
import { hubbleDistanceMpc } from "./hubbleScales.js";

/** Comoving curvature radius today R = c / (H0 sqrt|Omega_k|) in Mpc (Hogg 1999, eq. 16); null when flat. */
export function curvatureRadiusMpc(model: BackgroundModel): number | null {
  if (model.Omega_k === 0) return null;
  return hubbleDistanceMpc(model.H0_km_s_Mpc) / Math.sqrt(Math.abs(model.Omega_k));
}
