import { parseScenarioYaml } from "../scenario/parseScenarioYaml.js";
import { ScenarioInputError } from "../scenario/scenarioIssue.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import type { TablesDocument } from "../contract/tablesDocument.js";
import { buildTablesDocument, type BuildOptions } from "./buildTablesDocument.js";
import { ModelComputeError } from "./modelComputeError.js";

/**
 * The tables document of a scenario; a model the engine cannot compute to its accuracy becomes a located input error
 * (file:line:column of the model, exit 2), never an unexpected failure. The command line and the pages' what-if
 * engine both compute through here.
 */
export function locatedTables(s: ResolvedScenario, options: BuildOptions = {}): TablesDocument {
  try {
    return buildTablesDocument(s, options);
  } catch (e) {
    if (!(e instanceof ModelComputeError)) throw e;
    const at = parseScenarioYaml(s.source.text, s.source.path).locate(["models", e.modelIndex], "value");
    throw new ScenarioInputError([{ file: s.source.path, ...at, path: `models[${e.modelIndex}]`, message: e.message }]);
  }
}
