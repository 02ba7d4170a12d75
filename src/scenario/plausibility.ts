import type { ResolvedModelInputs } from "./resolvedScenario.js";

/** A value that is valid but probably not what was meant: the key it concerns and the words of the warning. */
export interface PlausibilityWarning {
  key: string;
  message: string;
}

/** The present-day CMB temperature (Fixsen 2009, ApJ 707, 916): 2.72548 +- 0.00057 K. */
const T_CMB_FIXSEN_K = 2.7255;

/**
 * Values a careful cosmologist would question (common practice, the ranges named in each message): H0 outside
 * 20 to 150 km/s/Mpc (0.7 is h, not H0), omega_b above 0.05 or Omega_b below 0.03 (the physical density
 * Omega_b h^2 is about 0.022; Omega_b about 0.049), baryons above all matter, and T_cmb far from 2.7255 K.
 * Only keys the model sets itself are questioned, so an inherited value is questioned once, where it is written.
 */
export function plausibilityWarnings(
  inputs: ResolvedModelInputs,
  setHere: (key: string) => boolean,
): PlausibilityWarning[] {
  const out: PlausibilityWarning[] = [];
  const { H0 } = inputs;
  if (setHere("H0") && (H0 < 20 || H0 > 150)) {
    const hint = H0 < 2 ? `; it looks like h: did you mean ${Number((H0 * 100).toPrecision(6))}?` : "";
    out.push({ key: "H0", message: `H0 = ${H0} km/s/Mpc lies outside 20 to 150 km/s/Mpc${hint}` });
  }
  if (inputs.baryon_key === "omega_b" && setHere("omega_b") && inputs.baryon_value! > 0.05) {
    out.push({
      key: "omega_b",
      message: `omega_b = ${inputs.baryon_value} is large for the physical density Omega_b h^2 (about 0.022); did you mean Omega_b: ${inputs.baryon_value}?`,
    });
  }
  if (inputs.baryon_key === "Omega_b" && setHere("Omega_b") && inputs.baryon_value! < 0.03) {
    out.push({
      key: "Omega_b",
      message: `Omega_b = ${inputs.baryon_value} is small for a density parameter (about 0.049); it looks like omega_b = Omega_b h^2: did you mean omega_b: ${inputs.baryon_value}?`,
    });
  }
  const OmegaB =
    inputs.baryon_key === "Omega_b"
      ? inputs.baryon_value!
      : inputs.baryon_key === "omega_b"
        ? inputs.baryon_value! / (H0 / 100) ** 2
        : null;
  if (OmegaB !== null && OmegaB > inputs.Omega_m && (setHere(inputs.baryon_key!) || setHere("Omega_m")))
    out.push({
      key: setHere(inputs.baryon_key!) ? inputs.baryon_key! : "Omega_m",
      message: `the baryon density Omega_b = ${Number(OmegaB.toPrecision(6))} exceeds all matter, Omega_m = ${inputs.Omega_m} (baryons are part of Omega_m)`,
    });
  if (inputs.T_cmb !== null && setHere("T_cmb") && Math.abs(inputs.T_cmb - T_CMB_FIXSEN_K) > 0.1)
    out.push({
      key: "T_cmb",
      message: `T_cmb = ${inputs.T_cmb} K is far from the measured 2.7255 K (Fixsen 2009)`,
    });
  return out;
}
