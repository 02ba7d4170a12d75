import { parseStrictJson } from "../common/parseStrictJson.js";
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
 * Returns the versions in order when everything holds; any issue means the chain cannot be trusted. A file given
 * as `trusted` (bytes a previous build checked in full) skips the checks of its own content; numbering, id and chain
 * are checked all the same.
 */
export function checkVersionChain(
  folderShown: string,
  scenarioId: string,
  files: ({ name: string; text: string } | { name: string; trusted: StoredVersionRecord })[],
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
    const checked = "trusted" in f ? { record: f.trusted } : checkRecord(f.text);
    if ("problem" in checked) {
      issues.push({ file: shown, message: checked.problem });
      continue;
    }
    const record = checked.record;
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
  // Work over the numbers present, never over the range 1..highest: a stray v100000000.json costs nothing.
  const present = [
    ...new Set(files.map((f) => Number(VERSION_FILE_PATTERN.exec(f.name)?.[1] ?? 0)).filter((n) => n > 0)),
  ].sort((a, b) => a - b);
  const highest = present.at(-1) ?? 0;
  const versions: StoredVersionRecord[] = [];
  let expectedNext = 1;
  for (const n of present) {
    if (n > expectedNext) {
      const gap = n - 1 === expectedNext ? `v${expectedNext} was` : `v${expectedNext} to v${n - 1} were`;
      issues.push({
        file: `${folderShown}/${versionFileName(expectedNext)}`,
        message: `is missing: versions run to v${highest}, so ${gap} deleted or never landed${n > present.length + 1000 ? ` (v${n} is an implausible version number: a stray file?)` : ""}`,
      });
    }
    expectedNext = n + 1;
    const record = byNumber.get(n);
    const shown = `${folderShown}/${versionFileName(n)}`;
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

/** A version file's own checks: strict JSON, the record's schema, and its own hash. */
function checkRecord(text: string): { record: StoredVersionRecord } | { problem: string } {
  let record: StoredVersionRecord;
  try {
    record = parseStrictJson(text) as StoredVersionRecord;
  } catch (e) {
    return { problem: `not valid JSON (${(e as Error).message}); the file is damaged or was edited` };
  }
  const problem = versionRecordProblem(record);
  if (problem !== null) return { problem: `not a valid version record: ${problem}` };
  const actual = versionHash(record);
  if (record.sha256 !== actual)
    return {
      problem: `content does not match its sha256 (recorded ${String(record.sha256).slice(0, 12)}, actual ${actual.slice(0, 12)}): the version was altered after it was frozen`,
    };
  return { record };
}
