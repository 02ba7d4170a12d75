/* Generated from src/schema/tables/6.schema.json by src/schema/generateContractTypes.mjs; do not edit. */

export type Num = number | null;
/**
 * Percentiles of one quantity over the accepted draws (in the order of draws.percentiles) and the Monte Carlo error of each; null when some draw has no value.
 */
export type Band = {
  q: number[];
  mc_error: number[];
} | null;
export type GridBand = {
  q: (number | null)[][];
  mc_error: (number | null)[][];
} | null;

/**
 * The stable data contract written by cosmoledger compute (format 3). Units are in the key names; null marks an undefined or infinite quantity. Additive over format 1: scenario.source_text and the resolved inputs are part of the document, and scenario.inputs_sha256 is the SHA-256 of the RFC 8785 canonical JSON of the engine version and the resolved inputs. Additive over format 2: the fate is one of a complete set (expands_decelerating, coasts, expands_accelerating, big_rip, recollapses) with the time to a big rip; targets given an angular size carry their proper and comoving size; survey shells carry their volume in Mpc^3 and per square degree; a model may carry a LaTeX label. Format 5 adds the light-travel distance in Mpc (light_travel_distance_Mpc, beside the Gly of earlier formats), each model's input warnings (input_warnings) and, for a scenario that asks for h units, the bands of its spreads in h units (spread.h_scaled). Format 6 adds the linear growth of cold dark matter plus baryons: the growth factor D(z)/D(0), the growth rate f, and where a model gives sigma8 today, sigma8(z) and f sigma8(z), per redshift, on the grid and at targets (growth_factor, growth_rate, sigma8_z, f_sigma8); today's growth rate and S8 in the summary (growth_rate_0, S8); each survey shell's effective redshift with the growth rate and f sigma8 there (z_eff, growth_rate_z_eff, f_sigma8_z_eff); and the model's sigma8 (parameters.sigma8, and inputs.sigma8 when given).
 */
export interface TablesDocumentFormat6 {
  format: "cosmoledger.tables/6";
  scenario: {
    id: string;
    title: string;
    description: string | null;
    author: string | null;
    tags: string[];
    baseline: string;
    source_path: string;
    source_sha256: string;
    /**
     * SHA-256 (hex) of the RFC 8785 canonical JSON of {engine, id, baseline, redshifts, grid, models: [{id, extends, inputs}], targets, surveys}: the version identity.
     */
    inputs_sha256: string;
    defaults_applied: string[];
    redshifts: number[];
    grid: {
      z_max: number;
      points: number;
      spacing: "log" | "linear";
    };
    /**
     * The scenario file as read (UTF-8 text).
     */
    source_text: string;
  };
  inputs: ResolvedInputs;
  engine: {
    version: string;
    tolerance: number;
    constants: {
      [k: string]: {
        value: number;
        unit: string;
        source: string;
      };
    };
    defaults: {
      [k: string]: number | string;
    };
  };
  cautions: string[];
  /**
   * @minItems 1
   */
  models: {
    id: string;
    label: string;
    extends: (string | null) | string[];
    notes: string | null;
    warnings: string[];
    parameters: {
      H0: number;
      Omega_m: number;
      Omega_de: number;
      Omega_k: number;
      Omega_r: number;
      Omega_gamma: number;
      Omega_nu: number;
      w0: number;
      wa: number;
      T_cmb: number | null;
      N_eff: number | null;
      radiation: "thermal" | "none";
      curvature_from: "flat" | "Omega_k" | "Omega_de" | "Omega_Lambda";
      Omega_b: number | null;
      omega_b: number | null;
      Omega_cb: number;
      Omega_nu_massive: number;
      T_nu: number | null;
      m_nu_eV: number[];
      /**
       * sigma8 today as given (rms linear matter fluctuation in spheres of 8 h^-1 Mpc); null when not given.
       */
      sigma8: number | null;
    };
    provenance: {
      [k: string]: "set" | "inherited" | "default" | "derived";
    };
    summary: {
      age_Gyr: Num;
      hubble_time_Gyr: Num;
      hubble_distance_Mpc: Num;
      particle_horizon_Mpc: Num;
      event_horizon_Mpc: Num;
      curvature_radius_Mpc: Num;
      closed_volume_Gpc3: Num;
      identified_antipodes_volume_Gpc3: Num;
      antipode_distance_Mpc: Num;
      observable_fraction: Num;
      deceleration_q0: Num;
      z_acceleration: Num;
      z_matter_radiation_equality: Num;
      z_matter_de_equality: Num;
      max_scale_factor: Num;
      max_expansion_time_Gyr: Num;
      crunch_time_Gyr: Num;
      geometry: "flat" | "open" | "closed";
      /**
       * Decided from the term of E^2 that dominates as a -> infinity (README, 'Fates').
       */
      fate: "expands_decelerating" | "coasts" | "expands_accelerating" | "big_rip" | "recollapses";
      z_recombination: Num;
      z_drag: Num;
      sound_horizon_recombination_Mpc: Num;
      sound_horizon_drag_Mpc: Num;
      sound_horizon_drag_integral_Mpc: Num;
      theta_star_100: Num;
      transverse_comoving_distance_recombination_Mpc: Num;
      k_eq_1_Mpc: Num;
      early_universe_note: string | null;
      time_to_rip_Gyr: Num;
      rip_time_Gyr: Num;
      growth_rate_0: Num;
      /**
       * sigma8 (Omega_m / 0.3)^(1/2); null when the model gives no sigma8.
       */
      S8: number | null;
    };
    redshifts: Row[];
    grid: GridColumns;
    targets: {
      name: string;
      placed_by: "z" | "lookback_Gyr" | "age_Gyr" | "comoving_distance_Mpc";
      note: string | null;
      z: Num;
      lookback_time_Gyr: Num;
      age_Gyr: Num;
      comoving_distance_Mpc: Num;
      angular_diameter_distance_Mpc: Num;
      luminosity_distance_Mpc: Num;
      distance_modulus_mag: Num;
      kpc_per_arcsec_proper: Num;
      angular_size_arcsec: Num;
      apparent_magnitude: Num;
      bolometric_flux_erg_s_cm2: Num;
      size_arcsec: Num;
      proper_size_kpc: Num;
      comoving_size_kpc: Num;
      growth_factor: Num;
      growth_rate: Num;
      sigma8_z: Num;
      f_sigma8: Num;
    }[];
    surveys: {
      name: string;
      area_deg2: number;
      z_min: number;
      z_max: number;
      volume_Gpc3: number;
      density_per_Mpc3: number | null;
      expected_count: number | null;
      volume_Mpc3: Num;
      volume_per_deg2_Mpc3: Num;
      /**
       * Mean redshift weighted by comoving volume over the shell.
       */
      z_eff: number | null;
      growth_rate_z_eff: Num;
      f_sigma8_z_eff: Num;
    }[];
    /**
     * The model's label in LaTeX (label_tex in the scenario), or null.
     */
    label_tex: string | null;
    /**
     * Published parameter sets the model extends, with their citations.
     */
    published?: {
      id: string;
      title: string;
      authors: string;
      year: number;
      journal: string;
      arxiv: string;
      table: string;
      assumptions: string;
      transcription: {
        [k: string]: "paper text" | "recalled from memory";
      };
    }[];
    spread?: {
      form: "normal" | "multivariate_normal" | "samples";
      parameters: string[];
      description: string;
      /**
       * Draws made (normal forms) or rows read (samples).
       */
      draws: number;
      accepted: number;
      rejected: number;
      rejected_because: {
        [k: string]: number;
      };
      /**
       * Kish's effective number of accepted draws, (sum w)^2 / sum w^2.
       */
      effective_draws: number;
      /**
       * Quantities some accepted draws leave undefined (null), with how many; their bands are null.
       */
      undefined_in: {
        [k: string]: number;
      };
      summary: BandMap;
      redshifts: BandMap[];
      targets: BandMap[];
      surveys: BandMap[];
      grid: {
        [k: string]: GridBand;
      };
      /**
       * Present when the scenario asks for h units: the bands of every quantity that scales with h (lengths, volumes, wavenumbers, number densities), each draw's value converted with that draw's own h = H0/100 before the percentiles are taken. Same layout as the Mpc bands, holding only those quantities.
       */
      h_scaled?: {
        summary: BandMap;
        redshifts: BandMap[];
        targets: BandMap[];
        surveys: BandMap[];
        grid: {
          [k: string]: GridBand;
        };
      };
    };
    /**
     * Warnings about this model's own inputs (values that are valid but probably not meant, e.g. H0 = 0.7), in the words the check command prints.
     */
    input_warnings: string[];
  }[];
  differences: {
    [k: string]: {
      summary: {
        [k: string]: {
          absolute: number | null;
          relative: number | null;
        };
      };
      redshifts: NumMap[];
    };
  };
  /**
   * How spreads were sampled; present when some model has one.
   */
  draws?: {
    count: number;
    seed: number;
    generator: string;
    percentiles: number[];
  };
}
/**
 * The resolved scenario with every default explicit (the same record a frozen version stores as inputs).
 */
export interface ResolvedInputs {
  id: string;
  title: string;
  description: string | null;
  author: string | null;
  tags: string[];
  baseline: string;
  redshifts: number[];
  grid: {
    z_max: number;
    points: number;
    spacing: "log" | "linear";
  };
  targets: {
    name: string;
    placement: {
      by: "z" | "lookback_Gyr" | "age_Gyr" | "comoving_distance_Mpc";
      z?: number;
      value?: number;
    };
    size_kpc: number | null;
    absolute_magnitude: number | null;
    luminosity_erg_s: number | null;
    /**
     * Given only when the scenario sets it (so that inputs of earlier formats hash as before).
     */
    size_arcsec?: number;
  }[];
  surveys: {
    name: string;
    area_deg2: number;
    z_min: number;
    z_max: number;
    density_per_Mpc3: number | null;
  }[];
  defaults_applied: string[];
  /**
   * @minItems 1
   */
  models: {
    id: string;
    label: string;
    extends: (string | null) | string[];
    notes: string | null;
    warnings: string[];
    inputs: {
      H0: number;
      Omega_m: number;
      curvature_key: "flat" | "Omega_k" | "Omega_de" | "Omega_Lambda";
      curvature_value: number | null;
      w0: number;
      wa: number;
      radiation: "thermal" | "none";
      T_cmb: number | null;
      N_eff: number | null;
      baryon_key: "Omega_b" | "omega_b" | null;
      baryon_value: number | null;
      m_nu_eV: number[];
      /**
       * Given only when the model (or a model or published set it extends) sets sigma8.
       */
      sigma8?: number;
    };
    provenance: {
      H0: "set" | "inherited" | "default";
      Omega_m: "set" | "inherited" | "default";
      curvature_key: "set" | "inherited" | "default";
      curvature_value: "set" | "inherited" | "default";
      w0: "set" | "inherited" | "default";
      wa: "set" | "inherited" | "default";
      radiation: "set" | "inherited" | "default";
      T_cmb: "set" | "inherited" | "default";
      N_eff: "set" | "inherited" | "default";
      baryon_key: "set" | "inherited" | "default";
      baryon_value: "set" | "inherited" | "default";
      m_nu_eV: "set" | "inherited" | "default";
      sigma8?: "set" | "inherited" | "default";
    };
    /**
     * Given only when the scenario sets it.
     */
    label_tex?: string;
    /**
     * Published parameter sets the model extends, with their citations.
     */
    published?: {
      id: string;
      title: string;
      authors: string;
      year: number;
      journal: string;
      arxiv: string;
      table: string;
      assumptions: string;
      transcription: {
        [k: string]: "paper text" | "recalled from memory";
      };
    }[];
    /**
     * The spread of the model's parameters.
     */
    spread?:
      | {
          form: "normal";
          /**
           * @minItems 1
           */
          parameters: {
            key: string;
            center: number;
            plus: number;
            minus: number;
          }[];
          correlation: null | number[][];
          from: "set" | "inherited" | "published";
        }
      | {
          form: "samples";
          path: string;
          sha256: string;
          rows: number;
          columns: string[];
          weighted: boolean;
        };
  }[];
  /**
   * Present only when the scenario asks for h units (display only; the document stays in Mpc).
   */
  h_units?: true;
  draws?: {
    count: number;
    seed: number;
  };
}
export interface Row {
  z: Num;
  H_km_s_Mpc: Num;
  E: Num;
  Omega_m_z: Num;
  comoving_distance_Mpc: Num;
  transverse_comoving_distance_Mpc: Num;
  angular_diameter_distance_Mpc: Num;
  luminosity_distance_Mpc: Num;
  distance_modulus_mag: Num;
  lookback_time_Gyr: Num;
  age_Gyr: Num;
  comoving_volume_Gpc3: Num;
  comoving_volume_element_Mpc3_sr: Num;
  kpc_per_arcsec_proper: Num;
  kpc_per_arcsec_comoving: Num;
  hubble_radius_Mpc: Num;
  particle_horizon_Mpc: Num;
  light_travel_distance_Mpc: Num;
  light_travel_distance_Gly: Num;
  H_over_1pz_km_s_Mpc: Num;
  D_M_over_r_drag: Num;
  D_H_over_r_drag: Num;
  D_V_over_r_drag: Num;
  growth_factor: Num;
  growth_rate: Num;
  sigma8_z: Num;
  f_sigma8: Num;
}
/**
 * The chart grid column by column: one array per quantity over the grid points.
 */
export interface GridColumns {
  z: Num[];
  H_km_s_Mpc: Num[];
  E: Num[];
  Omega_m_z: Num[];
  comoving_distance_Mpc: Num[];
  transverse_comoving_distance_Mpc: Num[];
  angular_diameter_distance_Mpc: Num[];
  luminosity_distance_Mpc: Num[];
  distance_modulus_mag: Num[];
  lookback_time_Gyr: Num[];
  age_Gyr: Num[];
  comoving_volume_Gpc3: Num[];
  comoving_volume_element_Mpc3_sr: Num[];
  kpc_per_arcsec_proper: Num[];
  kpc_per_arcsec_comoving: Num[];
  hubble_radius_Mpc: Num[];
  particle_horizon_Mpc: Num[];
  light_travel_distance_Mpc: Num[];
  light_travel_distance_Gly: Num[];
  H_over_1pz_km_s_Mpc: Num[];
  D_M_over_r_drag: Num[];
  D_H_over_r_drag: Num[];
  D_V_over_r_drag: Num[];
  growth_factor: Num[];
  growth_rate: Num[];
  sigma8_z: Num[];
  f_sigma8: Num[];
}
export interface BandMap {
  [k: string]: Band;
}
export interface NumMap {
  [k: string]: Num;
}
