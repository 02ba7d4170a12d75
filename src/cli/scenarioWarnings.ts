import { formatIssue, type ScenarioIssue } from "../scenario/scenarioIssue.js";

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
