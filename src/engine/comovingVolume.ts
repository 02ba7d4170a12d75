import type { Geometry } from "./backgroundModel.js";

/**
 * Comoving volume of the geodesic ball of comoving radius D_C (the full sky inside that distance), in the cube of
 * D_C's unit. Flat: (4/3) pi D_C^3. Open: pi R^3 (sinh 2chi - 2chi); closed: pi R^3 (2chi - sin 2chi), chi = D_C/R
 * (integral of 4 pi R^3 sinn^2 chi dchi; equal to Hogg 1999 eq. 29 for chi <= pi/2). Small chi uses the series,
 * so the flat limit is reached without cancellation. Closed: capped at the whole 3-sphere 2 pi^2 R^3 once chi >= pi.
 */
export function comovingVolumeWithin(
  comovingDistance: number,
  geometry: Geometry,
  curvatureRadius: number | null,
): number {
  if (geometry === "flat" || curvatureRadius === null)
    return (4 / 3) * Math.PI * comovingDistance * comovingDistance * comovingDistance;
  const R = curvatureRadius;
  const chi = comovingDistance / R;
  const closed = geometry === "closed";
  if (closed && chi >= Math.PI) return 2 * Math.PI * Math.PI * R * R * R;
  const x = 2 * chi;
  let bracket: number;
  if (x < 0.5) {
    // sinh x - x or x - sin x = sum_{k>=1} (+-1)^(k+1) x^(2k+1) / (2k+1)!
    let term = (x * x * x) / 6;
    bracket = term;
    for (let k = 2; k < 40; k++) {
      term *= (x * x) / (2 * k * (2 * k + 1));
      const signed = closed && k % 2 === 0 ? -term : term;
      bracket += signed;
      if (term < 1e-18 * Math.abs(bracket)) break;
    }
  } else {
    bracket = closed ? x - Math.sin(x) : Math.sinh(x) - x;
  }
  return Math.PI * R * R * R * bracket;
}
