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
