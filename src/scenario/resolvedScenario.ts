import type { ScenarioIssue } from "./scenarioIssue.js";
import type { BackgroundModel } from "../engine/index.js";

export type Provenance = "set" | "inherited" | "default";
export type CurvatureKey = "flat" | "Omega_k" | "Omega_de" | "Omega_Lambda";

/** A model's inputs with every default and inherited value explicit. */
export interface ResolvedModelInputs {
  H0: number;
  Omega_m: number;
  /** Which key fixed the curvature, and its value (null for flat). */
  curvature_key: CurvatureKey;
  curvature_value: number | null;
  w0: number;
  wa: number;
  radiation: "thermal" | "none";
  T_cmb: number | null;
  N_eff: number | null;
  /** Which key gave the baryon density, and its value; null when neither was given. */
  baryon_key: "Omega_b" | "omega_b" | null;
  baryon_value: number | null;
  /** Massive neutrino masses in eV; empty when all are massless. */
  m_nu_eV: number[];
  /**
   * sigma8 today (linear rms matter fluctuation in spheres of 8 h^-1 Mpc), present only when set or inherited: a
   * model without it has exactly the inputs (and the same inputs hash) it had before the key existed.
   */
  sigma8?: number;
}

/** Parameters a spread may vary: the scalar model keys (m_nu_eV, a list, is held fixed). */
export const SPREAD_KEYS = [
  "H0",
  "Omega_m",
  "Omega_k",
  "Omega_de",
  "Omega_Lambda",
  "w0",
  "wa",
  "Omega_b",
  "omega_b",
  "N_eff",
  "T_cmb",
  "sigma8",
] as const;
export type SpreadKey = (typeof SPREAD_KEYS)[number];

/** One varied parameter of a normal spread: the model's value and its 68 % half-widths (equal unless published so). */
export interface NormalSpreadParameter {
  key: SpreadKey;
  center: number;
  plus: number;
  minus: number;
}

/**
 * A model's parameter spread, every default explicit. `normal`: independent (correlation null) or correlated
 * normal deviates, split at the centre when a published uncertainty is asymmetric. `samples`: the rows of a CSV
 * file (its SHA-256 identifies it; the rows themselves travel beside the model, see ResolvedScenario.samples).
 */
export type ResolvedSpread =
  | {
      form: "normal";
      parameters: NormalSpreadParameter[];
      correlation: number[][] | null;
      /** Where the uncertainties came from: this model, a parent model, or a published set (marginals only). */
      from: "set" | "inherited" | "published";
    }
  | {
      form: "samples";
      path: string;
      sha256: string;
      rows: number;
      columns: SpreadKey[];
      weighted: boolean;
    };

/** A published set a model extends, with its citation, as pages and archives cite it. */
export interface PublishedReference {
  id: string;
  title: string;
  authors: string;
  year: number;
  journal: string;
  arxiv: string;
  table: string;
  assumptions: string;
  /** How the values were transcribed: "paper text" or "recalled from memory", per parameter. */
  transcription: Record<string, "paper text" | "recalled from memory">;
}

export interface ResolvedModel {
  id: string;
  label: string;
  /** The label in LaTeX, only when the scenario gives one (absent, so that inputs without it hash as before). */
  label_tex?: string;
  /** The parent (a model id or published/<id>), or the list of parents applied left to right. */
  extends: string | string[] | null;
  notes: string | null;
  inputs: ResolvedModelInputs;
  /** Published sets behind this model's values, present only when it extends one (so other inputs hash as before). */
  published?: PublishedReference[];
  /** The spread of its parameters, present only when it has one. */
  spread?: ResolvedSpread;
  /** Where each input came from: set in this model, inherited through extends, or a default. */
  provenance: Record<Exclude<keyof ResolvedModelInputs, "sigma8">, Provenance> & { sigma8?: Provenance };
  background: BackgroundModel;
  warnings: string[];
}

export type TargetPlacement =
  | { by: "z"; z: number }
  | { by: "lookback_Gyr"; value: number }
  | { by: "age_Gyr"; value: number }
  | { by: "comoving_distance_Mpc"; value: number };

export interface ResolvedTarget {
  name: string;
  placement: TargetPlacement;
  size_kpc: number | null;
  /** Given only when the scenario sets it (absent, not null, so that inputs without it hash as in format 2). */
  size_arcsec?: number;
  absolute_magnitude: number | null;
  luminosity_erg_s: number | null;
}

export interface ResolvedSurvey {
  name: string;
  area_deg2: number;
  z_min: number;
  z_max: number;
  density_per_Mpc3: number | null;
}

/** A samples file's rows: one column of values per parameter key, and the weights (null when unweighted). */
export interface SamplesTable {
  path: string;
  text: string;
  columns: SpreadKey[];
  values: Float64Array[];
  weights: Float64Array | null;
}

export interface ResolvedGrid {
  z_max: number;
  points: number;
  spacing: "log" | "linear";
}

/** A validated scenario with every default applied: the only input of the tables builder. */
export interface ResolvedScenario {
  id: string;
  title: string;
  description: string | null;
  author: string | null;
  tags: string[];
  baseline: string;
  redshifts: number[];
  grid: ResolvedGrid;
  models: ResolvedModel[];
  targets: ResolvedTarget[];
  surveys: ResolvedSurvey[];
  /** Scenario-level keys that took their defaults. */
  defaults_applied: string[];
  /** How spreads are sampled; present only when some model has a spread (so that other inputs hash as before). */
  draws?: { count: number; seed: number };
  /** The rows of every samples file by model id (not part of the stored inputs: the file's text is kept instead). */
  samples?: Record<string, SamplesTable>;
  /** Lengths in h^-1 Mpc on pages and exports; present only when set (so that other inputs hash as before). */
  h_units?: true;
  /** Valid values that are probably not what was meant (H0 = 0.7), located; warnings, errors under --strict. Not an input. */
  plausibility: ScenarioIssue[];
  /** The file as given on the command line (for messages), its own name (recorded in documents), and its text. */
  source: { path: string; name: string; text: string };
}
