import { parseScenarioYaml } from "../scenario/parseScenarioYaml.js";
import { formatIssue, type ScenarioIssue } from "../scenario/scenarioIssue.js";
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

/**
 * Prints warnings as errors are printed (file:line:column: key: message). Under --strict they are errors: the
 * command stops with exit 2 and writes nothing; the return value says whether it must stop.
 */
export function reportWarnings(warnings: ScenarioIssue[], strict: boolean): boolean {
  for (const w of warnings) process.stderr.write(`${strict ? "error" : "warning"}: ${formatIssue(w)}\n`);
  if (strict && warnings.length > 0) {
    process.stderr.write(
      `${warnings.length} warning${warnings.length === 1 ? "" : "s"} under --strict; nothing was written.\n`,
    );
    return true;
  }
  return false;
}
