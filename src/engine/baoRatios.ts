import type { RedshiftColumns } from "./redshiftTable.js";

export const BAO_KEYS = ["D_M_over_r_drag", "D_H_over_r_drag", "D_V_over_r_drag"] as const;
export type BaoColumns = Record<(typeof BAO_KEYS)[number], Float64Array>;

/**
 * The distance ratios BAO analyses quote: D_M / r_drag, D_H / r_drag with D_H(z) = c / H(z), and D_V / r_drag with
 * D_V = [z D_M^2 D_H]^(1/3) (Eisenstein et al. 2005, ApJ 633, 560, eq. 2). NaN everywhere when r_drag is null.
 */
export function baoRatios(columns: RedshiftColumns, rDragMpc: number | null, into?: BaoColumns): BaoColumns {
  const n = columns.z.length;
  // `into`: columns to write over (each n long), for a caller that reuses them from model to model.
  const out: BaoColumns = into ?? {
    D_M_over_r_drag: new Float64Array(n),
    D_H_over_r_drag: new Float64Array(n),
    D_V_over_r_drag: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    if (rDragMpc === null) {
      out.D_M_over_r_drag[i] = out.D_H_over_r_drag[i] = out.D_V_over_r_drag[i] = NaN;
      continue;
    }
    const DM = columns.transverse_comoving_distance_Mpc[i];
    const DH = columns.hubble_radius_Mpc[i];
    out.D_M_over_r_drag[i] = DM / rDragMpc;
    out.D_H_over_r_drag[i] = DH / rDragMpc;
    out.D_V_over_r_drag[i] = Math.cbrt(columns.z[i] * DM * DM * DH) / rDragMpc;
  }
  return out;
}
