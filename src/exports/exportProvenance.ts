import { oneLine } from "../common/userText.js";
/** Where an export came from; every exported file carries it. */
export interface ExportProvenance {
  tool: string;
  tool_version: string;
  scenario_id: string;
  scenario_title: string;
  /** The frozen version, or null for an unfrozen draft. */
  version: number | null;
  /** SHA-256 of the frozen version record; null for a draft. */
  version_sha256: string | null;
  /** SHA-256 of the resolved inputs and engine version (identifies a draft too). */
  inputs_sha256: string;
  engine_version: string;
  /** The page the export belongs to, relative to the site root, with the table's anchor. */
  page: string;
}

/** "version 3" or "unfrozen draft". */
export const versionLabel = (p: ExportProvenance) => (p.version === null ? "unfrozen draft" : `version ${p.version}`);

/** One line naming the source of an export: tool, scenario, version and hash, engine, page. */
export function provenanceLine(p: ExportProvenance): string {
  const hash = p.version_sha256 === null ? `inputs SHA-256 ${p.inputs_sha256}` : `SHA-256 ${p.version_sha256}`;
  return `${p.tool} ${p.tool_version}; scenario ${p.scenario_id} "${oneLine(p.scenario_title)}", ${versionLabel(p)} (${hash}); engine ${p.engine_version}; page ${p.page}`;
}
