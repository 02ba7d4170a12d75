import { Ajv, type ValidateFunction } from "ajv";
import tables1 from "../schema/tables/1.schema.json" with { type: "json" };
import tables2 from "../schema/tables/2.schema.json" with { type: "json" };
import tables3 from "../schema/tables/3.schema.json" with { type: "json" };
import tables4 from "../schema/tables/4.schema.json" with { type: "json" };
import tables5 from "../schema/tables/5.schema.json" with { type: "json" };
import tables6 from "../schema/tables/6.schema.json" with { type: "json" };
import version1 from "../schema/version/1.schema.json" with { type: "json" };
import version2 from "../schema/version/2.schema.json" with { type: "json" };
import version3 from "../schema/version/3.schema.json" with { type: "json" };
import { formatNumber, unreadableFormat, type FormatFamily } from "./formats.js";

/** The JSON Schema of every released format, by number. Never edit a released schema: add the next one. */
const SCHEMAS: Record<FormatFamily, Record<number, object>> = {
  tables: { 1: tables1, 2: tables2, 3: tables3, 4: tables4, 5: tables5, 6: tables6 },
  version: { 1: version1, 2: version2, 3: version3 },
};

let ajv: Ajv | null = null;
const compiled = new Map<string, ValidateFunction>();

function validatorFor(family: FormatFamily, n: number): ValidateFunction {
  const key = `${family}/${n}`;
  let v = compiled.get(key);
  if (!v) {
    // Version format 1 refers to tables format 1 by its $id, so every tables schema is registered first.
    ajv ??= new Ajv({ allErrors: false, strict: true, allowUnionTypes: true }).addSchema(Object.values(SCHEMAS.tables));
    const schema = SCHEMAS[family][n] as { $id?: string };
    v = (schema.$id && family === "tables" ? ajv.getSchema(schema.$id) : undefined) ?? ajv.compile(schema);
    compiled.set(key, v);
  }
  return v;
}

export const schemaFileOf = (family: FormatFamily, n: number) => `src/schema/${family}/${n}.schema.json`;

function problemAgainst(family: FormatFamily, n: number, value: unknown): string | null {
  const validate = validatorFor(family, n);
  if (validate(value)) return null;
  const e = validate.errors?.[0];
  return `${schemaFileOf(family, n)}: ${e ? `${e.instancePath || "(the document)"} ${e.message}` : "does not match"}`;
}

/** Checks a parsed tables document against the schema of the format it declares; the first problem, or null. */
export function tablesDocumentProblem(doc: unknown): string | null {
  const declared = doc !== null && typeof doc === "object" ? (doc as { format?: unknown }).format : undefined;
  const unreadable = unreadableFormat(declared, "tables");
  if (unreadable) return unreadable;
  return problemAgainst("tables", formatNumber(declared, "tables")!, doc);
}

/**
 * Checks a parsed version record against the schema of the format it declares, and its tables document against the
 * schema of the tables format that one declares (format 1 records embed tables format 1); the first problem, or null.
 */
export function versionRecordProblem(record: unknown): string | null {
  const declared = record !== null && typeof record === "object" ? (record as { format?: unknown }).format : undefined;
  const unreadable = unreadableFormat(declared, "version");
  if (unreadable) return unreadable;
  const n = formatNumber(declared, "version")!;
  const envelope = problemAgainst("version", n, record);
  if (envelope !== null || n === 1) return envelope;
  const tables = tablesDocumentProblem((record as { tables: unknown }).tables);
  return tables === null ? null : `tables: ${tables}`;
}
