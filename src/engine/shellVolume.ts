import type { BackgroundModel } from "./backgroundModel.js";
import { FULL_SKY_DEG2 } from "./constants.js";
import { curvatureRadiusMpc } from "./curvatureRadius.js";
import { comovingVolumeWithin } from "./comovingVolume.js";
import { redshiftTable } from "./redshiftTable.js";
import { GAUSS7 } from "./gaussKronrod.js";

/** Comoving volume in Mpc^3 between z_min and z_max over a sky area in square degrees: [V_C(z_max) - V_C(z_min)] area / (4 pi sr) (Hogg 1999, eq. 29). */
export function shellVolumeMpc3(model: BackgroundModel, zMin: number, zMax: number, areaDeg2: number): number {
  if (!(zMax >= zMin)) throw new RangeError(`z_max (${zMax}) must not be below z_min (${zMin})`);
  const table = redshiftTable(model, [zMin, zMax], { growth: false });
  const R = curvatureRadiusMpc(model);
  const v = (DC: number) => comovingVolumeWithin(DC, model.geometry, R);
  return (v(table.comoving_distance_Mpc[1]) - v(table.comoving_distance_Mpc[0])) * (areaDeg2 / FULL_SKY_DEG2);
}

/** Width in z of the Gauss pieces of a shell's effective redshift. */
const EFFECTIVE_Z_PIECE = 0.25;

/**
 * Effective redshift of a shell: the mean redshift weighted by comoving volume, int z dV/dz dz / int dV/dz dz with
 * dV/dz proportional to D_M^2 / E (Hogg 1999, eq. 28), which is the mean redshift of its galaxies at a constant
 * comoving number density. 7-point Gauss-Legendre on pieces at most 0.25 wide in z.
 */
export function shellEffectiveRedshift(model: BackgroundModel, zMin: number, zMax: number): number {
  if (!(zMax >= zMin)) throw new RangeError(`z_max (${zMax}) must not be below z_min (${zMin})`);
  if (zMax === zMin) return zMin;
  const pieces = Math.ceil((zMax - zMin) / EFFECTIVE_Z_PIECE);
  const width = (zMax - zMin) / pieces;
  const nodes: number[] = [];
  const weights: number[] = [];
  for (let p = 0; p < pieces; p++) {
    const mid = zMin + (p + 0.5) * width;
    for (let j = 0; j < GAUSS7.nodes.length; j++) {
      nodes.push(mid + (width / 2) * GAUSS7.nodes[j]);
      weights.push((width / 2) * GAUSS7.weights[j]);
    }
  }
  const table = redshiftTable(model, nodes, { growth: false });
  let zWeighted = 0;
  let total = 0;
  for (let i = 0; i < nodes.length; i++) {
    const dV = (table.transverse_comoving_distance_Mpc[i] ** 2 / table.E[i]) * weights[i];
    zWeighted += nodes[i] * dV;
    total += dV;
  }
  return zWeighted / total;
}
