import { parseScenarioYaml } from "./parseScenarioYaml.js";
import { validateScenarioSchema } from "./validateScenarioSchema.js";
import { resolveScenario } from "./resolveScenario.js";
import { ScenarioInputError } from "./scenarioIssue.js";
import type { ResolvedScenario } from "./resolvedScenario.js";

/** Scenario text -> resolved scenario: parse, schema check, resolve. No I/O; `file` is used in messages and for the default id. */
export function loadScenario(text: string, file: string): ResolvedScenario {
  const parsed = parseScenarioYaml(text, file);
  const issues = validateScenarioSchema(parsed);
  if (issues.length > 0) throw new ScenarioInputError(issues);
  return resolveScenario(parsed, text);
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
