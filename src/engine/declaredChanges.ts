import { ENGINE_VERSION } from "./engineVersion.js";

/** The model parameters a declared change may look at to say whether it applies (as a tables document stores them). */
export interface ChangedModelParameters {
  m_nu_eV: number[];
  Omega_b: number | null;
  Omega_k: number;
  w0: number;
  wa: number;
  radiation: string;
  N_eff: number | null;
}

/**
 * A change of computed numbers that an engine release makes on purpose (a convention of the trade, a more accurate
 * method). `verify` reports archived drift that such a change covers as explained, naming it; `--strict` fails only on
 * drift that no declared change explains.
 */
export interface DeclaredChange {
  /** Short name of our own, shown by verify and on diff pages. */
  id: string;
  /** The first engine version that computes the new numbers. */
  engine_version: string;
  /** Quantity key paths within a model that it may change; `*` stands for any run of characters within one key. */
  quantities: readonly string[];
  /** Which models it changes, in words (shown), and as a test on a model's stored parameters. */
  models: string;
  applies: (parameters: ChangedModelParameters) => boolean;
  /** Why, with the source of the new method or convention. */
  why: string;
}

/**
 * The engine's change log: every release that changes an archived number on purpose adds an entry here, with its
 * new ENGINE_VERSION. Entries are never edited or removed once released.
 */
export const DECLARED_CHANGES: readonly DeclaredChange[] = [
  {
    id: "neutrino-pressure-integral",
    engine_version: "1.1.0",
    quantities: [
      "redshifts[].Omega_m_z",
      "grid.Omega_m_z",
      "summary.z_matter_radiation_equality",
      "summary.k_eq_1_Mpc",
      "summary.deceleration_q0",
      "summary.z_acceleration",
    ],
    models: "models with a massive neutrino",
    applies: (p) => p.m_nu_eV.some((m) => m > 0),
    why: "The pressure of massive neutrinos (3p/rho) now comes from its own Fermi-Dirac integral, P(y) = int x^4/sqrt(x^2+y^2)/(e^x+1) dx (Kolb & Turner 1990, ch. 3), instead of the slope of the tabulated energy; it was off by up to 4e-7 relative where p << rho, and is now within 1e-10 (mpmath fixture test/fixtures/mpmath/neutrinoPressure.json). The energy density is unchanged.",
  },
  {
    id: "neutrino-93.14-ev",
    engine_version: "1.2.0",
    quantities: ["parameters.*", "summary.*", "redshifts[].*", "grid.*", "targets[].*", "surveys[].*"],
    models: "models with a massive neutrino",
    applies: (p) => p.m_nu_eV.some((m) => m > 0),
    why: "Massive neutrinos now follow the convention of the trade in the non-relativistic limit, Omega_nu h^2 = sum m / 93.14 eV (Mangano et al. 2005; Lesgourgues & Pastor 2006), instead of sum m / 92.70 eV; the relativistic limit stays N_eff/3 of the neutrino density per species. Omega_cb (Omega_m less the neutrinos) and every quantity of such models move by up to about 0.5 % of the neutrino share.",
  },
  {
    id: "equality-beyond-turnaround",
    engine_version: "1.3.0",
    quantities: ["summary.z_matter_de_equality", "warnings"],
    models: "closed models that recollapse before matter and dark energy reach equal densities",
    applies: (p) => p.Omega_k < 0,
    why: "A recollapsing model never reaches a scale factor beyond its turnaround, so a matter-dark energy equality that would lie there is now null, with a warning naming both scale factors, instead of the redshift of an epoch the model never has (the search for the crossing stops at the turnaround a_max; closed form with w = -1: a_eq = (Omega_m / Omega_de)^(1/3)).",
  },
  {
    id: "zero-weight-samples-counted",
    engine_version: "1.3.0",
    quantities: ["spread.rejected", "spread.rejected_because.*", "warnings"],
    models: "models whose samples file has rows of weight 0",
    applies: () => true,
    why: "Rows of weight 0 in a samples file carry no probability and were left out of every count (accepted plus rejected fell short of the rows read); they are now counted as rejected, with the reason 'weight 0 (a sample that carries no probability)'. The bands are unchanged.",
  },
  {
    id: "neutrino-matter-integral",
    engine_version: "1.3.0",
    // The quantities and their spreads' percentiles (spread.<section>.<key>.<q or mc_error>).
    quantities: ["parameters.*", "summary.*", "redshifts[].*", "grid.*", "targets[].*", "surveys[].*", "spread.*.*.*"],
    models: "models with a massive neutrino",
    applies: (p) => p.m_nu_eV.some((m) => m > 0),
    why: "The matter-like part of massive neutrinos (rho - 3p, in Omega_m(z) and matter-radiation equality) now comes from its own Fermi-Dirac integral, M = int x^2 y^2 / sqrt(x^2 + y^2) / (e^x + 1) dx, instead of the difference of the interpolated energy and pressure, which lost digits where the species is still mostly relativistic (2.5e-9 in Omega_m(z) at z = 63,096 for 1.5 eV species); and the energy table's step is halved (its error near y = 3 fell from 2.4e-10 to below 2e-11). Both are checked against 30-digit mpmath values (test/fixtures/mpmath/neutrinoMatter.json); numbers move by up to a few 1e-9.",
  },
  {
    id: "antipode-conditioning-note",
    engine_version: "1.3.0",
    quantities: ["warnings"],
    models: "closed models whose past light cone passes the antipode",
    applies: (p) => p.Omega_k < 0,
    why: "The warning of a model whose light has passed the antipode now also says that D_M = R sin(D_C/R) is ill-conditioned there (the integral's relative error times about |chi cot chi|, chi = D_C/R), so those distances are good to about 1e-10 |chi cot chi|; no number changes.",
  },
  {
    id: "published-set-wording",
    engine_version: "1.3.0",
    quantities: ["cautions"],
    models: "scenarios with a model that extends a published set",
    applies: () => true,
    why: "The caution on published sets now says that a value transcribed from a paper's table but not yet checked against it is marked so beside the citation, in words for the reader of a paper; no number changes.",
  },
  {
    id: "linear-growth-cautions",
    engine_version: "1.4.0",
    quantities: ["cautions"],
    models: "every scenario",
    applies: () => true,
    why: "The engine now also computes the linear growth of cold dark matter plus baryons (tables format 6: D(z), f(z), sigma8(z), f sigma8, S8; src/engine/linearGrowth.ts), and the cautions say what that growth leaves out (linear theory, scale-independent, dark energy smooth; with massive neutrinos, the growth of cold dark matter plus baryons below the free-streaming scale). No earlier number changes; the growth quantities are added, not drift.",
  },
];

/** Compares two dotted version numbers ("1.10.0" > "1.9.2"); negative, zero or positive. */
export function compareEngineVersions(a: string, b: string): number {
  const x = a.split(".").map(Number);
  const y = b.split(".").map(Number);
  for (let i = 0; i < Math.max(x.length, y.length); i++) {
    const d = (x[i] ?? 0) - (y[i] ?? 0);
    if (d !== 0) return d;
  }
  return 0;
}

const patternCache = new Map<string, RegExp>();
const patternOf = (p: string) => {
  let r = patternCache.get(p);
  if (!r) {
    r = new RegExp(`^${p.replace(/[.+?^${}()|[\]\\]/g, "\\$&").replace(/\*/g, "[^.]*")}$`);
    patternCache.set(p, r);
  }
  return r;
};

/**
 * The declared change that explains a drift of `quantity` (a key path within a model, array marks `[]` allowed) in a
 * model of a version computed by `frozenEngine`, under the engine `currentEngine`; null when none does.
 */
export function explainingChange(
  quantity: string,
  parameters: ChangedModelParameters,
  frozenEngine: string,
  changes: readonly DeclaredChange[] = DECLARED_CHANGES,
  currentEngine: string = ENGINE_VERSION,
): DeclaredChange | null {
  const path = quantity.replace(/\[\]$/, "");
  for (const c of changes) {
    if (
      compareEngineVersions(frozenEngine, c.engine_version) >= 0 ||
      compareEngineVersions(c.engine_version, currentEngine) > 0
    )
      continue;
    if (c.quantities.some((q) => patternOf(q).test(path)) && c.applies(parameters)) return c;
  }
  return null;
}
