import { createHash } from "node:crypto";
import { choleskyLower } from "../statistics/index.js";
import type { PublishedSigma } from "./publishedSets.js";
import { sigmaParts } from "./publishedSets.js";
import {
  SPREAD_KEYS,
  type NormalSpreadParameter,
  type ResolvedModelInputs,
  type ResolvedSpread,
  type SamplesTable,
  type SpreadKey,
} from "./resolvedScenario.js";
import { parseSamplesFile } from "./samplesFile.js";
import type { ScenarioIssue } from "./scenarioIssue.js";

/** Reads a file named relative to the scenario's folder (the command line's, or an archived version's copy). */
export type AttachmentReader = (relativePath: string) => string;

/**
 * How a scenario is resolved: where its samples files come from, and whether it is the source of a frozen version
 * (`frozen`: `verify` recomputing it). A frozen source's samples files are read by the rules of the release that
 * froze them (a "#" anywhere starts a comment, any number JavaScript reads, no least row count, no cap on their
 * sum), so that an archived version keeps verifying; new files meet today's stricter rules.
 */
export interface ResolveOptions {
  readAttachment?: AttachmentReader;
  frozen?: boolean;
}

/** At most this many bytes in a samples file: a frozen version keeps the file's text. */
export const MAX_SAMPLES_FILE_BYTES = 4 * 1024 * 1024;
/** At most this many bytes of samples files in one scenario (each file counted once): a version record keeps them. */
export const MAX_SCENARIO_SAMPLES_BYTES = 16 * 1024 * 1024;

/**
 * One spelling for a path relative to the scenario's folder: forward slashes, no "." segments, no empty segments
 * ("./a.csv", "a.csv" and ".//a.csv" are one file), so that a version record keeps each file once.
 */
export const canonicalAttachmentPath = (path: string): string =>
  path
    .replace(/\\/g, "/")
    .split("/")
    .filter((s) => s !== "" && s !== ".")
    .join("/");

/**
 * Where a model's spread comes from: the YAML value of a model (`model` is its index, to locate problems), or the
 * marginal uncertainties of a published set.
 */
export type SpreadSource =
  | { raw: unknown; origin: "set" | "inherited"; model: number }
  | { published: Record<string, PublishedSigma>; origin: "published" };

type Path = (string | number)[];
interface Context {
  /** Reports a problem at a key path of the scenario file. */
  fail: (path: Path, message: string, which?: "key" | "value") => void;
  /** Reports a problem inside a samples file. */
  failInFile: (issue: Omit<ScenarioIssue, "path"> & { path?: string }) => void;
  /** Where the model stands (models[i]), for problems of an inherited or published spread. */
  here: Path;
  scenarioFile: string;
  readAttachment?: AttachmentReader;
  frozen?: boolean;
}

const isRecord = (x: unknown): x is Record<string, unknown> => typeof x === "object" && x !== null && !Array.isArray(x);

/** The value a spread varies around: the model's own value of that key (0 for Omega_k of a flat model). */
export function spreadCenter(inputs: ResolvedModelInputs, key: SpreadKey): number | string {
  switch (key) {
    case "H0":
    case "Omega_m":
    case "w0":
    case "wa":
      return inputs[key];
    case "N_eff":
    case "T_cmb":
      return inputs[key] ?? "this model has radiation: none, so there is no N_eff or T_cmb to vary";
    case "sigma8":
      return inputs.sigma8 ?? "this model gives no sigma8; set sigma8 first";
    case "Omega_b":
    case "omega_b":
      return inputs.baryon_key === key
        ? inputs.baryon_value!
        : inputs.baryon_key === null
          ? `this model has no baryon density; set ${key} first`
          : `this model sets ${inputs.baryon_key}, so vary ${inputs.baryon_key} instead of ${key}`;
    case "Omega_k":
      if (inputs.curvature_key === "flat") return 0;
      return inputs.curvature_key === "Omega_k"
        ? inputs.curvature_value!
        : `this model fixes curvature by ${inputs.curvature_key}, so vary ${inputs.curvature_key} instead of Omega_k`;
    case "Omega_de":
    case "Omega_Lambda":
      return inputs.curvature_key === key
        ? inputs.curvature_value!
        : `this model fixes curvature by ${inputs.curvature_key}, so vary ${inputs.curvature_key === "flat" ? "Omega_k" : inputs.curvature_key} instead of ${key}`;
  }
}

/** A model's inputs with some parameters replaced by a draw's values (curvature and baryons keep their key). */
export function inputsWithDraw(
  inputs: ResolvedModelInputs,
  keys: readonly SpreadKey[],
  values: ArrayLike<number>,
): ResolvedModelInputs {
  const out: ResolvedModelInputs = { ...inputs };
  for (let j = 0; j < keys.length; j++) {
    const k = keys[j];
    const x = values[j];
    if (k === "Omega_k" || k === "Omega_de" || k === "Omega_Lambda") {
      out.curvature_key = k;
      out.curvature_value = x;
    } else if (k === "Omega_b" || k === "omega_b") {
      out.baryon_key = k;
      out.baryon_value = x;
    } else out[k] = x;
  }
  return out;
}

/** A spread of a model, checked against that model's keys; null (with the problems reported) when it cannot be used. */
export function resolveSpread(
  source: SpreadSource,
  inputs: ResolvedModelInputs,
  ctx: Context,
): { spread: ResolvedSpread; samples?: SamplesTable } | null {
  if (source.origin === "published") {
    const parameters: NormalSpreadParameter[] = [];
    for (const [key, sigma] of Object.entries(source.published)) {
      const center = spreadCenter(inputs, key as SpreadKey);
      if (typeof center === "string") {
        ctx.fail(
          [...ctx.here, "extends"],
          `the published set's uncertainty on ${key} cannot be used: ${center}; add spread: none or a spread of your own`,
        );
        return null;
      }
      parameters.push({ key: key as SpreadKey, center, ...sigmaParts(sigma) });
    }
    return { spread: { form: "normal", parameters, correlation: null, from: "published" } };
  }
  const base: Path = source.origin === "set" ? ["models", source.model, "spread"] : [...ctx.here, "extends"];
  const inherited = source.origin === "inherited";
  const where = (path: Path): Path => (inherited ? base : path);
  const raw = source.raw;
  if (!isRecord(raw)) {
    ctx.fail(
      base,
      "spread must be none, a mapping with normal (and optionally correlation), or a mapping with samples",
    );
    return null;
  }
  const keys = Object.keys(raw);
  const unknown = keys.filter((k) => !["normal", "correlation", "samples"].includes(k));
  if (unknown.length > 0) {
    ctx.fail(
      where([...base, unknown[0]]),
      `unknown key ${unknown[0]} in spread; valid keys: normal, correlation, samples`,
      "key",
    );
    return null;
  }
  if ((raw.normal === undefined) === (raw.samples === undefined)) {
    ctx.fail(base, "spread needs exactly one of normal (uncertainties per parameter) or samples (a CSV file of draws)");
    return null;
  }
  if (raw.samples !== undefined) {
    if (raw.correlation !== undefined) {
      ctx.fail(
        where([...base, "correlation"]),
        "correlation goes with normal; a samples file carries its own correlations",
        "key",
      );
      return null;
    }
    return samplesSpread(raw.samples, inputs, ctx, where([...base, "samples"]));
  }
  if (!isRecord(raw.normal) || Object.keys(raw.normal).length === 0) {
    ctx.fail(
      where([...base, "normal"]),
      `normal must map parameter keys to their 68 % uncertainties, e.g. { H0: 0.5, Omega_m: 0.007 }`,
    );
    return null;
  }
  const parameters: NormalSpreadParameter[] = [];
  let ok = true;
  for (const [key, sigma] of Object.entries(raw.normal)) {
    const at = where([...base, "normal", key]);
    if (!(SPREAD_KEYS as readonly string[]).includes(key)) {
      ctx.fail(at, `${key} is not a parameter a spread can vary; valid: ${SPREAD_KEYS.join(", ")}`, "key");
      ok = false;
      continue;
    }
    const parts = isRecord(sigma) ? sigma : { plus: sigma, minus: sigma };
    const plus = parts.plus;
    const minus = parts.minus;
    if (
      typeof plus !== "number" ||
      typeof minus !== "number" ||
      !(plus > 0) ||
      !(minus > 0) ||
      !Number.isFinite(plus) ||
      !Number.isFinite(minus) ||
      Object.keys(parts).some((k) => k !== "plus" && k !== "minus")
    ) {
      ctx.fail(
        at,
        `the uncertainty of ${key} must be a positive number, or { plus: a, minus: b } with positive a and b`,
      );
      ok = false;
      continue;
    }
    const center = spreadCenter(inputs, key as SpreadKey);
    if (typeof center === "string") {
      ctx.fail(at, `${key} cannot vary: ${center}`, "key");
      ok = false;
      continue;
    }
    parameters.push({ key: key as SpreadKey, center, plus, minus });
  }
  if (!ok) return null;
  let correlation: number[][] | null = null;
  if (raw.correlation !== undefined) {
    const at = where([...base, "correlation"]);
    const n = parameters.length;
    const order = parameters.map((p) => p.key).join(", ");
    const c = raw.correlation;
    if (
      !Array.isArray(c) ||
      c.length !== n ||
      c.some(
        (row) =>
          !Array.isArray(row) || row.length !== n || row.some((x) => typeof x !== "number" || !Number.isFinite(x)),
      )
    ) {
      ctx.fail(
        at,
        `correlation must be a ${n} x ${n} matrix of numbers, rows and columns in the order of normal (${order})`,
      );
      return null;
    }
    const m = c as number[][];
    for (let i = 0; i < n; i++) {
      if (m[i][i] !== 1) {
        ctx.fail(
          where([...base, "correlation", i, i]),
          `the diagonal of a correlation matrix is 1 (row ${i + 1}, ${parameters[i].key}, has ${m[i][i]})`,
        );
        return null;
      }
      for (let j = 0; j < i; j++) {
        if (Math.abs(m[i][j] - m[j][i]) > 1e-12) {
          ctx.fail(
            where([...base, "correlation", i, j]),
            `correlation is not symmetric: row ${i + 1} column ${j + 1} is ${m[i][j]} but row ${j + 1} column ${i + 1} is ${m[j][i]} (${parameters[i].key}, ${parameters[j].key})`,
          );
          return null;
        }
        if (Math.abs(m[i][j]) > 1) {
          ctx.fail(
            where([...base, "correlation", i, j]),
            `a correlation lies in [-1, 1]; ${parameters[i].key}-${parameters[j].key} has ${m[i][j]}`,
          );
          return null;
        }
      }
    }
    if (choleskyLower(m) === null) {
      ctx.fail(
        at,
        `correlation is not positive definite (no Cholesky factor): some combination of ${order} would have negative variance; check the signs and sizes of the correlations`,
      );
      return null;
    }
    correlation = m.map((row) => [...row]);
  }
  return { spread: { form: "normal", parameters, correlation, from: source.origin } };
}

function samplesSpread(
  value: unknown,
  inputs: ResolvedModelInputs,
  ctx: Context,
  at: Path,
): { spread: ResolvedSpread; samples: SamplesTable } | null {
  if (typeof value !== "string" || value.trim() === "") {
    ctx.fail(at, "samples must name a CSV file, relative to the scenario's folder");
    return null;
  }
  // biome-ignore lint/suspicious/noControlCharactersInRegex: control characters in a path are what is refused
  if (/[\u0000-\u001f]/.test(value)) {
    ctx.fail(at, "samples names a path holding a control character (NUL, line break); name a plain file");
    return null;
  }
  if (value.split(/[\\/]/).includes("..")) {
    ctx.fail(at, `samples must name a file inside the scenario's folder or below it, without "..": ${value}`);
    return null;
  }
  if (value.startsWith("/") || /^[A-Za-z]:[\\/]/.test(value)) {
    ctx.fail(
      at,
      `samples must be a path relative to the scenario's folder (an absolute path would not travel with the archive): ${value}`,
    );
    return null;
  }
  if (!ctx.readAttachment) {
    ctx.fail(at, `samples file ${value} cannot be read here: give the scenario as a file`);
    return null;
  }
  let text: string;
  const path = canonicalAttachmentPath(value);
  try {
    text = ctx.readAttachment(path);
  } catch (e) {
    // The system refusing (permission, I/O) is not an input problem: it keeps its own exit status (4).
    if (typeof (e as { code?: unknown }).code === "string") throw e;
    ctx.fail(at, `cannot read samples file ${value}: ${(e as Error).message}`);
    return null;
  }
  const bytes = Buffer.byteLength(text, "utf8");
  if (bytes > MAX_SAMPLES_FILE_BYTES) {
    ctx.fail(
      at,
      `samples file ${value} has ${bytes} bytes; at most ${MAX_SAMPLES_FILE_BYTES} (4 MiB) are allowed, because a frozen version keeps the file (thin the chain first)`,
    );
    return null;
  }
  const dir = ctx.scenarioFile.includes("/") ? ctx.scenarioFile.slice(0, ctx.scenarioFile.lastIndexOf("/") + 1) : "";
  // The table (and so a version record's attachment) goes by the one spelling of the path.
  const parsed = parseSamplesFile(text, path, ctx.frozen === true);
  if (parsed.table === null) {
    for (const p of parsed.problems)
      ctx.failInFile({ file: dir + value, line: p.line, column: p.column, message: p.message });
    return null;
  }
  for (const key of parsed.table.columns) {
    const center = spreadCenter(inputs, key);
    if (typeof center === "string") {
      ctx.fail(at, `samples file ${value} has a column ${key}, which cannot vary: ${center}`);
      return null;
    }
  }
  return {
    spread: {
      form: "samples",
      path: value,
      sha256: createHash("sha256").update(text, "utf8").digest("hex"),
      rows: parsed.table.values[0]?.length ?? 0,
      columns: parsed.table.columns,
      weighted: parsed.table.weights !== null,
    },
    samples: parsed.table,
  };
}
