import { parseScenarioYaml, type ParsedYaml } from "./parseScenarioYaml.js";
import { schemaProblems, validateScenarioSchema } from "./validateScenarioSchema.js";
import { resolveScenario } from "./resolveScenario.js";
import { ScenarioInputError, formatPath, type ScenarioIssue } from "./scenarioIssue.js";
import type { ResolvedScenario } from "./resolvedScenario.js";
import type { ResolveOptions } from "./resolveSpread.js";

/** Scenario text -> resolved scenario: parse, schema check, resolve. No I/O; `file` is used in messages and for the default id. */
export function loadScenario(text: string, file: string, options: ResolveOptions = {}): ResolvedScenario {
  const parsed = parseScenarioYaml(text, file);
  const { issues, paths } = schemaProblems(parsed);
  if (issues.length > 0) throw new ScenarioInputError([...issues, ...checksOfTheRest(parsed, text, paths, options)]);
  return resolveScenario(parsed, text, options);
}

/**
 * Every problem in one run: with the keys the schema refused left out, the cross-field checks (inheritance,
 * curvature, baryons, a missing big bang) still run on the rest of the file. The consequences of a key left out
 * ("H0 is required" after H0: seventy) are not repeated; a file too broken to resolve adds nothing.
 */
function checksOfTheRest(
  parsed: ParsedYaml,
  text: string,
  refused: (string | number)[][],
  options: ResolveOptions,
): ScenarioIssue[] {
  const value = structuredClone(parsed.value) as Record<string, unknown>;
  const dropped = new Set<string>();
  for (const path of refused) {
    if (path.length < 2) return []; // a top-level key or the whole file: nothing sensible is left to resolve
    let parent: unknown = value;
    for (const s of path.slice(0, -1)) parent = (parent as Record<string | number, unknown> | undefined)?.[s];
    const last = path.at(-1)!;
    if (parent && typeof parent === "object" && !Array.isArray(parent) && typeof last === "string") {
      delete (parent as Record<string, unknown>)[last];
      dropped.add(formatPath(path.slice(0, -1)));
    } else if (typeof last === "number") {
      dropped.add(formatPath(path)); // an entry missing a key: its own complaints are that key's consequences
    } else return [];
  }
  try {
    resolveScenario({ ...parsed, value }, text, options);
    return [];
  } catch (e) {
    if (!(e instanceof ScenarioInputError)) return [];
    const refusedPaths = new Set(refused.map(formatPath));
    return e.issues.filter(
      (i) =>
        // An entry that lost a key reports its consequences at the entry itself ("H0 is required", "place it by
        // exactly one of ..."): those are left out; problems at other keys of the same entry are kept.
        !refusedPaths.has(i.path) && !dropped.has(i.path),
    );
  }
}

/**
 * Scenario data already in hand (what parsing `text` gives) -> resolved scenario, without running the YAML parser:
 * for `quote`, which writes `text` from the same data. Messages then carry line 1 (the caller names its arguments).
 */
export function loadScenarioData(value: unknown, text: string, file: string): ResolvedScenario {
  const parsed = { value, file, locate: () => ({ line: 1, column: 1 }) };
  const issues = validateScenarioSchema(parsed);
  if (issues.length > 0) throw new ScenarioInputError(issues);
  return resolveScenario(parsed, text);
}
