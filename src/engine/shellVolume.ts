import type { BackgroundModel } from "./backgroundModel.js";
import { FULL_SKY_DEG2 } from "./constants.js";
import { curvatureRadiusMpc } from "./curvatureRadius.js";
import { comovingVolumeWithin } from "./comovingVolume.js";
import { redshiftTable } from "./redshiftTable.js";

/** Comoving volume in Mpc^3 between z_min and z_max over a sky area in square degrees: [V_C(z_max) - V_C(z_min)] area / (4 pi sr) (Hogg 1999, eq. 29). */
export function shellVolumeMpc3(model: BackgroundModel, zMin: number, zMax: number, areaDeg2: number): number {
  if (!(zMax >= zMin)) throw new RangeError(`z_max (${zMax}) must not be below z_min (${zMin})`);
  const table = redshiftTable(model, [zMin, zMax]);
  const R = curvatureRadiusMpc(model);
  const v = (DC: number) => comovingVolumeWithin(DC, model.geometry, R);
  return (v(table.comoving_distance_Mpc[1]) - v(table.comoving_distance_Mpc[0])) * (areaDeg2 / FULL_SKY_DEG2);
}
