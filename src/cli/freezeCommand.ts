import { dirname, join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import { readScenarioFile } from "./readScenarioFile.js";
import { locatedTables } from "../tables/locatedTables.js";
import { freezeScenario } from "../archive/freezeScenario.js";
import { pathKind } from "../archive/readArchive.js";

/**
 * `cosmoledger freeze FILE [-m MESSAGE] [--archive DIR]`: validates and computes the scenario, then records it as the
 * next version in DIR/<id>/ (default: the folder "archive" beside the file). Exit 0 when frozen or already frozen,
 * 2 on invalid input or a broken archive (nothing written).
 */
export function freezeCommand(files: string[], options: { message?: string; archive?: string }): number {
  if (files.length !== 1) {
    process.stderr.write(
      'cosmoledger freeze: name exactly one scenario file, e.g. cosmoledger freeze scenarios/lantern-deep-field.yaml -m "why"\n',
    );
    return 2;
  }
  const file = files[0];
  const scenario = readScenarioFile(file, "nothing was frozen");
  if (!scenario) return 2;
  const archive = options.archive ?? join(dirname(file), "archive");
  const kind = pathKind(archive);
  if (kind !== "missing" && kind !== "folder") {
    const what =
      kind === "file"
        ? "is a file, not an archive folder"
        : kind === "dangling-link"
          ? "is a symbolic link whose target does not exist"
          : "is not a folder";
    process.stderr.write(`error: ${displayPath(archive)} ${what}; nothing was frozen\n`);
    return 2;
  }
  const outcome = freezeScenario(archive, scenario, locatedTables(scenario), options.message ?? "");
  if (outcome.kind === "broken") {
    for (const i of outcome.issues) process.stderr.write(`error: ${i.file}: ${i.message}\n`);
    process.stderr.write(
      `the archive of ${scenario.id} is damaged; nothing was frozen. Restore the files (for example from git) and run cosmoledger verify.\n`,
    );
    return 2;
  }
  const where = displayPath(outcome.file);
  const hash = outcome.record.sha256.slice(0, 12);
  if (outcome.kind === "unchanged")
    process.stdout.write(
      `unchanged: ${scenario.id} version ${outcome.record.version} already holds these inputs (${where}, sha256 ${hash}); nothing written\n`,
    );
  else {
    const revert = outcome.sameInputsAs === null ? "" : `; its inputs are those of version ${outcome.sameInputsAs}`;
    process.stdout.write(
      `froze ${scenario.id} version ${outcome.record.version} (sha256 ${hash}) into ${where}${revert}\n`,
    );
  }
  return 0;
}
