import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import type { StoredVersionRecord } from "../contract/versionRecord.js";

/** The light fields of a version record (everything but the source, attachments, inputs and tables), and its key order. */
export interface RecordMeta {
  keys: string[];
  light: Record<string, unknown>;
  tables_format: string;
}

/**
 * Version files whose exact bytes a previous build checked in full (schema, own hash, strict JSON), by the SHA-256 of
 * those bytes. A build keeps them beside its site; a file whose bytes hash to a known entry needs no second check.
 */
export type TrustedRecords = Map<string, RecordMeta>;

const HEAVY = new Set(["source", "attachments", "inputs", "tables"]);
const bytesHash = new WeakMap<object, string>();
const metas = new WeakMap<object, RecordMeta>();

export const sha256OfBytes = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

export const bytesHashOf = (record: object): string | undefined => bytesHash.get(record);

/** What a later build needs to know of a record without reading it again. */
export function metaOf(record: StoredVersionRecord): RecordMeta {
  const known = metas.get(record);
  if (known) return known;
  const light: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(record)) if (!HEAVY.has(k)) light[k] = v;
  return { keys: Object.keys(record), light, tables_format: record.tables.format };
}

/** A record's tables format, without reading a trusted record's tables. */
export function tablesFormatOf(record: StoredVersionRecord): string {
  return metas.get(record)?.tables_format ?? record.tables.format;
}

/**
 * A record of a trusted file that reads its heavy fields (source, inputs, tables) only when a page needs them, from
 * the file, whose bytes must still hash to what was checked. Its keys keep the file's order, so JSON.stringify
 * gives the same text as the full record.
 */
export function lazyRecord(file: string, hash: string, meta: RecordMeta): StoredVersionRecord {
  let full: Record<string, unknown> | null = null;
  const load = () => {
    if (full) return full;
    const bytes = readFileSync(file);
    if (sha256OfBytes(bytes) !== hash) throw new Error(`${file} changed while the site was being built; build again`);
    full = JSON.parse(bytes.toString("utf8")) as Record<string, unknown>;
    return full;
  };
  const record: Record<string, unknown> = {};
  for (const k of meta.keys) {
    if (HEAVY.has(k)) Object.defineProperty(record, k, { enumerable: true, get: () => load()[k] });
    else record[k] = meta.light[k];
  }
  metas.set(record, meta);
  bytesHash.set(record, hash);
  return record as unknown as StoredVersionRecord;
}
