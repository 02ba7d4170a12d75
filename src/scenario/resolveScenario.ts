import { labelTexProblem } from "./labelTex.js";
import { plausibilityWarnings } from "./plausibility.js";
import { DEFAULT_N_EFF, DEFAULT_T_CMB_K, NoBigBangError } from "../engine/index.js";
import { backgroundOf } from "./modelBackground.js";
import type { ParsedYaml } from "./parseScenarioYaml.js";
import { ScenarioInputError, formatPath, type ScenarioIssue } from "./scenarioIssue.js";
import {
  PUBLISHED_PREFIX,
  PUBLISHED_SETS,
  publishedSet,
  type PublishedSet,
  type PublishedSigma,
} from "./publishedSets.js";
import { MAX_SCENARIO_SAMPLES_BYTES, resolveSpread, type ResolveOptions, type SpreadSource } from "./resolveSpread.js";
import type {
  CurvatureKey,
  Provenance,
  ResolvedModel,
  ResolvedModelInputs,
  ResolvedScenario,
  ResolvedSpread,
  PublishedReference,
  SamplesTable,
  ResolvedSurvey,
  ResolvedTarget,
} from "./resolvedScenario.js";

export const DEFAULT_REDSHIFTS = [0.1, 0.5, 1, 2, 3, 5, 10];
export const DEFAULT_GRID_POINTS = 200;
export const DEFAULT_W0 = -1;
export const DEFAULT_WA = 0;
/** Largest number of (model, redshift) evaluations one scenario may ask for. */
/** At most this many model-redshift evaluations in the tables (redshifts, targets, survey edges): each is ~1.4 kB of JSON. */
export const MAX_TABLE_EVALUATIONS = 20_000;
/** At most this many model-redshift evaluations on the chart grid: each is ~0.35 kB of JSON. */
export const MAX_GRID_EVALUATIONS = 100_000;
/** At most this many model-redshift evaluations over every draw of every spread (~2 s of work per million). */
export const MAX_DRAW_EVALUATIONS = 4_000_000;
/** At most this many evaluations per draw of one model: its draws' numbers are held at once (~0.2 GB at this size). */
export const MAX_DRAW_EVALUATIONS_PER_MODEL = 1_000_000;
/**
 * At most this many banded quantities' rows (models with a spread x (redshifts + grid points + targets + surveys)):
 * each carries ten numbers per quantity in the document (~50 MB of JSON at this size).
 */
export const MAX_BANDED_ROWS = 10_000;
export const DEFAULT_DRAW_COUNT = 1000;
export const DEFAULT_DRAW_SEED = 1;

const CURVATURE_KEYS: CurvatureKey[] = ["flat", "Omega_k", "Omega_de", "Omega_Lambda"];
const BARYON_KEYS = ["Omega_b", "omega_b"] as const;
const SLUG = /^[a-z0-9]+(-[a-z0-9]+)*$/;

type RawModel = Record<string, unknown> & { id: string };
// biome-ignore lint/suspicious/noExplicitAny: raw YAML values, already checked against the scenario schema
type Raw = Record<string, any>;

/** The parameter box over which the engine's accuracy is verified (see DEVELOPERS.md). */
const VERIFIED = { Omega_m: [0.01, 3], Omega_k: [-1, 1], Omega_de: [-1, 2], w0: [-2, -1 / 3], wa: [-3, 2] } as const;

function inputsBaryonProvenance(p: Record<string, Provenance>): Provenance {
  return p.Omega_b ?? p.omega_b ?? "default";
}

/** The model keys that carry values through inheritance. */
const MODEL_VALUE_KEYS = [
  "H0",
  "Omega_m",
  "w0",
  "wa",
  "radiation",
  "T_cmb",
  "N_eff",
  "m_nu_eV",
  "sigma8",
  ...BARYON_KEYS,
  ...CURVATURE_KEYS,
] as const;

type Flat = {
  values: Record<string, unknown>;
  provenance: Record<string, Provenance>;
  spread: SpreadSource | null;
  published: PublishedSet[];
};

/** A model's parents in the order they apply: none, one, or a list. */
function parentsOf(m: Raw): string[] {
  if (m.extends === undefined) return [];
  return (Array.isArray(m.extends) ? m.extends : [m.extends]).filter(
    (x: unknown): x is string => typeof x === "string",
  );
}

/** A published set as a parent: its parameters and assumptions, and its marginal uncertainties as a spread. */
function publishedFlat(set: PublishedSet): Flat {
  const values: Record<string, unknown> = {};
  const provenance: Record<string, Provenance> = {};
  for (const [k, v] of Object.entries(set.assumptions)) {
    values[k] = Array.isArray(v) ? [...v] : v;
    provenance[k] = "inherited";
  }
  const sigmas: Record<string, PublishedSigma> = {};
  for (const [k, v] of Object.entries(set.parameters)) {
    values[k] = v.value;
    provenance[k] = "inherited";
    if (v.sigma !== null) sigmas[k] = v.sigma;
  }
  return { values, provenance, spread: { published: sigmas, origin: "published" }, published: [set] };
}

/** Two published marginal spreads merge key by key (the later set's uncertainty wins); any other spread replaces. */
function mergeSpreads(before: SpreadSource | null, after: SpreadSource): SpreadSource {
  if (before && "published" in before && "published" in after)
    return { published: { ...before.published, ...after.published }, origin: "published" };
  return after;
}

function publishedReference(set: PublishedSet): PublishedReference {
  return {
    id: set.id,
    title: set.title,
    authors: set.citation.authors,
    year: set.citation.year,
    journal: set.citation.journal,
    arxiv: set.citation.arxiv,
    table: set.citation.table,
    assumptions: set.assumptions_text,
    transcription: Object.fromEntries(Object.entries(set.parameters).map(([k, v]) => [k, v.checked])),
  };
}

/** Default scenario id from a file name: its base name without .yaml/.yml, if that is a valid slug. */
export function idFromFileName(path: string): string | null {
  const base = path.split(/[\\/]/).pop() ?? "";
  const stem = base.replace(/\.(ya?ml)$/i, "");
  return SLUG.test(stem) && stem.length <= 64 ? stem : null;
}

/**
 * Applies inheritance (extends), defaults and every cross-field rule to a schema-valid scenario, and builds each
 * model's background (rejecting models with no big bang). Throws ScenarioInputError with located issues.
 */
export function resolveScenario(
  parsed: ParsedYaml,
  sourceText: string,
  options: ResolveOptions = {},
): ResolvedScenario {
  const raw = parsed.value as Raw;
  const issues: ScenarioIssue[] = [];
  const fail = (path: (string | number)[], message: string, which: "key" | "value" = "value") =>
    issues.push({ file: parsed.file, ...parsed.locate(path, which), path: formatPath(path), message });

  // Scenario id
  let id: string | null = typeof raw.id === "string" ? raw.id : idFromFileName(parsed.file);
  if (id === null) {
    fail(
      [],
      `the file name does not give a valid id (lowercase letters, digits and single hyphens, at most 64 characters); add a line such as "id: my-scenario"`,
    );
    id = "invalid";
  }
  const defaultsApplied: string[] = [];
  if (raw.id === undefined) defaultsApplied.push("id");

  // Models: unique ids, then inheritance.
  const rawModels = raw.models as RawModel[];
  const index = new Map<string, number>();
  rawModels.forEach((m, i) => {
    if (index.has(m.id))
      fail(["models", i, "id"], `duplicate model id ${m.id} (first used by models[${index.get(m.id)}])`);
    else index.set(m.id, i);
  });
  rawModels.forEach((m, i) => {
    const own = CURVATURE_KEYS.filter((k) => m[k] !== undefined);
    if (own.length > 1)
      fail(
        ["models", i, own[1]],
        `curvature is over-determined: give only one of flat, Omega_k, Omega_de, Omega_Lambda (found ${own.join(" and ")})`,
        "key",
      );
    if (m.Omega_b !== undefined && m.omega_b !== undefined)
      fail(["models", i, "omega_b"], "baryons are over-determined: give Omega_b or omega_b, not both", "key");
    if (typeof m.label_tex === "string") {
      const problem = labelTexProblem(m.label_tex, options.frozen === true);
      if (problem) fail(["models", i, "label_tex"], `label_tex ${problem}`);
    }
    if (m.radiation === "none" && (m.T_cmb !== undefined || m.N_eff !== undefined)) {
      fail(
        ["models", i, m.T_cmb !== undefined ? "T_cmb" : "N_eff"],
        "contradictory radiation: radiation: none drops photons and neutrinos, so T_cmb and N_eff cannot be set in the same model",
        "key",
      );
    }
    parentsOf(m).forEach((ref, j) => {
      const at = Array.isArray(m.extends) ? ["models", i, "extends", j] : ["models", i, "extends"];
      if (ref.startsWith(PUBLISHED_PREFIX)) {
        if (!publishedSet(ref))
          fail(
            at,
            `extends unknown published set ${ref}; published sets: ${PUBLISHED_SETS.map((p) => PUBLISHED_PREFIX + p.id).join(", ")}`,
          );
      } else if (!index.has(ref)) {
        fail(at, `extends unknown model ${ref}; known ids: ${[...index.keys()].join(", ")}`);
      }
    });
  });
  // No stop here: every model without a problem so far is still resolved, so that one run reports every problem.

  // Flatten inheritance: parents apply left to right, own keys override; a curvature (baryon) key replaces the
  // curvature (baryon) group of what came before. A spread is inherited unless the model gives its own.
  const flattened = new Map<string, Flat>();
  const overlay = (
    values: Record<string, unknown>,
    provenance: Record<string, Provenance>,
    top: Raw,
    how: Provenance,
  ) => {
    if (CURVATURE_KEYS.some((k) => top[k] !== undefined))
      for (const k of CURVATURE_KEYS) {
        delete values[k];
        delete provenance[k];
      }
    if (BARYON_KEYS.some((k) => top[k] !== undefined))
      for (const k of BARYON_KEYS) {
        delete values[k];
        delete provenance[k];
      }
    if (top.radiation === "none") {
      delete values.T_cmb;
      delete values.N_eff;
    }
    for (const k of MODEL_VALUE_KEYS) {
      if (top[k] !== undefined) {
        values[k] = top[k];
        provenance[k] = how;
      }
    }
  };
  const flatten = (i: number, chain: string[]): Flat | null => {
    const m = rawModels[i];
    const done = flattened.get(m.id);
    if (done) return done;
    if (chain.includes(m.id)) {
      fail(["models", i, "extends"], `cyclic extends: ${[...chain, m.id].join(" -> ")}`);
      return null;
    }
    const values: Record<string, unknown> = {};
    const provenance: Record<string, Provenance> = {};
    let spread: SpreadSource | null = null;
    const published: PublishedSet[] = [];
    for (const ref of parentsOf(m)) {
      let parent: Flat | null;
      const set = publishedSet(ref);
      if (set) parent = publishedFlat(set);
      else {
        const parentIndex = index.get(ref);
        if (parentIndex === undefined) return null; // an unknown parent, reported above
        parent = flatten(parentIndex, [...chain, m.id]);
      }
      if (!parent) return null;
      overlay(values, provenance, parent.values, "inherited");
      for (const p of parent.published) if (!published.includes(p)) published.push(p);
      if (parent.spread)
        spread = mergeSpreads(
          spread,
          "published" in parent.spread ? parent.spread : { ...parent.spread, origin: "inherited" },
        );
    }
    overlay(values, provenance, m, "set");
    if (m.spread !== undefined) spread = m.spread === "none" ? null : { raw: m.spread, origin: "set", model: i };
    const result = { values, provenance, spread, published };
    flattened.set(m.id, result);
    return result;
  };
  for (let i = 0; i < rawModels.length; i++) flatten(i, []);
  // Models with a problem so far (a bad id, an unknown or cyclic parent, over-determined keys) are not resolved
  // further; the others are, and their problems are reported in the same run.
  const brokenModels = new Set(
    issues.map((x) => /^models\[(\d+)\]/.exec(x.path)).flatMap((m) => (m ? [Number(m[1])] : [])),
  );

  const models: ResolvedModel[] = [];
  const samples: Record<string, SamplesTable> = {};
  const samplesBytes = new Map<string, number>();
  const plausibility: ScenarioIssue[] = [];
  rawModels.forEach((m, i) => {
    const flat = brokenModels.has(i) ? undefined : flattened.get(m.id);
    if (!flat) return;
    const { values: v, provenance: p } = flat;
    const here = ["models", i];
    for (const k of ["H0", "Omega_m"]) {
      if (v[k] === undefined) fail(here, `${k} is required: set it in model ${m.id} or extend a model that sets it`);
    }
    if (v.H0 === undefined || v.Omega_m === undefined) return;
    const curvatureKey = (CURVATURE_KEYS.find((k) => v[k] !== undefined) ?? "flat") as CurvatureKey;
    const prov = (k: string, fallback: Provenance = "default"): Provenance => p[k] ?? fallback;
    const radiation = (v.radiation as "thermal" | "none" | undefined) ?? "thermal";
    const inputs: ResolvedModelInputs = {
      H0: v.H0 as number,
      Omega_m: v.Omega_m as number,
      curvature_key: curvatureKey,
      curvature_value: curvatureKey === "flat" ? null : (v[curvatureKey] as number),
      w0: (v.w0 as number | undefined) ?? DEFAULT_W0,
      wa: (v.wa as number | undefined) ?? DEFAULT_WA,
      radiation,
      T_cmb: radiation === "none" ? null : ((v.T_cmb as number | undefined) ?? DEFAULT_T_CMB_K),
      N_eff: radiation === "none" ? null : ((v.N_eff as number | undefined) ?? DEFAULT_N_EFF),
      baryon_key: v.Omega_b !== undefined ? "Omega_b" : v.omega_b !== undefined ? "omega_b" : null,
      baryon_value: (v.Omega_b ?? v.omega_b ?? null) as number | null,
      m_nu_eV: [...((v.m_nu_eV as number[] | undefined) ?? [])],
      ...(v.sigma8 !== undefined ? { sigma8: v.sigma8 as number } : {}),
    };
    const provenance: ResolvedModel["provenance"] = {
      H0: prov("H0"),
      Omega_m: prov("Omega_m"),
      curvature_key: prov(curvatureKey),
      curvature_value: prov(curvatureKey),
      w0: prov("w0"),
      wa: prov("wa"),
      radiation: prov("radiation"),
      T_cmb: radiation === "none" ? prov("radiation") : prov("T_cmb"),
      N_eff: radiation === "none" ? prov("radiation") : prov("N_eff"),
      baryon_key: inputsBaryonProvenance(p),
      baryon_value: inputsBaryonProvenance(p),
      m_nu_eV: prov("m_nu_eV"),
      ...(v.sigma8 !== undefined ? { sigma8: prov("sigma8") } : {}),
    };
    if (radiation === "none" && inputs.m_nu_eV.some((x) => x > 0)) {
      fail(
        [...here, p.m_nu_eV === "set" ? "m_nu_eV" : "radiation"],
        "massive neutrinos need thermal radiation: their temperature follows T_cmb; remove m_nu_eV or radiation: none",
        "key",
      );
      return;
    }
    if (curvatureKey === "Omega_Lambda" && (inputs.w0 !== -1 || inputs.wa !== 0)) {
      fail(
        [...here, "Omega_Lambda"],
        `Omega_Lambda is a cosmological constant (w0 = -1, wa = 0) but this model has w0 = ${inputs.w0}, wa = ${inputs.wa}; use Omega_de for evolving dark energy`,
        "key",
      );
      return;
    }
    for (const w of plausibilityWarnings(inputs, (k) => p[k] === "set"))
      plausibility.push({
        file: parsed.file,
        ...parsed.locate([...here, w.key], "value"),
        path: formatPath([...here, w.key]),
        message: w.message,
      });
    let background: ReturnType<typeof backgroundOf>;
    try {
      background = backgroundOf(inputs);
    } catch (e) {
      if (e instanceof NoBigBangError || e instanceof RangeError) {
        fail(here, `model ${m.id}: ${e.message}`);
        return;
      }
      throw e;
    }
    // Omega_m + Omega_de = 1 with radiation left to its default: the closure relation then makes the model closed by
    // exactly Omega_r, which is rarely what was meant (common practice: such parameter pairs are quoted for a flat
    // model). The curvature key is where it is written, so the warning is located there.
    if (
      (inputs.curvature_key === "Omega_de" || inputs.curvature_key === "Omega_Lambda") &&
      background.Omega_r > 0 &&
      background.Omega_k < 0 &&
      Math.abs(background.Omega_k + background.Omega_r) <= 1e-12 &&
      p[inputs.curvature_key] === "set"
    )
      plausibility.push({
        file: parsed.file,
        ...parsed.locate([...here, inputs.curvature_key], "value"),
        path: formatPath([...here, inputs.curvature_key]),
        message: `Omega_m + ${inputs.curvature_key} = 1 with radiation (Omega_r = ${background.Omega_r.toPrecision(3)}) makes this model closed, Omega_k = -Omega_r; for a flat model write flat: true and let ${inputs.curvature_key === "Omega_Lambda" ? "Omega_Lambda" : "Omega_de"} follow from closure`,
      });
    const warnings: string[] = [];
    const check = (name: keyof typeof VERIFIED, value: number) => {
      const [lo, hi] = VERIFIED[name];
      if (value < lo || value > hi)
        warnings.push(
          `${name} = ${value} lies outside [${lo.toPrecision(3)}, ${hi.toPrecision(3)}], where the engine's 1e-10 accuracy is verified`,
        );
    };
    check("Omega_m", background.Omega_m);
    check("Omega_k", background.Omega_k);
    check("Omega_de", background.Omega_de);
    if (background.Omega_de !== 0) {
      check("w0", background.w0);
      check("wa", background.wa);
    }
    let spread: ResolvedSpread | undefined;
    if (flat.spread) {
      const resolved = resolveSpread(flat.spread, inputs, {
        fail,
        failInFile: (issue) => issues.push({ path: `models[${i}].spread.samples`, ...issue }),
        here,
        scenarioFile: parsed.file,
        readAttachment: options.readAttachment,
        frozen: options.frozen,
      });
      if (!resolved) return;
      spread = resolved.spread;
      if (resolved.samples) {
        samples[m.id] = resolved.samples;
        // Each file once (by its one spelling), and all of them within what a version record may hold.
        samplesBytes.set(resolved.samples.path, Buffer.byteLength(resolved.samples.text, "utf8"));
        const total = [...samplesBytes.values()].reduce((a, b) => a + b, 0);
        if (total > MAX_SCENARIO_SAMPLES_BYTES && !options.frozen) {
          fail(
            [...here, "spread", "samples"],
            `the samples files of this scenario add up to ${total} bytes; at most ${MAX_SCENARIO_SAMPLES_BYTES} (16 MiB) are allowed together, because a frozen version keeps every one (thin the chains first)`,
          );
          return;
        }
      }
    }
    models.push({
      id: m.id,
      label: (m.label as string | undefined) ?? m.id,
      ...(m.label_tex !== undefined ? { label_tex: m.label_tex as string } : {}),
      extends: Array.isArray(m.extends) ? [...(m.extends as string[])] : ((m.extends as string | undefined) ?? null),
      notes: (m.notes as string | undefined) ?? null,
      inputs,
      ...(flat.published.length > 0 ? { published: flat.published.map(publishedReference) } : {}),
      ...(spread ? { spread } : {}),
      provenance,
      background,
      warnings,
    });
  });

  // Baseline
  let baseline = raw.baseline as string | undefined;
  if (baseline === undefined) {
    baseline = rawModels[0].id;
    defaultsApplied.push("baseline");
  } else if (!index.has(baseline))
    fail(["baseline"], `baseline names unknown model ${baseline}; known ids: ${[...index.keys()].join(", ")}`);

  // Redshifts and grid
  let redshifts = raw.redshifts as number[] | undefined;
  if (redshifts === undefined) {
    redshifts = DEFAULT_REDSHIFTS;
    defaultsApplied.push("redshifts");
  }
  const g = (raw.grid ?? {}) as Raw;
  if (g.z_max === undefined) defaultsApplied.push("grid.z_max");
  if (g.points === undefined) defaultsApplied.push("grid.points");
  if (g.spacing === undefined) defaultsApplied.push("grid.spacing");
  const grid = {
    z_max: (g.z_max as number | undefined) ?? Math.max(10, ...redshifts),
    points: (g.points as number | undefined) ?? DEFAULT_GRID_POINTS,
    spacing: (g.spacing as "log" | "linear" | undefined) ?? "log",
  };

  // Draws: only when some model has a spread, so that scenarios without one keep their inputs (and hashes).
  let draws: { count: number; seed: number } | undefined;
  const d = (raw.draws ?? {}) as Raw;
  if (models.some((m) => m.spread)) {
    if (d.count === undefined) defaultsApplied.push("draws.count");
    if (d.seed === undefined) defaultsApplied.push("draws.seed");
    draws = {
      count: (d.count as number | undefined) ?? DEFAULT_DRAW_COUNT,
      seed: (d.seed as number | undefined) ?? DEFAULT_DRAW_SEED,
    };
  }

  // Targets and surveys
  const placementKeys = ["z", "lookback_Gyr", "age_Gyr", "comoving_distance_Mpc"] as const;
  const targets: ResolvedTarget[] = [];
  ((raw.targets ?? []) as Raw[]).forEach((t, i) => {
    const given = placementKeys.filter((k) => t[k] !== undefined);
    if (given.length !== 1) {
      fail(
        ["targets", i],
        given.length === 0
          ? `target ${t.name} needs exactly one of z, lookback_Gyr, age_Gyr, comoving_distance_Mpc to place it`
          : `target ${t.name} is placed twice (${given.join(" and ")}): give exactly one of z, lookback_Gyr, age_Gyr, comoving_distance_Mpc`,
      );
      return;
    }
    const by = given[0];
    targets.push({
      name: t.name,
      placement: by === "z" ? { by, z: t.z } : { by, value: t[by] },
      size_kpc: t.size_kpc ?? null,
      ...(t.size_arcsec !== undefined ? { size_arcsec: t.size_arcsec } : {}),
      absolute_magnitude: t.absolute_magnitude ?? null,
      luminosity_erg_s: t.luminosity_erg_s ?? null,
    });
  });
  const surveys: ResolvedSurvey[] = [];
  ((raw.surveys ?? []) as Raw[]).forEach((s, i) => {
    if (!(s.z_max > s.z_min)) {
      fail(["surveys", i, "z_max"], `z_max (${s.z_max}) must be greater than z_min (${s.z_min})`);
      return;
    }
    surveys.push({
      name: s.name,
      area_deg2: s.area_deg2,
      z_min: s.z_min,
      z_max: s.z_max,
      density_per_Mpc3: s.density_per_Mpc3 ?? null,
    });
  });

  // Limits sized so that a scenario at both computes in ~0.5 GB and builds its page in ~1.1 GB (npm run bench).
  const tableWork = rawModels.length * (redshifts.length + targets.length + 2 * surveys.length);
  if (tableWork > MAX_TABLE_EVALUATIONS) {
    fail(
      ["models"],
      `this scenario asks for ${tableWork} table evaluations (models x (redshifts + targets + 2 x surveys)); at most ${MAX_TABLE_EVALUATIONS} are allowed (fewer models, redshifts, targets or surveys)`,
    );
  }
  const gridWork = rawModels.length * grid.points;
  if (gridWork > MAX_GRID_EVALUATIONS) {
    fail(
      grid.points > 200 ? ["grid", "points"] : ["models"],
      `this scenario asks for ${gridWork} chart-grid evaluations (models x grid points); at most ${MAX_GRID_EVALUATIONS} are allowed (fewer models or grid points)`,
    );
  }
  if (draws) {
    const perDraw = redshifts.length + grid.points;
    const drawWork = models.reduce(
      (n, m) => n + (m.spread ? (m.spread.form === "samples" ? m.spread.rows : draws!.count) * perDraw : 0),
      0,
    );
    const at = raw.draws?.count !== undefined ? ["draws", "count"] : ["models"];
    if (drawWork > MAX_DRAW_EVALUATIONS)
      fail(
        at,
        `the spreads ask for ${drawWork} draw evaluations (draws x (redshifts + grid points), summed over models with a spread); at most ${MAX_DRAW_EVALUATIONS} are allowed (fewer draws, rows or grid points)`,
      );
    const perModel = Math.max(
      ...models.map((m) => (m.spread ? (m.spread.form === "samples" ? m.spread.rows : draws!.count) * perDraw : 0)),
    );
    if (perModel > MAX_DRAW_EVALUATIONS_PER_MODEL)
      fail(
        at,
        `one model's spread asks for ${perModel} draw evaluations (draws x (redshifts + grid points)); at most ${MAX_DRAW_EVALUATIONS_PER_MODEL} per model are allowed (fewer draws, rows or grid points)`,
      );
    const banded = models.filter((m) => m.spread).length * (perDraw + targets.length + surveys.length);
    if (banded > MAX_BANDED_ROWS)
      fail(
        ["models"],
        `the spreads would band ${banded} rows (models with a spread x (redshifts + grid points + targets + surveys)); at most ${MAX_BANDED_ROWS} are allowed (fewer spread models or grid points)`,
      );
  }
  // Warnings go with the errors: they may explain one (H0 = 0.7 makes omega_b = 0.0224 an impossible Omega_b).
  if (issues.length > 0)
    throw new ScenarioInputError([...issues, ...plausibility.map((w) => ({ ...w, severity: "warning" as const }))]);

  return {
    id: id!,
    title: raw.title,
    description: raw.description ?? null,
    author: raw.author ?? null,
    tags: raw.tags ?? [],
    baseline: baseline!,
    redshifts,
    grid,
    models,
    targets,
    surveys,
    defaults_applied: defaultsApplied,
    ...(draws ? { draws, samples } : {}),
    ...(raw.h_units === true ? { h_units: true as const } : {}),
    plausibility,
    // The recorded name is the file's own name: documents and versions never depend on where a command ran,
    // and never hold a path of the builder's machine.
    source: { path: parsed.file, name: parsed.file.split(/[\\/]/).pop() ?? parsed.file, text: sourceText },
  };
}
