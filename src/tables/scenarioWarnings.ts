import { parseScenarioYaml } from "../scenario/parseScenarioYaml.js";
import type { ScenarioIssue } from "../scenario/scenarioIssue.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import type { TablesDocument } from "../contract/tablesDocument.js";

/**
 * Every warning of a computed scenario, located like an error: the plausibility checks of the inputs (H0 = 0.7) at
 * their keys, and each model's warnings in the tables document (recollapse, outside the verified box) at the model.
 */
export function scenarioWarnings(s: ResolvedScenario, doc: TablesDocument): ScenarioIssue[] {
  const out = [...s.plausibility];
  if (doc.models.some((m) => m.warnings.length > 0)) {
    const parsed = parseScenarioYaml(s.source.text, s.source.path);
    doc.models.forEach((m, i) => {
      for (const w of m.warnings)
        out.push({
          file: s.source.path,
          ...parsed.locate(["models", i], "value"),
          path: `models[${i}]`,
          message: `model ${m.id}: ${w}`,
        });
    });
  }
  return out;
}
