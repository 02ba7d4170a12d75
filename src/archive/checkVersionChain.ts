import { versionRecordProblem } from "../contract/validateContract.js";
import {
  VERSION_FILE_PATTERN,
  versionFileName,
  versionHash,
  type StoredVersionRecord,
} from "../contract/versionRecord.js";

/** Something wrong with the archive, named by file so that a user can go and look. */
export interface ArchiveIssue {
  file: string;
  message: string;
}

/**
 * Checks one scenario's version files (name and text of each, in any order): numbering 1..N without gaps,
 * each file's own hash, its version number and scenario id, and the hash chain through previous_sha256.
 * Returns the versions in order when everything holds; any issue means the chain cannot be trusted.
 */
export function checkVersionChain(
  folderShown: string,
  scenarioId: string,
  files: { name: string; text: string }[],
): { versions: StoredVersionRecord[]; issues: ArchiveIssue[] } {
  const issues: ArchiveIssue[] = [];
  const byNumber = new Map<number, StoredVersionRecord>();
  for (const f of files) {
    const shown = `${folderShown}/${f.name}`;
    const m = VERSION_FILE_PATTERN.exec(f.name);
    if (!m) {
      issues.push({ file: shown, message: `unexpected file in a version folder (expected v1.json, v2.json, ...)` });
      continue;
    }
    const n = Number(m[1]);
    let record: StoredVersionRecord;
    try {
      record = JSON.parse(f.text);
    } catch (e) {
      issues.push({
        file: shown,
        message: `not valid JSON (${(e as Error).message}); the file is damaged or was edited`,
      });
      continue;
    }
    const problem = versionRecordProblem(record);
    if (problem !== null) {
      issues.push({ file: shown, message: `not a valid version record: ${problem}` });
      continue;
    }
    const actual = versionHash(record);
    if (record.sha256 !== actual) {
      issues.push({
        file: shown,
        message: `content does not match its sha256 (recorded ${String(record.sha256).slice(0, 12)}, actual ${actual.slice(0, 12)}): the version was altered after it was frozen`,
      });
      continue;
    }
    if (record.version !== n) {
      issues.push({
        file: shown,
        message: `holds version ${record.version} but is named ${versionFileName(n)}: versions were renamed or reordered`,
      });
      continue;
    }
    if (record.scenario_id !== scenarioId) {
      issues.push({ file: shown, message: `belongs to scenario ${record.scenario_id}, not to ${scenarioId}` });
      continue;
    }
    byNumber.set(n, record);
  }
  const highest = Math.max(0, ...[...files].map((f) => Number(VERSION_FILE_PATTERN.exec(f.name)?.[1] ?? 0)));
  const versions: StoredVersionRecord[] = [];
  for (let n = 1; n <= highest; n++) {
    const record = byNumber.get(n);
    const shown = `${folderShown}/${versionFileName(n)}`;
    if (!files.some((f) => f.name === versionFileName(n))) {
      issues.push({
        file: shown,
        message: `is missing: versions run to v${highest}, so v${n} was deleted or never landed`,
      });
      continue;
    }
    if (!record) continue;
    const expected = n === 1 ? null : byNumber.get(n - 1)?.sha256;
    if (n === 1 && record.previous_sha256 !== null)
      issues.push({ file: shown, message: `version 1 must start the chain (previous_sha256 null)` });
    else if (n > 1 && expected !== undefined && record.previous_sha256 !== expected) {
      issues.push({
        file: shown,
        message: `breaks the hash chain: previous_sha256 ${String(record.previous_sha256).slice(0, 12)} is not the sha256 of v${n - 1} (${String(expected).slice(0, 12)})`,
      });
    }
    versions.push(record);
  }
  return { versions: issues.length === 0 ? versions : [], issues };
}
