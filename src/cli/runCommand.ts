import { join, sep } from "node:path";
import { ScenarioInputError, issueLine, issueSummary, type ScenarioIssue } from "../scenario/scenarioIssue.js";
import { locatedTables } from "../tables/locatedTables.js";
import { tablesCsv } from "../contract/tablesCsv.js";
import { OutputRefusedError, writeOutputsAtomically } from "./writeOutputsAtomically.js";
import { loadScenarioFiles } from "./readScenarioFile.js";
import { expandFolders } from "./scenarioFiles.js";
import { reportWarnings } from "./scenarioWarnings.js";
import { scenarioWarnings } from "../tables/scenarioWarnings.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import type { TablesDocument } from "../contract/tablesDocument.js";

const PROGRESS_THRESHOLD = 3;

function reportIssues(issues: ScenarioIssue[]): number {
  for (const i of issues) process.stderr.write(`${issueLine(i)}\n`);
  process.stderr.write(`${issueSummary(issues, "nothing was written.")}\n`);
  return 2;
}

export async function runCommand(
  command: "check" | "compute",
  files: string[],
  options: { out?: string; json?: boolean; quiet?: boolean; strict?: boolean },
): Promise<number> {
  if (files.length === 0) {
    process.stderr.write(
      `cosmoledger ${command}: name at least one scenario file, e.g. cosmoledger ${command} scenarios/*.yaml\n`,
    );
    return 2;
  }
  // A folder stands for its scenario files (check scenarios/).
  const expanded = expandFolders(files);
  if (expanded.emptyFolders.length > 0) {
    for (const f of expanded.emptyFolders)
      process.stderr.write(`error: ${f}: a folder with no scenario files (*.yaml)\n`);
    return 2;
  }
  files = expanded.files;
  const progress = !options.quiet && files.length > PROGRESS_THRESHOLD;
  const { scenarios, issues } = loadScenarioFiles(files);
  if (issues.length > 0) return reportIssues(issues);
  // Both commands compute every model (check in memory), so that a model the engine cannot compute is refused
  // here, located, and every warning is known before anything is written.
  const computeIssues: ScenarioIssue[] = [];
  const computed: { s: ResolvedScenario; doc: TablesDocument }[] = [];
  scenarios.forEach((s, i) => {
    if (progress && command === "compute")
      process.stderr.write(`[${i + 1}/${scenarios.length}] computing ${s.source.path}\n`);
    try {
      computed.push({ s, doc: locatedTables(s) });
    } catch (e) {
      if (!(e instanceof ScenarioInputError)) throw e;
      computeIssues.push(...e.issues);
    }
  });
  if (computeIssues.length > 0) return reportIssues(computeIssues);
  const warnings = computed.flatMap(({ s, doc }) => scenarioWarnings(s, doc));
  if (reportWarnings(warnings, options.strict ?? false)) return 2;
  if (command === "check") {
    for (const { s } of computed)
      process.stdout.write(
        `ok: ${s.source.path} (${s.id}, ${s.models.length} model${s.models.length === 1 ? "" : "s"})\n`,
      );
    return 0;
  }
  if (options.json && scenarios.length !== 1) {
    process.stderr.write("cosmoledger compute: --json prints one tables document; name exactly one file\n");
    return 2;
  }
  const outputs: { dir: string; files: Record<string, string> }[] = [];
  const docs = computed.map(({ doc }) => doc);
  if (!options.json)
    for (const { s, doc } of computed)
      outputs.push({
        dir: join(options.out ?? join("out", "tables"), s.id),
        files: { "tables.json": `${JSON.stringify(doc)}\n`, ...tablesCsv(doc) },
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
