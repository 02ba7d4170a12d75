import type { BackgroundModel } from "./backgroundModel.js";
import { decelerationSource } from "./decelerationParameter.js";
import { firstNonPositive } from "./scanForSign.js";

/**
 * Redshift at which the present phase of accelerated expansion began (q changed sign from + to -), or null when the
 * model is not accelerating today or has accelerated throughout its past (scanned back to a = e^-170).
 * Flat Lambda-CDM without radiation: (2 Omega_L / Omega_m)^(1/3) - 1.
 */
export function accelerationOnsetRedshift(model: BackgroundModel): number | null {
  if (!(decelerationSource(model, 1) < 0)) return null;
  const g = (u: number) => -decelerationSource(model, Math.exp(u));
  const u = firstNonPositive(g, 0, -12, 0.005) ?? firstNonPositive(g, -12, -170, 0.05);
  return u === null ? null : Math.expm1(-u);
}
