import type { ModelParameters, RowKey, SummaryKey, TargetKey } from "./tablesDocument.js";
import { littleHUnit } from "./littleHUnitNames.js";

/**
 * How each quantity of the tables document is named, grouped and united on pages, exports and diffs (display only;
 * no physics). Keys are typed by the contract generated from the newest schema, so a misspelled key fails the type check.
 */
export interface QuantityInfo<K extends string = string> {
  key: K;
  label: string;
  unit: string;
}

export const REDSHIFT_GROUPS: { title: string; id: string; quantities: QuantityInfo<RowKey>[] }[] = [
  {
    title: "Distances",
    id: "distances",
    quantities: [
      { key: "comoving_distance_Mpc", label: "Comoving distance D_C", unit: "Mpc" },
      { key: "transverse_comoving_distance_Mpc", label: "Transverse comoving distance D_M", unit: "Mpc" },
      { key: "angular_diameter_distance_Mpc", label: "Angular-diameter distance D_A", unit: "Mpc" },
      { key: "luminosity_distance_Mpc", label: "Luminosity distance D_L", unit: "Mpc" },
      { key: "distance_modulus_mag", label: "Distance modulus", unit: "mag" },
    ],
  },
  {
    title: "Times",
    id: "times",
    quantities: [
      { key: "lookback_time_Gyr", label: "Lookback time", unit: "Gyr" },
      { key: "age_Gyr", label: "Age at z", unit: "Gyr" },
      // In Mpc like every other distance (format 5 on); older documents give it in Gly only.
      { key: "light_travel_distance_Mpc", label: "Light-travel distance", unit: "Mpc" },
      { key: "light_travel_distance_Gly", label: "Light-travel distance", unit: "Gly" },
    ],
  },
  {
    title: "Scales and volumes",
    id: "scales",
    quantities: [
      { key: "kpc_per_arcsec_proper", label: "Proper scale", unit: "kpc/arcsec" },
      { key: "kpc_per_arcsec_comoving", label: "Comoving scale", unit: "kpc/arcsec" },
      { key: "comoving_volume_Gpc3", label: "Comoving volume inside z (full sky)", unit: "Gpc^3" },
      { key: "comoving_volume_element_Mpc3_sr", label: "dV_C/dz/dOmega", unit: "Mpc^3/sr" },
    ],
  },
  {
    title: "Expansion and horizons",
    id: "expansion",
    quantities: [
      { key: "H_km_s_Mpc", label: "Hubble rate H(z)", unit: "km/s/Mpc" },
      { key: "H_over_1pz_km_s_Mpc", label: "H(z)/(1+z)", unit: "km/s/Mpc" },
      { key: "E", label: "E(z) = H/H0", unit: "" },
      { key: "Omega_m_z", label: "Omega_m(z)", unit: "" },
      { key: "hubble_radius_Mpc", label: "Hubble radius c/H(z)", unit: "Mpc" },
      { key: "particle_horizon_Mpc", label: "Comoving particle horizon at z", unit: "Mpc" },
    ],
  },
  {
    // Linear theory, scale-independent growth of cold dark matter plus baryons (format 6 on; src/engine/linearGrowth.ts).
    title: "Linear growth",
    id: "growth",
    quantities: [
      { key: "growth_factor", label: "Growth factor D(z)/D(0)", unit: "" },
      { key: "growth_rate", label: "Growth rate f(z)", unit: "" },
      { key: "sigma8_z", label: "sigma8(z)", unit: "" },
      { key: "f_sigma8", label: "f sigma8(z)", unit: "" },
    ],
  },
  {
    title: "BAO distance ratios",
    id: "bao",
    quantities: [
      { key: "D_M_over_r_drag", label: "D_M / r_drag", unit: "" },
      { key: "D_H_over_r_drag", label: "D_H / r_drag", unit: "" },
      { key: "D_V_over_r_drag", label: "D_V / r_drag", unit: "" },
    ],
  },
];

export const SUMMARY_QUANTITIES: QuantityInfo<SummaryKey>[] = [
  { key: "age_Gyr", label: "Age today", unit: "Gyr" },
  { key: "hubble_time_Gyr", label: "Hubble time 1/H0", unit: "Gyr" },
  { key: "hubble_distance_Mpc", label: "Hubble distance c/H0", unit: "Mpc" },
  { key: "particle_horizon_Mpc", label: "Comoving particle horizon", unit: "Mpc" },
  { key: "event_horizon_Mpc", label: "Comoving event horizon", unit: "Mpc" },
  { key: "curvature_radius_Mpc", label: "Curvature radius", unit: "Mpc" },
  { key: "deceleration_q0", label: "Deceleration parameter q0", unit: "" },
  { key: "z_acceleration", label: "Acceleration began at z", unit: "" },
  { key: "z_matter_radiation_equality", label: "Matter-radiation equality z", unit: "" },
  { key: "z_matter_de_equality", label: "Matter-dark-energy equality z", unit: "" },
  { key: "max_scale_factor", label: "Maximum scale factor", unit: "" },
  { key: "crunch_time_Gyr", label: "Big crunch at", unit: "Gyr" },
  { key: "time_to_rip_Gyr", label: "Big rip in (from today)", unit: "Gyr" },
  { key: "rip_time_Gyr", label: "Big rip at cosmic time", unit: "Gyr" },
  { key: "growth_rate_0", label: "Growth rate today f(0)", unit: "" },
  { key: "S8", label: "S8 = sigma8 (Omega_m/0.3)^0.5", unit: "" },
];

/**
 * The words for a model's fate in every format: formats 1 and 2 know only whether it recollapses; from format 3
 * the fate is one of a complete set (README, "Fates").
 */
export function fateText(fate: string): string {
  const words: Record<string, string> = {
    expands_forever: "expands forever",
    expands_decelerating: "expands forever, decelerating",
    coasts: "expands forever, coasting",
    expands_accelerating: "expands forever, accelerating",
    big_rip: "big rip",
    recollapses: "recollapses",
  };
  return words[fate] ?? fate;
}

/** A fate in the vocabulary of an older tables format (1 and 2: expands_forever or recollapses). */
export function fateInFormat(fate: string, format: number): string {
  return format >= 3 || fate === "recollapses" ? fate : "expands_forever";
}

export const PARAMETERS: QuantityInfo<keyof ModelParameters>[] = [
  { key: "H0", label: "H0", unit: "km/s/Mpc" },
  { key: "Omega_m", label: "Omega_m", unit: "" },
  { key: "Omega_de", label: "Omega_de", unit: "" },
  { key: "Omega_k", label: "Omega_k", unit: "" },
  { key: "Omega_r", label: "Omega_r", unit: "" },
  { key: "Omega_gamma", label: "Omega_gamma", unit: "" },
  { key: "Omega_nu", label: "Omega_nu (massless)", unit: "" },
  { key: "w0", label: "w0", unit: "" },
  { key: "wa", label: "wa", unit: "" },
  { key: "T_cmb", label: "T_cmb", unit: "K" },
  { key: "N_eff", label: "N_eff", unit: "" },
  { key: "Omega_b", label: "Omega_b", unit: "" },
  { key: "omega_b", label: "omega_b = Omega_b h^2", unit: "" },
  { key: "Omega_cb", label: "Omega_cb (cold matter + baryons)", unit: "" },
  { key: "Omega_nu_massive", label: "Omega_nu (massive, today)", unit: "" },
  { key: "T_nu", label: "T_nu", unit: "K" },
  { key: "sigma8", label: "sigma8 (today)", unit: "" },
];

/** Early-universe quantities; the source of each fitting formula is named on the page. */
export const EARLY_QUANTITIES: (QuantityInfo<SummaryKey> & { method: string })[] = [
  {
    key: "z_recombination",
    label: "Decoupling redshift z* (fitted)",
    unit: "",
    method: "fitting formula, Hu & Sugiyama 1996: about 0.2 % above the z* of a full recombination code",
  },
  {
    key: "z_drag",
    label: "Drag-epoch redshift z_drag (fitted)",
    unit: "",
    method: "fitting formula, Eisenstein & Hu 1998 (approximate, a few % low)",
  },
  {
    key: "sound_horizon_recombination_Mpc",
    label: "Sound horizon at the fitted z*, r*",
    unit: "Mpc",
    method: "integral of c_s/H to the fitted z*: carries its error, about 0.1 to 0.2 % in r*",
  },
  {
    key: "sound_horizon_drag_Mpc",
    label: "Sound horizon at drag, r_drag",
    unit: "Mpc",
    method: "calibrated formula, Aubourg et al. 2015 eq. 16 (the value to quote for BAO)",
  },
  {
    key: "sound_horizon_drag_integral_Mpc",
    label: "Integral of c_s/H to the fitted z_drag (not r_drag)",
    unit: "Mpc",
    method: "integral of c_s/H to the fitted z_drag: about 2.5 % above r_drag; do not quote it as r_drag",
  },
  {
    key: "theta_star_100",
    label: "100 theta* = 100 r*/D_M(z*), at the fitted z*",
    unit: "",
    method: "ratio at the fitted z*: carries its error, about 0.1 to 0.2 %",
  },
  {
    key: "transverse_comoving_distance_recombination_Mpc",
    label: "D_M(z*), at the fitted z*",
    unit: "Mpc",
    method: "integral",
  },
  {
    key: "z_matter_radiation_equality",
    label: "Matter-radiation equality z_eq",
    unit: "",
    method: "root of rho_m = rho_r",
  },
  { key: "k_eq_1_Mpc", label: "k_eq = a_eq H(a_eq)/c", unit: "1/Mpc", method: "from z_eq" },
];

export const TARGET_QUANTITIES: QuantityInfo<TargetKey>[] = [
  { key: "z", label: "Redshift", unit: "" },
  { key: "lookback_time_Gyr", label: "Lookback time", unit: "Gyr" },
  { key: "angular_diameter_distance_Mpc", label: "D_A", unit: "Mpc" },
  { key: "luminosity_distance_Mpc", label: "D_L", unit: "Mpc" },
  { key: "kpc_per_arcsec_proper", label: "Proper scale", unit: "kpc/arcsec" },
  { key: "angular_size_arcsec", label: "Angular size", unit: "arcsec" },
  { key: "apparent_magnitude", label: "Apparent magnitude (no K-corr.)", unit: "mag" },
  { key: "bolometric_flux_erg_s_cm2", label: "Bolometric flux", unit: "erg/s/cm^2" },
  { key: "size_arcsec", label: "Given angular size", unit: "arcsec" },
  { key: "proper_size_kpc", label: "Proper size of that angle", unit: "kpc" },
  { key: "comoving_size_kpc", label: "Comoving size of that angle", unit: "kpc" },
  { key: "growth_rate", label: "Growth rate f", unit: "" },
  { key: "f_sigma8", label: "f sigma8", unit: "" },
];

/** Series offered by the charts: key in the grid, label and unit. */
export const CHART_SERIES: QuantityInfo<RowKey>[] = [
  { key: "comoving_distance_Mpc", label: "D_C", unit: "Mpc" },
  { key: "transverse_comoving_distance_Mpc", label: "D_M", unit: "Mpc" },
  { key: "angular_diameter_distance_Mpc", label: "D_A", unit: "Mpc" },
  { key: "luminosity_distance_Mpc", label: "D_L", unit: "Mpc" },
  { key: "H_over_1pz_km_s_Mpc", label: "H(z)/(1+z)", unit: "km/s/Mpc" },
  { key: "age_Gyr", label: "Age", unit: "Gyr" },
  { key: "lookback_time_Gyr", label: "Lookback time", unit: "Gyr" },
  { key: "kpc_per_arcsec_proper", label: "Proper scale", unit: "kpc/arcsec" },
  { key: "comoving_volume_Gpc3", label: "Comoving volume", unit: "Gpc^3" },
  { key: "D_M_over_r_drag", label: "D_M / r_drag", unit: "" },
  { key: "D_H_over_r_drag", label: "D_H / r_drag", unit: "" },
  { key: "D_V_over_r_drag", label: "D_V / r_drag", unit: "" },
  { key: "f_sigma8", label: "f sigma8", unit: "" },
  { key: "growth_rate", label: "Growth rate f", unit: "" },
  { key: "growth_factor", label: "Growth factor D", unit: "" },
];

/** The charts of a scenario page; each offers the listed grid series (the first is shown by default). "bao" needs a baryon density. */
export const CHARTS: { id: string; title: string; keys: RowKey[] }[] = [
  {
    id: "distances",
    title: "Distances",
    keys: [
      "comoving_distance_Mpc",
      "transverse_comoving_distance_Mpc",
      "angular_diameter_distance_Mpc",
      "luminosity_distance_Mpc",
    ],
  },
  { id: "expansion", title: "Expansion rate H(z)/(1+z)", keys: ["H_over_1pz_km_s_Mpc"] },
  { id: "times", title: "Age and lookback time", keys: ["age_Gyr", "lookback_time_Gyr"] },
  { id: "scale", title: "Proper scale", keys: ["kpc_per_arcsec_proper"] },
  { id: "volume", title: "Comoving volume inside z", keys: ["comoving_volume_Gpc3"] },
  { id: "bao", title: "BAO distance ratios", keys: ["D_V_over_r_drag", "D_M_over_r_drag", "D_H_over_r_drag"] },
  // f sigma8 only where a model gives sigma8 (catalogFor leaves it out otherwise).
  { id: "growth", title: "Linear growth", keys: ["f_sigma8", "growth_rate", "growth_factor"] },
];

/** The catalogue as one document can show it: only the quantities its format holds, and those it lacks. */
export interface DocumentCatalog {
  REDSHIFT_GROUPS: typeof REDSHIFT_GROUPS;
  SUMMARY_QUANTITIES: typeof SUMMARY_QUANTITIES;
  PARAMETERS: typeof PARAMETERS;
  EARLY_QUANTITIES: typeof EARLY_QUANTITIES;
  TARGET_QUANTITIES: typeof TARGET_QUANTITIES;
  CHART_SERIES: typeof CHART_SERIES;
  CHARTS: typeof CHARTS;
  /** Catalogue quantities that the document's format does not have ("not computed in this version"), by label. */
  notComputed: string[];
  /** Whether any model gives a baryon density, so that the early-universe quantities and BAO ratios exist. */
  hasEarlyUniverse: boolean;
}

/** Whether any model of a document gives a baryon density (the early-universe quantities and BAO ratios need one). */
export const hasEarlyUniverse = (doc: { models: readonly { parameters: { Omega_b: number | null } }[] }) =>
  doc.models.some((m) => m.parameters.Omega_b !== null);

/**
 * Filters the catalogue to the quantities a stored document holds (read from its first model), so that pages and
 * exports of an older format leave out a quantity added later instead of showing a blank that looks like a null.
 */
const RIP_KEYS: string[] = ["time_to_rip_Gyr", "rip_time_Gyr"];
/** Quantities that need sigma8 today: shown only where a model gives it. */
export const SIGMA8_KEYS: string[] = ["sigma8", "sigma8_z", "f_sigma8", "S8", "f_sigma8_z_eff"];
const ANGLE_KEYS: string[] = ["size_arcsec", "proper_size_kpc", "comoving_size_kpc"];

export function catalogFor(
  doc: {
    models: readonly {
      parameters: { Omega_b: number | null };
      summary: object;
      redshifts: readonly object[];
      grid: object;
      targets: readonly object[];
    }[];
  },
  hUnits = false,
): DocumentCatalog {
  const m = doc.models[0];
  const rowKeys = new Set(Object.keys(m.grid));
  const notComputed: string[] = [];
  const keep = <Q extends QuantityInfo>(list: Q[], present: (k: string) => boolean): Q[] =>
    list.filter((q) => {
      if (present(q.key)) return true;
      if (!notComputed.includes(q.label)) notComputed.push(q.label);
      return false;
    });
  // Without sigma8 in any model, the quantities that need it are left out (not a column of dashes).
  const withSigma8 = doc.models.some((x) => (x.parameters as Record<string, unknown>).sigma8 != null);
  const applies = (q: { key: string }) => withSigma8 || !SIGMA8_KEYS.includes(q.key);
  const row = (k: string) => rowKeys.has(k);
  // One light-travel distance: in Mpc where the document has it, else (older formats) in Gly.
  const lightTravel = row("light_travel_distance_Mpc") ? "light_travel_distance_Gly" : "light_travel_distance_Mpc";
  const groups = REDSHIFT_GROUPS.map((g) => ({
    ...g,
    quantities: keep(
      g.quantities.filter((q) => q.key !== lightTravel && applies(q)),
      row,
    ),
  })).filter((g) => g.quantities.length > 0);
  // Shown in h units (the presentation converted the values, src/presentation/presentDocument.ts), every length,
  // volume and wavenumber is labelled so here.
  const h = hUnits;
  const u = <Q extends QuantityInfo>(list: Q[]): Q[] =>
    h ? list.map((q) => ({ ...q, unit: littleHUnit(q.unit) })) : list;
  return {
    REDSHIFT_GROUPS: groups.map((g) => ({ ...g, quantities: u(g.quantities) })),
    // The big-rip rows appear only where a model has one (most scenarios have none; older formats cannot).
    SUMMARY_QUANTITIES: u(
      keep(
        SUMMARY_QUANTITIES.filter(
          (q) =>
            applies(q) &&
            (!RIP_KEYS.includes(q.key) ||
              doc.models.some((x) => (x.summary as Record<string, unknown>)[q.key] != null)),
        ),
        (k) => k in m.summary,
      ),
    ),
    PARAMETERS: keep(PARAMETERS.filter(applies), (k) => k in m.parameters),
    EARLY_QUANTITIES: u(keep(EARLY_QUANTITIES, (k) => k in m.summary)),
    // The size-from-angle rows appear only where a target was given an angular size.
    TARGET_QUANTITIES: m.targets.length
      ? u(
          keep(
            TARGET_QUANTITIES.filter(
              (q) =>
                applies(q) &&
                (!ANGLE_KEYS.includes(q.key) ||
                  doc.models.some((x) => x.targets.some((t) => (t as Record<string, unknown>).size_arcsec != null))),
            ),
            (k) => k in m.targets[0],
          ),
        )
      : u(TARGET_QUANTITIES),
    CHART_SERIES: u(keep(CHART_SERIES.filter(applies), row)),
    CHARTS: CHARTS.map((c) => ({
      ...c,
      keys: c.keys.filter((k) => row(k) && applies({ key: k })),
    })).filter((c) => c.keys.length > 0),
    notComputed,
    hasEarlyUniverse: hasEarlyUniverse(doc),
  };
}
