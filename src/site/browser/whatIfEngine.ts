// The scenario pipeline for a page's what-if models: the same modules `compute` runs (parse, validate, resolve,
// compute, present), bundled for the browser by bin/bundleCli.mjs with browser stand-ins for the few Node
// built-ins they use (src/site/browser/shims/). A what-if scenario names no samples file and no spread, so the
// helper thread of spreads is never reached.
import { loadScenario } from "../../scenario/loadScenario.js";
import { ScenarioInputError, issueLine } from "../../scenario/scenarioIssue.js";
import { locatedTables } from "../../tables/locatedTables.js";
import type { TablesDocument } from "../../contract/tablesDocument.js";

/** The tables document of a scenario text, or the located problems in the words of `check`. */
export function whatIfTables(text: string, file: string): { doc: TablesDocument } | { problems: string[] } {
  try {
    const scenario = loadScenario(text, file);
    return { doc: locatedTables(scenario) };
  } catch (e) {
    if (e instanceof ScenarioInputError) return { problems: e.issues.map(issueLine) };
    throw e;
  }
}
