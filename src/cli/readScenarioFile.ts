import { dirname, join } from "node:path";
import { readRegularFile } from "../common/readRegularFile.js";
import { decodeScenarioText } from "../scenario/decodeScenarioText.js";
import { displayPath } from "../common/displayPath.js";
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError, issueLine, issueSummary, type ScenarioIssue } from "../scenario/scenarioIssue.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";

/** Reads and resolves one scenario file: the scenario, or every located issue (a file that cannot be read is one). */
export function loadScenarioFile(
  file: string,
): { scenario: ResolvedScenario; issues: [] } | { scenario: null; issues: ScenarioIssue[] } {
  const shown = displayPath(file);
  const read = readRegularFile(file);
  if ("why" in read)
    return { scenario: null, issues: [{ file: shown, line: 1, column: 1, path: "", message: `the path ${read.why}` }] };
  try {
    return {
      scenario: loadScenario(decodeScenarioText(read.bytes, shown), shown, { readAttachment: attachmentReader(file) }),
      issues: [],
    };
  } catch (e) {
    if (!(e instanceof ScenarioInputError)) throw e;
    return { scenario: null, issues: e.issues };
  }
}

/**
 * Reads files a scenario names (samples files), relative to the scenario's folder: regular files only, UTF-8.
 * A file that cannot be read throws an Error whose message says why (the resolver locates it at the key).
 */
export function attachmentReader(scenarioFile: string): (relative: string) => string {
  return (relative) => {
    const read = readRegularFile(join(dirname(scenarioFile), relative));
    if ("why" in read) throw new Error(`the path ${read.why}`);
    return read.bytes.toString("utf8");
  };
}

/** Reads several scenario files: the scenarios, and every issue of every file, including ids used twice. */
export function loadScenarioFiles(files: string[]): { scenarios: ResolvedScenario[]; issues: ScenarioIssue[] } {
  const scenarios: ResolvedScenario[] = [];
  const issues: ScenarioIssue[] = [];
  const seen = new Map<string, string>();
  for (const file of files) {
    const r = loadScenarioFile(file);
    issues.push(...r.issues);
    if (!r.scenario) continue;
    const other = seen.get(r.scenario.id);
    if (other) {
      const message = `scenario id ${r.scenario.id} is also used by ${other}; ids must be unique across the files of one run`;
      issues.push({ file: r.scenario.source.path, line: 1, column: 1, path: "id", message });
      continue;
    }
    seen.set(r.scenario.id, r.scenario.source.path);
    scenarios.push(r.scenario);
  }
  return { scenarios, issues };
}

/**
 * Reads and resolves one scenario file for a command; on a problem prints every located issue, says what was not
 * done (`nothing` e.g. "nothing was frozen") and returns null (the command then exits 2).
 */
export function readScenarioFile(file: string, nothing: string): ResolvedScenario | null {
  const r = loadScenarioFile(file);
  if (r.scenario) return r.scenario;
  for (const i of r.issues) process.stderr.write(`${issueLine(i)}\n`);
  process.stderr.write(`${issueSummary(r.issues, `${nothing}.`)}\n`);
  return null;
}
