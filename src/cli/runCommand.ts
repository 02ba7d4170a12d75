import { join, sep } from "node:path";
import { ScenarioInputError, formatIssue, type ScenarioIssue } from "../scenario/scenarioIssue.js";
import { computeTables } from "./computeTables.js";
import { tablesCsv } from "../tables/tablesCsv.js";
import { OutputRefusedError, writeOutputsAtomically } from "./writeOutputsAtomically.js";
import { loadScenarioFiles } from "./readScenarioFile.js";

const PROGRESS_THRESHOLD = 3;

function reportIssues(issues: ScenarioIssue[]): number {
  for (const i of issues) process.stderr.write(`error: ${formatIssue(i)}\n`);
  process.stderr.write(`${issues.length} problem${issues.length === 1 ? "" : "s"} found; nothing was written.\n`);
  return 2;
}

export async function runCommand(
  command: "check" | "compute",
  files: string[],
  options: { out?: string; json?: boolean; quiet?: boolean },
): Promise<number> {
  if (files.length === 0) {
    process.stderr.write(
      `cosmoledger ${command}: name at least one scenario file, e.g. cosmoledger ${command} scenarios/*.yaml\n`,
    );
    return 2;
  }
  const progress = !options.quiet && files.length > PROGRESS_THRESHOLD;
  const { scenarios, issues } = loadScenarioFiles(files);
  if (issues.length > 0) return reportIssues(issues);
  if (command === "check") {
    // check computes every model in memory too, so that a model the engine cannot compute is refused here, located.
    const computeIssues: ScenarioIssue[] = [];
    for (const s of scenarios) {
      try {
        computeTables(s);
      } catch (e) {
        if (!(e instanceof ScenarioInputError)) throw e;
        computeIssues.push(...e.issues);
      }
    }
    if (computeIssues.length > 0) return reportIssues(computeIssues);
    for (const s of scenarios) {
      const warnings = s.models.flatMap((m) => m.warnings.map((w) => `${s.source.path}: model ${m.id}: ${w}`));
      for (const w of warnings) process.stderr.write(`warning: ${w}\n`);
      process.stdout.write(
        `ok: ${s.source.path} (${s.id}, ${s.models.length} model${s.models.length === 1 ? "" : "s"})\n`,
      );
    }
    return 0;
  }
  if (options.json && scenarios.length !== 1) {
    process.stderr.write("cosmoledger compute: --json prints one tables document; name exactly one file\n");
    return 2;
  }
  const outputs: { dir: string; files: Record<string, string> }[] = [];
  const docs: ReturnType<typeof computeTables>[] = [];
  scenarios.forEach((s, i) => {
    if (progress) process.stderr.write(`[${i + 1}/${scenarios.length}] computing ${s.source.path}\n`);
    const doc = computeTables(s);
    docs.push(doc);
    if (!options.json) {
      outputs.push({
        dir: join(options.out ?? join("out", "tables"), s.id),
        files: { "tables.json": `${JSON.stringify(doc)}\n`, ...tablesCsv(doc) },
      });
    }
  });
  if (options.json) {
    process.stdout.write(`${JSON.stringify(docs[0])}\n`);
    return 0;
  }
  try {
    writeOutputsAtomically(outputs);
  } catch (e) {
    if (e instanceof OutputRefusedError) {
      process.stderr.write(`error: ${e.message}\n`);
      return 2;
    }
    throw e;
  }
  for (const o of outputs)
    process.stdout.write(`wrote ${o.dir.split(sep).join("/")}/ (${Object.keys(o.files).length} files)\n`);
  return 0;
}
