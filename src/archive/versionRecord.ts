import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import type { TablesDocument } from "../tables/tablesDocument.js";

export const VERSION_FORMAT = "cosmoledger.version/1";

/** The resolved inputs as stored in a version: the resolved scenario without the engine's derived model objects. */
export type FrozenInputs = Omit<ResolvedScenario, "models" | "source"> & { models: Omit<ResolvedScenario["models"][number], "background">[] };

/** One frozen version of a scenario: written once, never rewritten. `sha256` covers every other field. */
export interface VersionRecord {
  format: typeof VERSION_FORMAT;
  scenario_id: string;
  version: number;
  created: string;
  message: string;
  /** sha256 of the previous version of the same scenario; null for version 1 (the hash chain). */
  previous_sha256: string | null;
  source: { path: string; text: string };
  inputs: FrozenInputs;
  engine: TablesDocument["engine"];
  tables: TablesDocument;
  sha256: string;
}

/** JSON-clean resolved inputs (drops the engine's model objects and the source, which is stored on its own). */
export function frozenInputs(scenario: ResolvedScenario): FrozenInputs {
  const { models, source: _source, ...rest } = scenario;
  return JSON.parse(JSON.stringify({ ...rest, models: models.map(({ background: _b, ...m }) => m) }));
}

/** SHA-256 of a record's RFC 8785 canonical JSON (sorted keys, ECMAScript number form), without its own sha256 field. */
export function versionHash(record: Omit<VersionRecord, "sha256"> | VersionRecord): string {
  const { sha256: _own, ...content } = record as VersionRecord;
  const text = canonicalize(content);
  if (text === undefined) throw new Error("version record cannot be canonicalised");
  return createHash("sha256").update(text, "utf8").digest("hex");
}

/** Assembles a version record and seals it with its hash. */
export function sealVersion(fields: Omit<VersionRecord, "sha256" | "format" | "engine">): VersionRecord {
  const content = { format: VERSION_FORMAT, ...fields, engine: fields.tables.engine } as Omit<VersionRecord, "sha256">;
  return { ...content, sha256: versionHash(content) };
}

/** File name of a version inside its scenario's archive folder. */
export const versionFileName = (n: number) => `v${n}.json`;
export const VERSION_FILE_PATTERN = /^v([1-9][0-9]*)\.json$/;

/** Same inputs as a version: identical source text and identical resolved-inputs hash (which includes the engine version). */
export function holdsSameInputs(record: VersionRecord, sourceText: string, doc: TablesDocument): boolean {
  return record.source.text === sourceText && record.tables.scenario.inputs_sha256 === doc.scenario.inputs_sha256;
}
