import { dirname, join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import { TOOL_VERSION } from "../common/toolVersion.js";
import { OutputRefusedError, writeOutputsAtomically } from "./writeOutputsAtomically.js";
import { readScenarioFile } from "./readScenarioFile.js";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import { parse } from "yaml";
import { readRegularFile } from "../common/readRegularFile.js";
import { decodeScenarioText } from "../scenario/decodeScenarioText.js";
import { idFromFileName } from "../scenario/resolveScenario.js";
import { locatedTables } from "../tables/locatedTables.js";
import type { StoredTablesDocument } from "../contract/tablesDocument.js";
import { readScenarioArchive } from "../archive/readArchive.js";
import type { ArchiveIssue } from "../archive/checkVersionChain.js";
import { holdsSameInputs, type StoredVersionRecord } from "../contract/versionRecord.js";
import { presentDocument } from "../presentation/presentDocument.js";
import { EXPORT_FORMATS, exportFiles, writeExportFiles, type ExportFormat } from "../exports/exportFiles.js";

/** The scenario id a file declares (its `id`, or its file name), read without resolving the scenario; null if unknown. */
function scenarioIdOnly(file: string): { id: string } | null {
  const read = readRegularFile(file);
  if ("why" in read) return null;
  try {
    const value = parse(decodeScenarioText(read.bytes, displayPath(file))) as { id?: unknown } | null;
    const id = typeof value?.id === "string" ? value.id : idFromFileName(file);
    return id ? { id } : null;
  } catch {
    return null; // not YAML: the full reading reports it with its location
  }
}

const fail = (message: string) => {
  process.stderr.write(`error: ${message}\n`);
  return 2;
};

/**
 * `cosmoledger export FILE [--version N] [--format F[,F...]] [--out DIR] [--archive DIR]`: writes the same export
 * files as the site (tables as csv, json, md, tex, html; charts as png, svg; the assumptions paragraph) for the
 * scenario file, or for its frozen version N, into DIR/<id>/<vN|draft>/ (default DIR out/exports).
 */
export async function exportCommand(
  files: string[],
  options: { version?: string; format?: string[]; out?: string; archive?: string },
): Promise<number> {
  if (files.length !== 1)
    return fail(
      "cosmoledger export: name exactly one scenario file, e.g. cosmoledger export scenarios/lantern-deep-field.yaml --format tex",
    );
  const formats = (options.format ?? [EXPORT_FORMATS.join(",")])
    .flatMap((f) => f.split(","))
    .map((f) => f.trim())
    .filter(Boolean);
  const unknown = formats.filter((f) => !(EXPORT_FORMATS as readonly string[]).includes(f));
  if (unknown.length > 0) return fail(`--format ${unknown[0]}: not a format; choose from ${EXPORT_FORMATS.join(", ")}`);
  if (formats.length === 0) return fail(`--format names no format; choose from ${EXPORT_FORMATS.join(", ")}`);
  let wanted: number | null = null;
  if (options.version !== undefined) {
    if (!/^[1-9][0-9]*$/.test(options.version))
      return fail(`--version ${options.version}: expected a version number 1, 2, 3 ...`);
    wanted = Number(options.version);
  }
  const file = files[0];
  // A frozen version is exported from its record alone: the file only names the scenario (its id), so a samples
  // file moved or deleted since, or a file that no longer validates, does not stop it.
  const scenario =
    wanted !== null
      ? (scenarioIdOnly(file) ?? readScenarioFile(file, "nothing was written"))
      : readScenarioFile(file, "nothing was written");
  if (!scenario) return 2;
  const archive = options.archive ?? join(dirname(file), "archive");
  const issues: ArchiveIssue[] = [];
  const { versions } = readScenarioArchive(join(archive, scenario.id), scenario.id, issues);
  if (issues.length > 0) {
    for (const i of issues) process.stderr.write(`error: ${i.file}: ${i.message}\n`);
    return fail(`the archive of ${scenario.id} is damaged; nothing was written`);
  }
  let doc: StoredTablesDocument;
  let record: StoredVersionRecord | null;
  let page: string;
  if (wanted !== null) {
    record = versions.find((v) => v.version === wanted) ?? null;
    if (!record)
      return fail(
        `${scenario.id} has no version ${wanted} in ${displayPath(archive)} (${versions.length ? `versions 1 to ${versions.length}` : "no versions yet"})`,
      );
    doc = record.tables;
    page = `${scenario.id}/v${wanted}/index.html`;
  } else {
    const current = locatedTables(scenario as ResolvedScenario); // without --version, the scenario was resolved
    doc = current;
    const latest = versions.at(-1);
    record = latest && holdsSameInputs(latest, current) ? latest : null;
    page = `${scenario.id}/index.html`;
  }
  const base = {
    tool: "cosmoledger",
    tool_version: TOOL_VERSION,
    scenario_id: scenario.id,
    scenario_title: doc.scenario.title,
    version: record ? record.version : null,
    version_sha256: record ? record.sha256 : null,
    inputs_sha256: doc.scenario.inputs_sha256,
    engine_version: doc.engine.version,
  };
  const made = exportFiles(presentDocument(doc), base, page, formats as ExportFormat[]);
  const dir = join(options.out ?? join("out", "exports"), scenario.id, record ? `v${record.version}` : "draft");
  try {
    const contents: Record<string, string | Buffer> = {};
    await writeExportFiles(made.files, (f, content) => (contents[f.name] = content));
    writeOutputsAtomically([{ dir, files: contents }]);
  } catch (e) {
    if (e instanceof OutputRefusedError) return fail(e.message);
    throw e;
  }
  process.stdout.write(
    `wrote ${made.files.length} files for ${scenario.id} ${record ? `version ${record.version}` : "(unfrozen draft)"} into ${displayPath(dir)}/\n`,
  );
  return 0;
}
