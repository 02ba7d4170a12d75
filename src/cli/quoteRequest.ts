import { parse as parseYamlValue, stringify as stringifyYaml } from "yaml";

/** A bad `quote` argument: the argument as typed and what would be valid (exit 2, like scenario errors). */
export class QuoteArgumentError extends Error {
  constructor(
    readonly argument: string,
    readonly problem: string,
  ) {
    super(`${argument}: ${problem}`);
  }
}

export type PlacementKey = "z" | "lookback_Gyr" | "age_Gyr" | "comoving_distance_Mpc";

/** One place to quote numbers at, with the option that asked for it (for messages). */
export interface Placement {
  by: PlacementKey;
  value: number;
  argument: string;
}

/** One inline model: its key/value pairs as typed, in order. */
export interface InlineModel {
  argument: string;
  pairs: [string, unknown][];
}

export const PLACEMENT_OPTIONS: Record<string, { by: PlacementKey; what: string }> = {
  z: { by: "z", what: "redshifts" },
  "lookback-Gyr": { by: "lookback_Gyr", what: "lookback times in Gyr" },
  "age-Gyr": { by: "age_Gyr", what: "ages of the universe in Gyr" },
  "distance-Mpc": { by: "comoving_distance_Mpc", what: "comoving distances in Mpc" },
};

/** "0.5,1,2" (also repeated options) -> numbers, each finite; names the option on a bad entry. */
export function parseNumberList(option: string, texts: string[]): number[] {
  return parseNumberTexts(option, texts).map((n) => n.value);
}

/** A decimal number as people write one: 70, -0.5, .3, 1e-4, 2.5E+3; never hexadecimal, binary, octal or Infinity. */
export const DECIMAL_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Each number of a comma-separated option with its own text (so that a message quotes only the value at fault). */
export function parseNumberTexts(option: string, texts: string[]): { value: number; text: string }[] {
  const out: { value: number; text: string }[] = [];
  for (const text of texts) {
    for (const part of text.split(",")) {
      const t = part.trim();
      const x = DECIMAL_NUMBER.test(t) ? Number(t) : Number.NaN;
      if (!Number.isFinite(x))
        throw new QuoteArgumentError(
          `--${option} ${t.length > 40 ? `${t.slice(0, 40)}...` : t}`,
          `"${t.length > 40 ? `${t.slice(0, 40)}...` : t}" is not a decimal number; give decimal numbers separated by commas (e.g. 0.5,1,2)`,
        );
      out.push({ value: x, text: t });
    }
  }
  return out;
}

/**
 * "H0=70 Omega_m=0.3 m_nu_eV=[0.06] label='A model'" -> key/value pairs. Values are read as YAML flow scalars (so
 * numbers, true/false, lists and quoted text mean what they mean in a scenario file).
 */
export function parseInlineModel(argument: string): InlineModel {
  const tokens: string[] = [];
  let current = "";
  let quote: string | null = null;
  let depth = 0;
  for (const ch of argument) {
    if (quote) {
      current += ch;
      if (ch === quote) quote = null;
    } else if (ch === "'" || ch === '"') {
      quote = ch;
      current += ch;
    } else if (ch === "[" || ch === "{") {
      depth++;
      current += ch;
    } else if (ch === "]" || ch === "}") {
      depth--;
      current += ch;
    } else if (/\s/.test(ch) && depth === 0) {
      if (current) tokens.push(current);
      current = "";
    } else current += ch;
  }
  if (quote || depth !== 0)
    throw new QuoteArgumentError(`--model "${argument}"`, "an unclosed quote or bracket; write key=value pairs");
  if (current) tokens.push(current);
  if (tokens.length === 0)
    throw new QuoteArgumentError(
      `--model "${argument}"`,
      'no parameters; write for example --model "H0=70 Omega_m=0.3"',
    );
  const pairs: [string, unknown][] = [];
  for (const token of tokens) {
    const eq = token.indexOf("=");
    if (eq <= 0)
      throw new QuoteArgumentError(
        `--model "${argument}"`,
        `"${token}" is not key=value; write for example --model "H0=70 Omega_m=0.3"`,
      );
    const key = token.slice(0, eq);
    const text = token.slice(eq + 1);
    // "H0=70,Omega_m=0.3": pairs joined by commas instead of spaces.
    if (/^[^[{"']*[,;]\s*[A-Za-z_][A-Za-z0-9_]*=/.test(text))
      throw new QuoteArgumentError(
        `--model "${argument}"`,
        `separate key=value pairs with spaces, not commas: --model "${argument.replace(/[,;]\s*(?=[A-Za-z_][A-Za-z0-9_]*=)/g, " ")}"`,
      );
    let value: unknown;
    try {
      value = quickValue(text) ?? parseYamlValue(text, { schema: "core" });
    } catch {
      throw new QuoteArgumentError(`--model "${argument}"`, `the value of ${key} ("${text}") cannot be read`);
    }
    if (typeof value === "number" && !Number.isFinite(value))
      throw new QuoteArgumentError(`--model "${argument}"`, `${key}=${text} is not a finite number`);
    if (pairs.some(([k]) => k === key)) throw new QuoteArgumentError(`--model "${argument}"`, `${key} is given twice`);
    pairs.push([key, value]);
  }
  return { argument, pairs };
}

const YAML_FLOAT = /^[-+]?(\.[0-9]+|[0-9]+(\.[0-9]*)?)([eE][-+]?[0-9]+)?$/;

/**
 * The common values read without the YAML parser (start-up time): numbers as YAML 1.2's core schema reads them,
 * true/false, and lists of such numbers; undefined for anything else, which the YAML parser then reads.
 */
function quickValue(text: string): unknown {
  if (YAML_FLOAT.test(text)) return Number(text);
  if (text === "true" || text === "false") return text === "true";
  const list = /^\[(.*)\]$/.exec(text);
  if (list) {
    const items = list[1].split(",").map((x) => x.trim());
    if (items.every((x) => YAML_FLOAT.test(x))) return items.map(Number);
  }
  return undefined;
}

/** A value written as YAML 1.2 flow text: numbers and booleans as they are, text double-quoted, lists in brackets. */
function yamlFlow(v: unknown): string {
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : v > 0 ? ".inf" : v < 0 ? "-.inf" : ".nan";
  if (typeof v === "boolean" || v === null) return String(v);
  if (Array.isArray(v)) return `[${v.map(yamlFlow).join(", ")}]`;
  if (typeof v === "object") return stringifyYaml(v, { flowCollectionPadding: true, lineWidth: 0 }).trim();
  return JSON.stringify(String(v)); // JSON strings are YAML double-quoted scalars
}

/** Target fields that the placements carry when asked for (angular size, magnitude, flux). */
export interface TargetExtras {
  size_kpc?: number;
  absolute_magnitude?: number;
  luminosity_erg_s?: number;
}

/**
 * The scenario a quote is equivalent to, as YAML text: the models, the redshift placements as `redshifts`, every
 * other placement (and every placement when a size or luminosity is given) as a target. `--save` writes this text;
 * computing it with `compute` gives the same numbers.
 */
export function quoteScenario(
  models: InlineModel[],
  placements: Placement[],
  extras: TargetExtras,
  command: string,
): { data: Record<string, unknown>; text: string } {
  const redshifts = placements.filter((p) => p.by === "z").map((p) => p.value);
  // The command as typed, shortened so that no number of models or placements can outgrow the description field.
  const shown =
    command.length > 400
      ? `${command.slice(0, 400)}... (${models.length} models, ${placements.length} placements)`
      : command;
  const description = `Made by \`${shown}\`.`;
  const modelPairs = models.map((m, i): [string, unknown][] =>
    m.pairs.some(([k]) => k === "id") ? m.pairs : [["id", `m${i + 1}`], ...m.pairs],
  );
  const targets = quoteTargets(placements, extras);
  // The data, built as the YAML parser builds it from the text below (own properties only, in the same order).
  const data: Record<string, unknown> = { title: "Quick quote", id: "quote", description };
  if (redshifts.length > 0) data.redshifts = redshifts;
  data.models = modelPairs.map((pairs) => Object.fromEntries(pairs));
  if (targets.length > 0) data.targets = targets;
  const flowMap = (pairs: [string, unknown][]) =>
    `{ ${pairs.map(([k, v]) => `${yamlKey(k)}: ${yamlFlow(v)}`).join(", ")} }`;
  const lines = [
    "# Written by cosmoledger quote; compute it with: cosmoledger compute FILE",
    "title: Quick quote",
    "id: quote",
    `description: ${yamlFlow(description)}`,
  ];
  if (redshifts.length > 0) lines.push(`redshifts: ${yamlFlow(redshifts)}`);
  lines.push("models:", ...modelPairs.map((pairs) => `  - ${flowMap(pairs)}`));
  if (targets.length > 0) lines.push("targets:", ...targets.map((t) => `  - ${flowMap(Object.entries(t))}`));
  return { data, text: `${lines.join("\n")}\n` };
}

/** A key as typed: plain when it is a plain identifier, otherwise quoted (the schema then names it as unknown). */
const yamlKey = (k: string) => (/^[A-Za-z_][A-Za-z0-9_]*$/.test(k) ? k : JSON.stringify(k));

/** The targets a quote needs: one per placement that is not a plain redshift, or every placement given extras. */
export function quoteTargets(placements: Placement[], extras: TargetExtras): Record<string, unknown>[] {
  const withExtras = Object.keys(extras).length > 0;
  return placements
    .filter((p) => withExtras || p.by !== "z")
    .map((p) => ({ name: targetName(p), [p.by]: p.value, ...extras }));
}

/** The name a placement's target carries, also its heading in the output: "z = 2", "age = 1 Gyr". */
export function targetName(p: Placement): string {
  const unit = { z: "", lookback_Gyr: " Gyr", age_Gyr: " Gyr", comoving_distance_Mpc: " Mpc" }[p.by];
  const name = { z: "z", lookback_Gyr: "lookback", age_Gyr: "age", comoving_distance_Mpc: "D_C" }[p.by];
  return `${name} = ${p.value}${unit}`;
}
