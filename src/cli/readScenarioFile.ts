import { readFileSync } from "node:fs";
import { displayPath } from "../common/displayPath.js";
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError, formatIssue } from "../scenario/scenarioIssue.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";

/**
 * Reads and resolves one scenario file for a command; on a problem prints every located issue, says what was not
 * done (`nothing` e.g. "nothing was frozen") and returns null (the command then exits 2).
 */
export function readScenarioFile(file: string, nothing: string): ResolvedScenario | null {
  const shown = displayPath(file);
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    process.stderr.write(
      `error: ${shown}:1:1: cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); ${nothing}.\n`,
    );
    return null;
  }
  try {
    return loadScenario(text, shown);
  } catch (e) {
    if (!(e instanceof ScenarioInputError)) throw e;
    for (const i of e.issues) process.stderr.write(`error: ${formatIssue(i)}\n`);
    process.stderr.write(`${e.issues.length} problem${e.issues.length === 1 ? "" : "s"} found; ${nothing}.\n`);
    return null;
  }
}
