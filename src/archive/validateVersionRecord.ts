import { Ajv, type ValidateFunction } from "ajv";
import versionSchema from "../schema/version.schema.json" with { type: "json" };
import tablesSchema from "../schema/tables.schema.json" with { type: "json" };

let validate: ValidateFunction | null = null;

/** Checks a parsed record against src/schema/version.schema.json (with the tables document's schema); the first problem, or null. */
export function versionRecordProblem(record: unknown): string | null {
  validate ??= new Ajv({ allErrors: false, strict: true, allowUnionTypes: true }).addSchema(tablesSchema).compile(versionSchema);
  if (validate(record)) return null;
  const e = validate.errors?.[0];
  return e ? `${e.instancePath || "(the record)"} ${e.message}` : "does not match the schema";
}
