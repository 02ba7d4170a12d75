/** The tables document: the stable data contract read by pages, exports, archives and users' scripts. */
export const TABLES_FORMAT = "cosmoledger.tables/1";

export type Num = number | null;

export interface ConstantEntry { value: number; unit: string; source: string }

export interface ModelParameters {
  H0: number; Omega_m: number; Omega_de: number; Omega_k: number; Omega_r: number; Omega_gamma: number; Omega_nu: number;
  w0: number; wa: number; T_cmb: number | null; N_eff: number | null; radiation: "thermal" | "none";
  Omega_b: number | null; omega_b: number | null; Omega_cb: number; Omega_nu_massive: number; T_nu: number | null; m_nu_eV: number[];
  curvature_from: "flat" | "Omega_k" | "Omega_de" | "Omega_Lambda";
}

export type RedshiftRow = Record<string, Num>;

/** The chart grid column by column: each key of a redshift row maps to one array over the grid points. */
export type RedshiftGrid = Record<string, Num[]>;

export interface TargetRow {
  name: string;
  placed_by: "z" | "lookback_Gyr" | "age_Gyr" | "comoving_distance_Mpc";
  z: Num; lookback_time_Gyr: Num; age_Gyr: Num; comoving_distance_Mpc: Num; angular_diameter_distance_Mpc: Num;
  luminosity_distance_Mpc: Num; distance_modulus_mag: Num; kpc_per_arcsec_proper: Num;
  angular_size_arcsec: Num; apparent_magnitude: Num; bolometric_flux_erg_s_cm2: Num;
  note: string | null;
}

export interface SurveyRow { name: string; area_deg2: number; z_min: number; z_max: number; volume_Gpc3: number; density_per_Mpc3: Num; expected_count: Num }

export interface ModelTables {
  id: string; label: string; extends: string | null; notes: string | null; warnings: string[];
  parameters: ModelParameters;
  provenance: Record<string, "set" | "inherited" | "default" | "derived">;
  summary: Record<string, Num | string>;
  redshifts: RedshiftRow[];
  grid: RedshiftGrid;
  targets: TargetRow[];
  surveys: SurveyRow[];
}

export interface Difference { absolute: Num; relative: Num }

export interface ModelDifferences {
  summary: Record<string, Difference>;
  redshifts: Record<string, Num>[];
}

export interface TablesDocument {
  format: typeof TABLES_FORMAT;
  scenario: {
    id: string; title: string; description: string | null; author: string | null; tags: string[]; baseline: string;
    source_path: string; source_sha256: string; inputs_sha256: string; defaults_applied: string[];
    redshifts: number[]; grid: { z_max: number; points: number; spacing: "log" | "linear" };
  };
  engine: { version: string; tolerance: number; constants: Record<string, ConstantEntry>; defaults: Record<string, number | string> };
  cautions: string[];
  models: ModelTables[];
  differences: Record<string, ModelDifferences>;
}
