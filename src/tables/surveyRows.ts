import { redshiftTable, shellEffectiveRedshift, shellVolumeMpc3, type BackgroundModel } from "../engine/index.js";
import type { ResolvedSurvey } from "../scenario/resolvedScenario.js";
import type { SurveyRow } from "../contract/tablesDocument.js";

/**
 * Comoving volume of each survey shell (also per square degree of its area) and the expected count density x volume
 * (Hogg 1999, eq. 29); its effective redshift (volume-weighted mean) with the growth rate and f sigma8 there.
 */
export function surveyRows(
  model: BackgroundModel,
  surveys: readonly ResolvedSurvey[],
  sigma8: number | null = null,
): SurveyRow[] {
  return surveys.map((s) => {
    const volumeMpc3 = shellVolumeMpc3(model, s.z_min, s.z_max, s.area_deg2);
    const zEff = shellEffectiveRedshift(model, s.z_min, s.z_max);
    const atEff = redshiftTable(model, [zEff], { sigma8 });
    const fSigma8 = atEff.f_sigma8[0];
    return {
      name: s.name,
      area_deg2: s.area_deg2,
      z_min: s.z_min,
      z_max: s.z_max,
      volume_Gpc3: volumeMpc3 * 1e-9,
      volume_Mpc3: volumeMpc3,
      volume_per_deg2_Mpc3: volumeMpc3 / s.area_deg2,
      density_per_Mpc3: s.density_per_Mpc3,
      expected_count: s.density_per_Mpc3 === null ? null : s.density_per_Mpc3 * volumeMpc3,
      z_eff: zEff,
      growth_rate_z_eff: atEff.growth_rate[0],
      f_sigma8_z_eff: Number.isFinite(fSigma8) ? fSigma8 : null,
    };
  });
}
