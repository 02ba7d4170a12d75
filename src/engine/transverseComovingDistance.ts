import type { Geometry } from "./backgroundModel.js";

/**
 * Transverse comoving distance D_M from the line-of-sight comoving distance D_C (Hogg 1999, eq. 16):
 * D_C when flat, R sinh(D_C/R) when open, R sin(D_C/R) when closed, R the curvature radius.
 * Closed models: D_M is signed; it is negative beyond the antipode (D_C > pi R), where images are inverted.
 */
export function transverseComovingDistance(
  comovingDistance: number,
  geometry: Geometry,
  curvatureRadius: number | null,
): number {
  if (geometry === "flat" || curvatureRadius === null) return comovingDistance;
  const chi = comovingDistance / curvatureRadius;
  return geometry === "open" ? curvatureRadius * Math.sinh(chi) : curvatureRadius * Math.sin(chi);
}
