import type { BackgroundModel } from "./backgroundModel.js";
import { brentRoot } from "./brentRoot.js";

/** Matter-radiation equality 1 + z = Omega_m / Omega_r (all radiation massless); null without radiation or matter. */
export function matterRadiationEqualityRedshift(model: BackgroundModel): number | null {
  if (model.Omega_r <= 0 || model.Omega_m <= 0) return null;
  return model.Omega_m / model.Omega_r - 1;
}

/**
 * Redshift where rho_m = rho_de (CPL density, Chevallier & Polarski 2001), the crossing nearest today in ln a;
 * negative when it lies in the future. null when Omega_de <= 0, Omega_m <= 0 or the densities never cross
 * within 1e-13 < a < 1e13.
 */
export function matterDarkEnergyEqualityRedshift(model: BackgroundModel): number | null {
  const { Omega_m, Omega_de, w0, wa } = model;
  if (Omega_de <= 0 || Omega_m <= 0) return null;
  // ln(rho_de / rho_m) as a function of u = ln a.
  const h = (u: number) => Math.log(Omega_de / Omega_m) - 3 * (w0 + wa) * u - 3 * wa * (1 - Math.exp(u));
  const h0 = h(0);
  if (h0 === 0) return 0;
  const step = 0.005;
  for (let i = 1; i * step <= 30; i++) {
    for (const dir of [-1, 1]) {
      const u0 = dir * (i - 1) * step;
      const u1 = dir * i * step;
      if (h(u0) > 0 !== h(u1) > 0 || h(u1) === 0) {
        const u = brentRoot(h, u0, u1, 0);
        return Math.expm1(-u);
      }
    }
  }
  return null;
}
