import type { ErrorObject, ValidateFunction } from "ajv";
import { createRequire } from "node:module";
import { fileURLToPath } from "node:url";
import { closest, distance } from "fastest-levenshtein";
import schema from "../schema/scenario.schema.json" with { type: "json" };
import type { ParsedYaml } from "./parseScenarioYaml.js";
import { formatPath, type ScenarioIssue } from "./scenarioIssue.js";

import { SCENARIO_AJV_OPTIONS } from "../schema/scenarioAjvOptions.js";

/**
 * The compiled validator: the module precompiled at build time (dist/schema/scenarioValidator.cjs, CommonJS as ajv's standalone code requires its runtime helpers) when it exists,
 * otherwise ajv compiles the same schema with the same options now (when running from the TypeScript sources).
 */
async function loadValidator(): Promise<ValidateFunction> {
  // require(), not import(): importing CommonJS from an ES module first scans it for exports (~10 ms at start-up).
  const precompiled = fileURLToPath(new URL("../schema/scenarioValidator.cjs", import.meta.url));
  try {
    return createRequire(import.meta.url)(precompiled) as ValidateFunction;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== "MODULE_NOT_FOUND") throw e;
    const { Ajv } = await import("ajv");
    return new Ajv(SCENARIO_AJV_OPTIONS).compile(schema);
  }
}
const validate = await loadValidator();

type SchemaNode = { properties?: Record<string, unknown>; $ref?: string; items?: SchemaNode };

/** The schema node that describes the object at a given instance path. */
function schemaAt(segments: (string | number)[]): SchemaNode | undefined {
  let node: SchemaNode | undefined = schema as SchemaNode;
  const deref = (n: SchemaNode | undefined): SchemaNode | undefined => {
    if (n?.$ref?.startsWith("#/definitions/"))
      return (schema.definitions as Record<string, SchemaNode>)[n.$ref.slice(14)];
    return n;
  };
  for (const s of segments) {
    node = deref(node);
    if (!node) return undefined;
    node = typeof s === "number" ? node.items : (node.properties?.[s] as SchemaNode | undefined);
  }
  return deref(node);
}

function segmentsOf(instancePath: string): (string | number)[] {
  if (instancePath === "") return [];
  return instancePath
    .slice(1)
    .split("/")
    .map((s) => {
      const key = s.replace(/~1/g, "/").replace(/~0/g, "~");
      return /^\d+$/.test(key) ? Number(key) : key;
    });
}

function describeValue(v: unknown): string {
  if (typeof v === "string") return `"${v.length > 40 ? `${v.slice(0, 40)}...` : v}"`;
  if (v === null) return "nothing (null)";
  if (Array.isArray(v)) return "a list";
  if (typeof v === "object") return "a mapping";
  return String(v);
}

function valueAt(root: unknown, segments: (string | number)[]): unknown {
  // biome-ignore lint/suspicious/noExplicitAny: walks arbitrary parsed YAML by key path
  let v: any = root;
  for (const s of segments) v = v == null ? undefined : v[s];
  return v;
}

function message(
  e: ErrorObject,
  root: unknown,
  segments: (string | number)[],
): { path: (string | number)[]; text: string; at: "key" | "value" } {
  const got = describeValue(valueAt(root, segments));
  switch (e.keyword) {
    case "additionalProperties": {
      const key = (e.params as { additionalProperty: string }).additionalProperty;
      const allowed = Object.keys(schemaAt(segments)?.properties ?? {});
      const near = allowed.length ? closest(key, allowed) : undefined;
      const lower = allowed.find((k) => k.toLowerCase() === key.toLowerCase());
      const synonym = SYNONYMS.get(key.toLowerCase())?.find((k) => allowed.includes(k));
      const suggestion = lower ?? synonym ?? near;
      const hint =
        suggestion && (lower || synonym || levenshteinClose(key, suggestion)) ? ` did you mean ${suggestion}?` : "";
      return {
        path: [...segments, key],
        at: "key",
        text: `unknown key ${key}.${hint} Valid keys here: ${allowed.join(", ")}`,
      };
    }
    case "required":
      return {
        path: segments,
        at: "value",
        text: `missing required key ${(e.params as { missingProperty: string }).missingProperty}`,
      };
    case "type": {
      const v = valueAt(root, segments);
      // YAML 1.2 (what scenario files are read as) has only true and false; yes/no/on/off are text there.
      const yaml11 =
        (e.params as { type: string }).type === "boolean" &&
        typeof v === "string" &&
        YAML_11_BOOLEANS.has(v.toLowerCase())
          ? `; scenario files are YAML 1.2, where only true and false are booleans (write ${/^(y|yes|on|true)$/i.test(v) ? "true" : "false"})`
          : "";
      return {
        path: segments,
        at: "value",
        text: `must be ${String((e.params as { type: string | string[] }).type)
          .split(",")
          .map(article)
          .join(" or ")} (got ${got})${yaml11}`,
      };
    }
    case "const": {
      const v = valueAt(root, segments);
      const yaml11 =
        typeof v === "string" && YAML_11_BOOLEANS.has(v.toLowerCase())
          ? "; scenario files are YAML 1.2, where only true and false are booleans"
          : "";
      return {
        path: segments,
        at: "value",
        text: `must be true (got ${got})${yaml11}; to fix the curvature otherwise give Omega_k or Omega_de instead`,
      };
    }
    case "enum":
      return {
        path: segments,
        at: "value",
        text: `must be one of: ${(e.params as { allowedValues: unknown[] }).allowedValues.join(", ")} (got ${got})`,
      };
    case "pattern":
      return {
        path: segments,
        at: "value",
        text: `must be a slug of lowercase letters, digits and single hyphens, such as deep-field (got ${got})`,
      };
    case "minimum":
    case "maximum":
    case "exclusiveMinimum":
    case "exclusiveMaximum": {
      const p = e.params as { comparison: string; limit: number };
      return { path: segments, at: "value", text: `must be ${p.comparison} ${p.limit} (got ${got})` };
    }
    case "minItems":
      return {
        path: segments,
        at: "value",
        text: `must list at least ${(e.params as { limit: number }).limit} item(s)`,
      };
    case "maxItems":
      return { path: segments, at: "value", text: `may list at most ${(e.params as { limit: number }).limit} items` };
    case "minLength":
      return { path: segments, at: "value", text: "must not be empty" };
    case "maxLength":
      return {
        path: segments,
        at: "value",
        text: `may be at most ${(e.params as { limit: number }).limit} characters long`,
      };
    default:
      return { path: segments, at: "value", text: e.message ?? "is not valid" };
  }
}

/** Words people write for a key, mapped to the keys they mean (did-you-mean where spelling distance cannot tell). */
const SYNONYMS = new Map<string, string[]>(
  Object.entries({
    redshift: ["z", "redshifts"],
    zs: ["redshifts"],
    lookback: ["lookback_Gyr"],
    lookback_time: ["lookback_Gyr"],
    age: ["age_Gyr"],
    distance: ["comoving_distance_Mpc"],
    comoving_distance: ["comoving_distance_Mpc"],
    d_c: ["comoving_distance_Mpc"],
    size: ["size_kpc"],
    angular_size: ["size_arcsec"],
    area: ["area_deg2"],
    zmin: ["z_min"],
    zmax: ["z_max"],
    density: ["density_per_Mpc3"],
    number_density: ["density_per_Mpc3"],
    m: ["absolute_magnitude"],
    abs_mag: ["absolute_magnitude"],
    luminosity: ["luminosity_erg_s"],
    h: ["H0"],
    hubble: ["H0"],
    omega_lambda: ["Omega_Lambda"],
    lambda: ["Omega_Lambda"],
    w: ["w0"],
    mnu: ["m_nu_eV"],
    m_nu: ["m_nu_eV"],
    tcmb: ["T_cmb"],
    tcmb0: ["T_cmb"],
    neff: ["N_eff"],
    // Words people type from other tools' parameter names (the density parameters today, by their short names).
    om0: ["Omega_m"],
    omegam: ["Omega_m"],
    omega_m0: ["Omega_m"],
    ode0: ["Omega_de", "Omega_Lambda"],
    ol0: ["Omega_Lambda"],
    ok0: ["Omega_k"],
    omegak: ["Omega_k"],
    ob0: ["Omega_b"],
    ombh2: ["omega_b"],
    h0: ["H0"],
    sigma_8: ["sigma8"],
    parent: ["extends"],
    name: ["label"],
  }),
);

const YAML_11_BOOLEANS = new Set(["y", "yes", "n", "no", "on", "off"]);

function article(type: string): string {
  return type === "integer"
    ? "a whole number"
    : type === "object"
      ? "a mapping of keys to values"
      : type === "array"
        ? "a list"
        : `a ${type}`;
}

function levenshteinClose(a: string, b: string): boolean {
  // Suggest only when the nearest key is plausibly a misspelling: within a third of its length.
  return distance(a.toLowerCase(), b.toLowerCase()) <= Math.max(2, Math.floor(b.length / 3));
}

/** Validates parsed YAML against src/schema/scenario.schema.json with ajv; returns located, readable issues. */
export function validateScenarioSchema(parsed: ParsedYaml): ScenarioIssue[] {
  return schemaProblems(parsed).issues;
}

/** The schema's issues and, for each, the key path it concerns (so that the rest of the file can still be checked). */
export function schemaProblems(parsed: ParsedYaml): { issues: ScenarioIssue[]; paths: (string | number)[][] } {
  if (validate(parsed.value)) return { issues: [], paths: [] };
  const seen = new Set<string>();
  const issues: ScenarioIssue[] = [];
  const paths: (string | number)[][] = [];
  for (const e of validate.errors ?? []) {
    const segments = segmentsOf(e.instancePath);
    const m = message(e, parsed.value, segments);
    const pathText = formatPath(m.path);
    const dedupe = `${pathText}|${m.text}`;
    if (seen.has(dedupe)) continue;
    seen.add(dedupe);
    issues.push({ file: parsed.file, ...parsed.locate(m.path, m.at), path: pathText, message: m.text });
    paths.push(m.path);
  }
  return { issues, paths };
}
