import canonicalize from "canonicalize";
import { existsSync } from "node:fs";
import { displayPath } from "./displayPath.js";
import { readArchive } from "../archive/readArchive.js";
import { tablesDrift, type QuantityDrift } from "../archive/tablesDrift.js";
import { frozenInputs } from "../archive/versionRecord.js";
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError } from "../scenario/scenarioIssue.js";
import { buildTablesDocument } from "../tables/buildTablesDocument.js";
import { ENGINE_TOLERANCE, ENGINE_VERSION } from "../engine/index.js";

/** Exit status of `verify --strict` when the archive is intact but the current engine no longer reproduces it. */
export const DRIFT_EXIT = 3;

interface Worst extends QuantityDrift { scenario: string; version: number }

const shownDrift = (r: number) => (r === Infinity ? "changed (not a number, or shape)" : r === 0 ? "0 (identical)" : r.toExponential(2));

/**
 * `cosmoledger verify [--archive DIR] [--strict] [--json]`: checks every version's hash and the hash chains (exit 2 on
 * any problem, naming the file), then recomputes each version from its frozen source with the current code and
 * reports the largest relative drift per quantity. Drift above the engine tolerance is reported; with --strict it
 * fails with exit 3.
 */
export function verifyCommand(options: { archive?: string; strict?: boolean; json?: boolean; quiet?: boolean }): number {
  const dir = options.archive ?? "scenarios/archive";
  if (!existsSync(dir)) {
    process.stderr.write(`error: no archive at ${displayPath(dir)} (name one with --archive DIR; cosmoledger freeze creates it)\n`);
    return 2;
  }
  const { archives, issues } = readArchive(dir);
  if (issues.length > 0) {
    for (const i of issues) process.stderr.write(`error: ${i.file}: ${i.message}\n`);
    process.stderr.write(`${issues.length} problem${issues.length === 1 ? "" : "s"} in the archive ${displayPath(dir)}; it cannot be trusted until the files are restored.\n`);
    return 2;
  }
  const total = archives.reduce((n, a) => n + a.versions.length, 0);
  const worst = new Map<string, Worst>();
  const problems: string[] = [];
  for (const a of archives) for (const v of a.versions) {
    const label = `${a.id} v${v.version}`;
    let scenario;
    try {
      scenario = loadScenario(v.source.text, v.source.path);
    } catch (e) {
      if (!(e instanceof ScenarioInputError)) throw e;
      problems.push(`${label}: its frozen source no longer passes the current validation: ${e.issues[0].message}`);
      continue;
    }
    if (canonicalize(frozenInputs(scenario)) !== canonicalize(v.inputs)) problems.push(`${label}: the current resolver gives different inputs (a default or an inheritance rule changed)`);
    const now = buildTablesDocument(scenario);
    for (const d of tablesDrift({ cautions: v.tables.cautions, models: v.tables.models }, { cautions: now.cautions, models: now.models })) {
      const seen = worst.get(d.quantity);
      if (!seen || d.relative > seen.relative) worst.set(d.quantity, { ...d, scenario: a.id, version: v.version });
    }
  }
  const rows = [...worst.values()].sort((x, y) => y.relative - x.relative || (x.quantity < y.quantity ? -1 : 1));
  const above = rows.filter((r) => r.relative > ENGINE_TOLERANCE);
  for (const r of above) problems.push(`${r.scenario} v${r.version}: ${r.quantity} drifts by ${shownDrift(r.relative)} at ${r.where} (${JSON.stringify(r.before)} -> ${JSON.stringify(r.after)})`);
  if (options.json) {
    process.stdout.write(JSON.stringify({ archive: displayPath(dir), versions: total, engine: ENGINE_VERSION, tolerance: ENGINE_TOLERANCE, quantities: rows, problems }) + "\n");
  } else {
    process.stdout.write(`archive ${displayPath(dir)}: ${archives.length} scenario${archives.length === 1 ? "" : "s"}, ${total} version${total === 1 ? "" : "s"}; every hash and chain link checks out\n`);
    if (!options.quiet && total > 0) {
      process.stdout.write(`recomputed with engine ${ENGINE_VERSION}; largest relative drift per quantity (tolerance ${ENGINE_TOLERANCE}):\n`);
      const width = Math.max(...rows.map((r) => r.quantity.length));
      for (const r of rows) process.stdout.write(`  ${r.quantity.padEnd(width)}  ${shownDrift(r.relative)}${r.relative > 0 ? `  (${r.scenario} v${r.version} ${r.where})` : ""}\n`);
    }
  }
  for (const p of problems) process.stderr.write(`${options.strict ? "error" : "warning"}: ${p}\n`);
  if (problems.length === 0) {
    if (!options.json) process.stdout.write(`every archived number reproduces within ${ENGINE_TOLERANCE}\n`);
    return 0;
  }
  process.stderr.write(`${problems.length} finding${problems.length === 1 ? "" : "s"}: archived numbers would not all reproduce under the current code${options.strict ? "" : " (use --strict to fail on this)"}\n`);
  return options.strict ? DRIFT_EXIT : 0;
}
