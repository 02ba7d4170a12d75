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
}

export interface ResolvedModel {
  id: string;
  label: string;
  /** The label in LaTeX, only when the scenario gives one (absent, so that inputs without it hash as before). */
  label_tex?: string;
  extends: string | null;
  notes: string | null;
  inputs: ResolvedModelInputs;
  /** Where each input came from: set in this model, inherited through extends, or a default. */
  provenance: Record<keyof ResolvedModelInputs, Provenance>;
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
  /** Lengths in h^-1 Mpc on pages and exports; present only when set (so that other inputs hash as before). */
  h_units?: true;
  /** Valid values that are probably not what was meant (H0 = 0.7), located; warnings, errors under --strict. Not an input. */
  plausibility: ScenarioIssue[];
  /** The file as given on the command line (for messages), its own name (recorded in documents), and its text. */
  source: { path: string; name: string; text: string };
}
