import { LineCounter, parseDocument, isMap, isSeq, isScalar, isAlias, type Node } from "yaml";
import { ScenarioInputError, formatPath, type ScenarioIssue } from "./scenarioIssue.js";

/** Largest number of alias expansions accepted (a guard against alias bombs). */
export const MAX_ALIAS_COUNT = 200;
/** Largest number of mapping keys in one file (a 1,000-model scenario has about 15,000). */
export const MAX_KEY_COUNT = 50_000;
/** At most this many problems are listed per file; the rest are counted. Keeps rejection linear in the file size. */
export const MAX_LISTED_PROBLEMS = 100;

export interface Position {
  line: number;
  column: number;
}

/** The plain value of a YAML file and where each key path sits in it. */
export interface ParsedYaml {
  value: unknown;
  /** Position of the value at a key path (falls back to the nearest ancestor that has one). */
  locate(path: readonly (string | number)[], which?: "key" | "value"): Position;
  file: string;
}

/**
 * Parses YAML 1.2 (core schema) with the yaml package into plain data, rejecting duplicate keys, tab indentation,
 * non-finite numbers (.nan, .inf, 1e400) and excessive aliases, and recording every node's line and column.
 * Keys are set as own properties (never through the prototype), so __proto__ or constructor cannot pollute objects.
 */
export function parseScenarioYaml(text: string, file: string): ParsedYaml {
  const lines = new LineCounter();
  const doc = parseDocument(text, {
    lineCounter: lines,
    // Duplicate keys are found below with one set per mapping: the library's own check compares every pair.
    uniqueKeys: false,
    prettyErrors: false,
    strict: true,
    version: "1.2",
  });
  const at = (offset: number): Position => {
    const p = lines.linePos(offset);
    return { line: p.line, column: p.col };
  };
  const issue = (offset: number, path: string, message: string): ScenarioIssue => ({
    file,
    ...at(offset),
    path,
    message,
  });
  if (doc.errors.length > 0) {
    throw new ScenarioInputError(
      doc.errors.map((e) => {
        const message =
          e.code === "DUPLICATE_KEY"
            ? "duplicate key: each key may appear once in a mapping"
            : e.code === "TAB_AS_INDENT"
              ? "tab used for indentation: YAML indents with spaces only"
              : `YAML syntax error: ${e.message.split("\n")[0].replace(/ at line \d+, column \d+:?$/, "")}`;
        return issue(e.pos[0], "", message);
      }),
    );
  }
  if (doc.contents === null) {
    throw new ScenarioInputError([
      {
        file,
        line: 1,
        column: 1,
        path: "",
        message: "the file is empty: a scenario needs at least a title and models",
      },
    ]);
  }
  const keyPos = new Map<string, number>();
  const valuePos = new Map<string, number>();
  const problems: ScenarioIssue[] = [];
  let aliases = 0;
  let keys = 0;

  const walk = (node: unknown, path: (string | number)[]): unknown => {
    const here = formatPath(path);
    if (isAlias(node)) {
      aliases++;
      if (aliases > MAX_ALIAS_COUNT) {
        throw new ScenarioInputError([
          issue(
            node.range?.[0] ?? 0,
            here,
            `more than ${MAX_ALIAS_COUNT} alias expansions: refusing (possible alias bomb)`,
          ),
        ]);
      }
      return walk(node.resolve(doc), path);
    }
    const n = node as Node | null;
    if (n?.range && !valuePos.has(here)) valuePos.set(here, n.range[0]);
    if (isMap(n)) {
      const out: Record<string, unknown> = {};
      const seen = new Set<string>();
      for (const pair of n.items) {
        const k = isScalar(pair.key) ? pair.key.value : pair.key;
        if (typeof k !== "string" && typeof k !== "number") {
          const off = (pair.key as Node | null)?.range?.[0] ?? n.range?.[0] ?? 0;
          problems.push(issue(off, here, "keys must be plain words (found a complex key)"));
          continue;
        }
        const key = String(k);
        const keyNode = pair.key as Node | null;
        if (seen.has(key)) {
          problems.push(issue(keyNode?.range?.[0] ?? 0, here, "duplicate key: each key may appear once in a mapping"));
          continue;
        }
        seen.add(key);
        if (++keys > MAX_KEY_COUNT) {
          throw new ScenarioInputError([
            issue(
              keyNode?.range?.[0] ?? 0,
              here,
              `more than ${MAX_KEY_COUNT} keys: refusing (a scenario needs far fewer)`,
            ),
          ]);
        }
        const childPath = [...path, key];
        if (keyNode?.range) keyPos.set(formatPath(childPath), keyNode.range[0]);
        const child = walk(pair.value, childPath);
        Object.defineProperty(out, key, { value: child, enumerable: true, writable: true, configurable: true });
      }
      return out;
    }
    if (isSeq(n)) return n.items.map((item, i) => walk(item, [...path, i]));
    if (isScalar(n)) {
      const v = n.value;
      if (typeof v === "number" && !Number.isFinite(v)) {
        problems.push(issue(n.range?.[0] ?? 0, here, `${n.source ?? String(v)} is not a finite number`));
        return v;
      }
      if (typeof v === "bigint") return Number(v);
      return v;
    }
    return n === null || n === undefined ? null : n;
  };
  const value = walk(doc.contents, []);
  if (problems.length > 0) throw new ScenarioInputError(problems);

  const locate = (path: readonly (string | number)[], which: "key" | "value" = "value"): Position => {
    for (let len = path.length; len >= 0; len--) {
      const p = formatPath(path.slice(0, len));
      const off =
        which === "key" && len === path.length
          ? (keyPos.get(p) ?? valuePos.get(p))
          : (valuePos.get(p) ?? keyPos.get(p));
      if (off !== undefined) return at(off);
    }
    return { line: 1, column: 1 };
  };
  return { value, locate, file };
}
