/**
 * Published parameter sets a model can extend (`extends: published/<id>`): central values and 68 % uncertainties
 * as the papers give them, the assumptions each analysis made, and where every number comes from.
 *
 * `checked` says how each value was transcribed: "paper text" where the paper's own text (its abstract) gives it,
 * "recalled from memory" where the value is transcribed from the paper's table and not yet checked against it
 * (pages, quote and the notes beside the methods paragraph say "not yet checked against the published table").
 * sigma8 = 0.811 +/- 0.006 is the abstract's rounding of the TT,TE,EE+lowE+lensing value.
 * Of the citations, Planck 2018 VI's Table 2 (its last column holds the 13.787 Gyr age), A&A 641 A6 and the SH0ES
 * ApJL 934 L7 are checked against the papers; the table numbers of WMAP9 (Table 4) and DESI 2024 VI (Table 3), and
 * the volume and page of their journals, are not yet. Never edit a released set's numbers: a correction is a new id
 * (archives cite sets by id).
 */
export type Transcription = "paper text" | "recalled from memory";

/** A published 68 % uncertainty: symmetric, or asymmetric as +plus / -minus. */
export type PublishedSigma = number | { plus: number; minus: number };

export interface PublishedValue {
  value: number;
  sigma: PublishedSigma | null;
  checked: Transcription;
  /** The paper's own rounding of the same number where its text shows one (e.g. the abstract's 67.4 +/- 0.5). */
  text_shows?: string;
}

export interface PublishedSet {
  id: string;
  title: string;
  citation: {
    authors: string;
    year: number;
    journal: string;
    arxiv: string;
    /** Table and column (or data combination) the values come from. */
    table: string;
  };
  /** Model parameters in our keys (H0, Omega_m, omega_b, w0, wa, sigma8); only these are set by extending the set. */
  parameters: Record<string, PublishedValue>;
  /** What the analysis assumed, in our keys, applied with the parameters (flat, m_nu_eV, N_eff, T_cmb). */
  assumptions: { flat?: true; m_nu_eV?: number[]; N_eff?: number; T_cmb?: number };
  /** The assumptions in words, for the page. */
  assumptions_text: string;
  /** Derived numbers the paper reports for the same column, for checking the transcription and the engine. */
  reported: Record<string, PublishedValue>;
  /** Only parameters, no model of its own: extend a full set first, then this one (e.g. an H0 measurement). */
  partial?: true;
}

const memo = "recalled from memory" as const;
const text = "paper text" as const;

const PLANCK_AUTHORS = "Planck Collaboration: N. Aghanim et al.";
const PLANCK_JOURNAL = "A&A 641, A6 (2020)";
const PLANCK_ASSUMPTIONS = {
  flat: true as const,
  m_nu_eV: [0.06],
  N_eff: 3.046,
  T_cmb: 2.7255,
};
const PLANCK_ASSUMPTIONS_TEXT =
  "base-LambdaCDM: spatially flat, one massive neutrino of 0.06 eV (the baseline of the Planck parameter chains), N_eff = 3.046, T_cmb = 2.7255 K, w = -1";

export const PUBLISHED_SETS: readonly PublishedSet[] = [
  {
    id: "planck2018-ttteee-lowe-lensing",
    title: "Planck 2018, TT,TE,EE+lowE+lensing",
    citation: {
      authors: PLANCK_AUTHORS,
      year: 2020,
      journal: PLANCK_JOURNAL,
      arxiv: "1807.06209",
      table: "Table 2, column TT,TE,EE+lowE+lensing (68 % intervals)",
    },
    parameters: {
      H0: { value: 67.36, sigma: 0.54, checked: memo, text_shows: "H0 = 67.4 +/- 0.5 (abstract)" },
      Omega_m: { value: 0.3153, sigma: 0.0073, checked: memo, text_shows: "Omega_m = 0.315 +/- 0.007 (abstract)" },
      omega_b: {
        value: 0.02237,
        sigma: 0.00015,
        checked: memo,
        text_shows: "Omega_b h^2 = 0.0224 +/- 0.0001 (abstract)",
      },
    },
    assumptions: PLANCK_ASSUMPTIONS,
    assumptions_text: PLANCK_ASSUMPTIONS_TEXT,
    reported: {
      age_Gyr: { value: 13.797, sigma: 0.023, checked: memo },
      Omega_Lambda: { value: 0.6847, sigma: 0.0073, checked: memo },
      z_star: { value: 1089.92, sigma: 0.25, checked: memo },
      theta_star_100: {
        value: 1.0411,
        sigma: 0.00031,
        checked: text,
        text_shows: "100 theta* = 1.0411 +/- 0.0003 (abstract)",
      },
      r_drag_Mpc: { value: 147.09, sigma: 0.26, checked: memo },
    },
  },
  {
    id: "planck2018-ttteee-lowe-lensing-bao",
    title: "Planck 2018, TT,TE,EE+lowE+lensing+BAO",
    citation: {
      authors: PLANCK_AUTHORS,
      year: 2020,
      journal: PLANCK_JOURNAL,
      arxiv: "1807.06209",
      table: "Table 2, column TT,TE,EE+lowE+lensing+BAO (68 % intervals)",
    },
    parameters: {
      H0: { value: 67.66, sigma: 0.42, checked: memo },
      Omega_m: { value: 0.3111, sigma: 0.0056, checked: memo },
      omega_b: { value: 0.02242, sigma: 0.00014, checked: memo },
    },
    assumptions: PLANCK_ASSUMPTIONS,
    assumptions_text: PLANCK_ASSUMPTIONS_TEXT,
    reported: {
      age_Gyr: { value: 13.787, sigma: 0.02, checked: memo },
      Omega_Lambda: { value: 0.6889, sigma: 0.0056, checked: memo },
      z_star: { value: 1089.8, sigma: 0.21, checked: memo },
      theta_star_100: { value: 1.04119, sigma: 0.00029, checked: memo },
      r_drag_Mpc: { value: 147.21, sigma: 0.23, checked: memo },
    },
  },
  // sigma8 of the two Planck columns, as companion sets (released sets never change; a model extends the full set,
  // then this one). Added with the linear growth (tables format 6).
  {
    id: "planck2018-ttteee-lowe-lensing-sigma8",
    title: "Planck 2018, TT,TE,EE+lowE+lensing: sigma8",
    citation: {
      authors: PLANCK_AUTHORS,
      year: 2020,
      journal: PLANCK_JOURNAL,
      arxiv: "1807.06209",
      table: "Table 2, column TT,TE,EE+lowE+lensing (68 % intervals)",
    },
    parameters: {
      sigma8: { value: 0.8111, sigma: 0.006, checked: memo, text_shows: "sigma8 = 0.811 +/- 0.006 (abstract)" },
    },
    assumptions: {},
    assumptions_text:
      "sigma8 of the base-LambdaCDM fit (linear theory, z = 0): extend published/planck2018-ttteee-lowe-lensing first, then this one",
    reported: {
      S8: { value: 0.832, sigma: 0.013, checked: memo },
    },
    partial: true,
  },
  {
    id: "planck2018-ttteee-lowe-lensing-bao-sigma8",
    title: "Planck 2018, TT,TE,EE+lowE+lensing+BAO: sigma8",
    citation: {
      authors: PLANCK_AUTHORS,
      year: 2020,
      journal: PLANCK_JOURNAL,
      arxiv: "1807.06209",
      table: "Table 2, column TT,TE,EE+lowE+lensing+BAO (68 % intervals)",
    },
    parameters: {
      sigma8: { value: 0.8102, sigma: 0.006, checked: memo },
    },
    assumptions: {},
    assumptions_text:
      "sigma8 of the base-LambdaCDM fit (linear theory, z = 0): extend published/planck2018-ttteee-lowe-lensing-bao first, then this one",
    reported: {
      S8: { value: 0.825, sigma: 0.011, checked: memo },
    },
    partial: true,
  },
  {
    id: "wmap9-lcdm",
    title: "WMAP nine-year, WMAP data alone",
    citation: {
      authors: "G. Hinshaw, D. Larson, E. Komatsu, D. N. Spergel, C. L. Bennett et al.",
      year: 2013,
      journal: "ApJS 208, 19 (2013)",
      arxiv: "1212.5226",
      table: "Table 4 (six-parameter LambdaCDM fit), column WMAP (68 % intervals)",
    },
    parameters: {
      H0: { value: 70.0, sigma: 2.2, checked: memo },
      Omega_m: { value: 0.279, sigma: 0.025, checked: memo },
      omega_b: { value: 0.02264, sigma: 0.0005, checked: memo },
    },
    assumptions: { flat: true, m_nu_eV: [], N_eff: 3.046, T_cmb: 2.72548 },
    assumptions_text:
      "six-parameter LambdaCDM: spatially flat, massless neutrinos, N_eff = 3.046, T_cmb = 2.72548 K (Fixsen 2009), w = -1",
    reported: {
      age_Gyr: { value: 13.74, sigma: 0.11, checked: memo },
      Omega_Lambda: { value: 0.721, sigma: 0.025, checked: memo },
    },
  },
  {
    id: "desi2024-cmb-pantheonplus-w0wa",
    title: "DESI 2024 BAO + CMB + Pantheon+, flat w0waCDM",
    citation: {
      authors: "DESI Collaboration: A. G. Adame et al.",
      year: 2025,
      journal: "JCAP 02 (2025) 021",
      arxiv: "2404.03002",
      table: "Table 3, flat w0waCDM, DESI+CMB+PantheonPlus (68 % intervals)",
    },
    parameters: {
      H0: { value: 68.03, sigma: 0.72, checked: memo },
      Omega_m: { value: 0.3085, sigma: 0.0068, checked: memo },
      w0: { value: -0.827, sigma: 0.063, checked: memo, text_shows: "w0 > -1 (abstract)" },
      wa: { value: -0.75, sigma: { plus: 0.29, minus: 0.25 }, checked: memo, text_shows: "wa < 0 (abstract)" },
    },
    assumptions: { flat: true, m_nu_eV: [0.06], N_eff: 3.044, T_cmb: 2.7255 },
    assumptions_text:
      "flat w0waCDM (w = w0 + wa (1 - a)), sum of neutrino masses fixed at 0.06 eV in one massive species, N_eff = 3.044, T_cmb = 2.7255 K; no baryon density in the table, so no early-universe rulers",
    reported: {},
  },
  {
    id: "riess2022-sh0es-h0",
    title: "SH0ES 2022, Cepheid-calibrated distance ladder H0",
    citation: {
      authors: "A. G. Riess, W. Yuan, L. M. Macri, D. Scolnic, D. Brout et al.",
      year: 2022,
      journal: "ApJL 934, L7 (2022)",
      arxiv: "2112.04510",
      table: "abstract, baseline Cepheid-SN Ia result (68 %, systematics included)",
    },
    parameters: {
      H0: { value: 73.04, sigma: 1.04, checked: text, text_shows: "H0 = 73.04 +/- 1.04 km/s/Mpc (abstract)" },
    },
    assumptions: {},
    assumptions_text: "a local measurement of H0 alone: extend a full set first, then this one, to replace its H0",
    reported: {},
    partial: true,
  },
];

export const PUBLISHED_PREFIX = "published/";

export function publishedSet(ref: string): PublishedSet | undefined {
  if (!ref.startsWith(PUBLISHED_PREFIX)) return undefined;
  const id = ref.slice(PUBLISHED_PREFIX.length);
  return PUBLISHED_SETS.find((s) => s.id === id);
}

/** The 68 % half-widths of a published uncertainty, as (+, -). */
export function sigmaParts(s: PublishedSigma): { plus: number; minus: number } {
  return typeof s === "number" ? { plus: s, minus: s } : s;
}
