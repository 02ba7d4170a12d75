import { readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import { displayPath } from "../cli/displayPath.js";
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError, type ScenarioIssue } from "../scenario/scenarioIssue.js";
import { buildTablesDocument } from "../tables/buildTablesDocument.js";
import type { TablesDocument } from "../tables/tablesDocument.js";
import { tablesCsv } from "../tables/tablesCsv.js";

/** What the site is built from: every scenario's tables document and the files offered for download. */
export interface SiteLedger {
  docs: TablesDocument[];
  /** Source text of each scenario by id, shown verbatim on its page. */
  sources: Record<string, string>;
  downloads: { path: string; text: string }[];
}

/** Scenario files in a folder: *.yaml and *.yml, sorted so builds are deterministic. */
export function scenarioFiles(dir: string): string[] {
  return readdirSync(dir).filter((f) => /\.ya?ml$/i.test(f)).sort().map((f) => join(dir, f));
}

/** Reads, validates and computes every scenario of a folder; either a ledger or the issues that stop the build. */
export function readLedger(dir: string): { ledger: SiteLedger | null; issues: ScenarioIssue[] } {
  const issues: ScenarioIssue[] = [];
  const docs: TablesDocument[] = [];
  const sources: Record<string, string> = {};
  const seen = new Map<string, string>();
  for (const file of scenarioFiles(dir)) {
    const shown = displayPath(file);
    const text = readFileSync(file, "utf8");
    try {
      const scenario = loadScenario(text, shown);
      if (seen.has(scenario.id)) {
        issues.push({ file: shown, line: 1, column: 1, path: "id", message: `scenario id ${scenario.id} is also used by ${seen.get(scenario.id)}` });
        continue;
      }
      seen.set(scenario.id, shown);
      docs.push(buildTablesDocument(scenario));
      sources[scenario.id] = text;
    } catch (e) {
      if (e instanceof ScenarioInputError) issues.push(...e.issues);
      else throw e;
    }
  }
  if (issues.length > 0) return { ledger: null, issues };
  const downloads = docs.flatMap((doc) => [
    { path: `${doc.scenario.id}/tables.json`, text: JSON.stringify(doc) + "\n" },
    ...Object.entries(tablesCsv(doc)).map(([name, text]) => ({ path: `${doc.scenario.id}/${name}`, text })),
  ]);
  return { ledger: { docs, sources, downloads }, issues: [] };
}

let current: SiteLedger | null = null;

/** The ledger handed to Eleventy by `cosmoledger build` (so the site is built from exactly what was checked). */
export function setSiteLedger(ledger: SiteLedger | null): void {
  current = ledger;
}

export function getSiteLedger(): SiteLedger | null {
  return current;
}
