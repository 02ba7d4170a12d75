import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { ResolvedScenario } from "../scenario/resolvedScenario.js";
import { formatNumber, VERSION_FORMAT } from "./formats.js";
import { inputsSha256UnderFormat } from "./inputsHash.js";
import type {
  ResolvedInputsRecord,
  StoredTablesDocument,
  TablesDocument,
  TablesDocumentFormat1,
} from "./tablesDocument.js";

export { VERSION_FORMAT };

/** The resolved inputs as stored in a version: the resolved scenario without the engine's derived model objects. */
export type FrozenInputs = ResolvedInputsRecord;

interface VersionEnvelope {
  scenario_id: string;
  version: number;
  created: string;
  message: string;
  /** sha256 of the previous version of the same scenario; null for version 1 (the hash chain, across formats). */
  previous_sha256: string | null;
  source: { path: string; text: string };
  inputs: FrozenInputs;
  sha256: string;
}

/** Format 1 (cosmoledger 0.1.0): embeds a tables document of format 1. */
export interface VersionRecordFormat1 extends VersionEnvelope {
  format: "cosmoledger.version/1";
  engine: TablesDocumentFormat1["engine"];
  tables: TablesDocumentFormat1;
}

/** Format 2: names the release that froze it, and embeds a tables document of format 2 or later (`T`). */
export interface VersionRecordFormat2<
  T extends Exclude<StoredTablesDocument, TablesDocumentFormat1> = Exclude<StoredTablesDocument, TablesDocumentFormat1>,
> extends VersionEnvelope {
  format: "cosmoledger.version/2";
  tool: { name: "cosmoledger"; version: string };
  engine: T["engine"];
  tables: T;
}

/** A file a scenario names (a samples file), kept in the version so that verify can recompute it. */
export interface Attachment {
  path: string;
  sha256: string;
  text: string;
}

/** Format 3: format 2 plus the text of every file the scenario names (empty when it names none). */
export interface VersionRecordFormat3<
  T extends Exclude<StoredTablesDocument, TablesDocumentFormat1> = Exclude<StoredTablesDocument, TablesDocumentFormat1>,
> extends Omit<VersionRecordFormat2<T>, "format"> {
  format: "cosmoledger.version/3";
  attachments: Attachment[];
}

/** The record this release writes: the current version format with the current tables format. */
export type VersionRecord = VersionRecordFormat3<TablesDocument>;
/** Any record this release reads. */
export type StoredVersionRecord = VersionRecordFormat1 | VersionRecordFormat2 | VersionRecordFormat3;

/** The files a stored version keeps (none before format 3). */
export const attachmentsOf = (r: StoredVersionRecord): Attachment[] => ("attachments" in r ? r.attachments : []);

/** JSON-clean resolved inputs (drops the engine's model objects and the source, which is stored on its own). */
export function frozenInputs(scenario: ResolvedScenario): FrozenInputs {
  const { models, source: _source, plausibility: _warnings, samples: _samples, ...rest } = scenario;
  return JSON.parse(JSON.stringify({ ...rest, models: models.map(({ background: _b, ...m }) => m) }));
}

/** SHA-256 of a record's RFC 8785 canonical JSON (sorted keys, ECMAScript number form), without its own sha256 field. The same rule in every format. */
export function versionHash(record: object): string {
  const { sha256: _own, ...content } = record as { sha256?: string };
  const text = canonicalize(content);
  if (text === undefined) throw new Error("version record cannot be canonicalised");
  return createHash("sha256").update(text, "utf8").digest("hex");
}

/** Assembles a version record of the current format and seals it with its hash. */
export function sealVersion(
  fields: Omit<VersionRecord, "sha256" | "format" | "engine" | "tool">,
  toolVersion: string,
): VersionRecord {
  const content = {
    format: VERSION_FORMAT,
    ...fields,
    tool: { name: "cosmoledger" as const, version: toolVersion },
    engine: fields.tables.engine,
  };
  return { ...content, sha256: versionHash(content) };
}

/** File name of a version inside its scenario's archive folder. */
export const versionFileName = (n: number) => `v${n}.json`;
export const VERSION_FILE_PATTERN = /^v([1-9][0-9]*)\.json$/;

/** The tables format number of a stored document (1 for format 1, ...). */
export const tablesFormatOf = (doc: StoredTablesDocument) => formatNumber(doc.format, "tables")!;

/**
 * Same inputs as a version: identical source text and identical resolved-inputs hash (which includes the engine
 * version), the current inputs hashed under the rule of the version's own tables format.
 */
export function holdsSameInputs(record: StoredVersionRecord, doc: TablesDocument): boolean {
  if (record.source.text !== doc.scenario.source_text) return false;
  return resolvesAlike(record, doc);
}

/**
 * Same resolved inputs and engine as a version, whatever the source text: a draft that differs from it only in
 * comments, spacing or key order computes the same numbers.
 */
export function resolvesAlike(record: StoredVersionRecord, doc: TablesDocument): boolean {
  const n = tablesFormatOf(record.tables);
  return record.tables.scenario.inputs_sha256 === inputsSha256UnderFormat(n, doc.engine.version, doc.inputs);
}
