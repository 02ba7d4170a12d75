import { realpathSync } from "node:fs";
import { dirname, isAbsolute, join, relative as relativePath } from "node:path";
import { readRegularFile } from "../common/readRegularFile.js";
import { decodeScenarioText, firstInvalidUtf8, positionOf } from "../scenario/decodeScenarioText.js";
import { MAX_SAMPLES_FILE_BYTES } from "../scenario/resolveSpread.js";
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
 * Reads files a scenario names (samples files), relative to the scenario's folder: regular files inside that folder
 * only (a symbolic link that leads out of it is refused without reading its target), at most MAX_SAMPLES_FILE_BYTES
 * (refused from the file's size, before reading), valid UTF-8 (never replaced by U+FFFD, so that the hash covers the
 * bytes written). Each file is read once however it is spelled. A file that cannot be read throws an Error whose
 * message says why (the resolver locates it at the key).
 */
export function attachmentReader(scenarioFile: string): (relative: string) => string {
  const folder = dirname(scenarioFile);
  const seen = new Map<string, string>();
  return (relative) => {
    const target = join(folder, relative);
    let real: string;
    try {
      real = realpathSync(target);
    } catch {
      const read = readRegularFile(target); // says why: missing, a dangling link, a file in the way
      throw new Error(`the path ${"why" in read ? read.why : "cannot be resolved"}`);
    }
    const inside = relativePath(realpathSync(folder), real);
    if (inside === "" || inside.startsWith("..") || isAbsolute(inside))
      throw new Error(
        "the path leads outside the scenario's folder (through a symbolic link); a samples file must sit inside the folder, and this one was not read",
      );
    const known = seen.get(real);
    if (known !== undefined) return known;
    const read = readRegularFile(real, MAX_SAMPLES_FILE_BYTES);
    if ("why" in read)
      throw new Error(
        read.tooLarge !== undefined
          ? `it has ${read.tooLarge} bytes; at most ${MAX_SAMPLES_FILE_BYTES} (4 MiB) are allowed, because a frozen version keeps the file (thin the chain first); it was not read`
          : `the path ${read.why}`,
      );
    const bad = firstInvalidUtf8(read.bytes);
    if (bad >= 0) {
      const at = positionOf(read.bytes, bad);
      throw new Error(
        `the file is not UTF-8 text: byte 0x${read.bytes[bad].toString(16).padStart(2, "0")} at line ${at.line}, column ${at.column}; save it as UTF-8`,
      );
    }
    const text = new TextDecoder("utf-8", { fatal: true }).decode(read.bytes);
    seen.set(real, text);
    return text;
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
    const twice = idUsedTwice(seen, r.scenario);
    if (twice) issues.push(twice);
    else scenarios.push(r.scenario);
  }
  return { scenarios, issues };
}

/** The issue of a scenario whose id an earlier file of the same run uses (`seen`: id -> file), or null (then noted). */
export function idUsedTwice(seen: Map<string, string>, scenario: ResolvedScenario): ScenarioIssue | null {
  const other = seen.get(scenario.id);
  if (other === undefined) {
    seen.set(scenario.id, scenario.source.path);
    return null;
  }
  const message = `scenario id ${scenario.id} is also used by ${other}; ids must be unique across the files of one run`;
  return { file: scenario.source.path, line: 1, column: 1, path: "id", message };
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
