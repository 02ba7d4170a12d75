import { MPC_CM } from "./constants.js";

/** Angular size in arcsec of a proper size in kpc at a proper scale in kpc per arcsec: theta = l / D_A (Hogg 1999 eq. 18). */
export function angularSizeArcsec(sizeKpc: number, kpcPerArcsecProper: number): number | null {
  return kpcPerArcsecProper !== 0 && Number.isFinite(kpcPerArcsecProper)
    ? sizeKpc / Math.abs(kpcPerArcsecProper)
    : null;
}

/** Proper size in kpc of an angular size in arcsec at a scale in kpc per arcsec: l = theta D_A (Hogg 1999 eq. 18). */
export function sizeKpcOfArcsec(sizeArcsec: number, kpcPerArcsec: number): number | null {
  return Number.isFinite(kpcPerArcsec) ? sizeArcsec * Math.abs(kpcPerArcsec) : null;
}

/** Apparent magnitude m = M + mu, without K-correction (Hogg 1999 eq. 24 and the definition of the distance modulus). */
export function apparentMagnitude(absoluteMagnitude: number, distanceModulusMag: number): number | null {
  return Number.isFinite(distanceModulusMag) ? absoluteMagnitude + distanceModulusMag : null;
}

/** Bolometric flux F = L / (4 pi D_L^2) in erg/s/cm^2 for L in erg/s and D_L in Mpc (Hogg 1999 eq. 21). */
export function bolometricFluxErgSCm2(luminosityErgS: number, luminosityDistanceMpc: number): number | null {
  const dCm = luminosityDistanceMpc * MPC_CM;
  return luminosityDistanceMpc !== 0 && Number.isFinite(dCm) ? luminosityErgS / (4 * Math.PI * dCm * dCm) : null;
}

/** omega_b = Omega_b h^2 with h = H0 / (100 km/s/Mpc) (definition of the physical baryon density). */
export function physicalBaryonDensity(Omega_b: number, H0_km_s_Mpc: number): number {
  return Omega_b * (H0_km_s_Mpc / 100) ** 2;
}
