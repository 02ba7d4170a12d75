/**
 * The tables document: the stable data contract read by pages, exports, archives and users' scripts.
 * The shapes are generated from the JSON Schema of each released format (src/schema/tables/N.schema.json ->
 * src/contract/generated/tablesFormatN.ts), so a key that the schema does not have fails the type check.
 */
import type { TablesDocumentFormat1 } from "./generated/tablesFormat1.js";
import type { TablesDocumentFormat2 } from "./generated/tablesFormat2.js";
import type { TablesDocumentFormat3 } from "./generated/tablesFormat3.js";
import type { TablesDocumentFormat4 } from "./generated/tablesFormat4.js";
import type { TablesDocumentFormat5 } from "./generated/tablesFormat5.js";
import type { TablesDocumentFormat6 } from "./generated/tablesFormat6.js";

export type {
  TablesDocumentFormat1,
  TablesDocumentFormat2,
  TablesDocumentFormat3,
  TablesDocumentFormat4,
  TablesDocumentFormat5,
  TablesDocumentFormat6,
};

/** The format this release writes. */
export type TablesDocument = TablesDocumentFormat6;
/** Every format this release reads (pages, exports, diffs and verify take any of them). */
export type StoredTablesDocument =
  | TablesDocumentFormat1
  | TablesDocumentFormat2
  | TablesDocumentFormat3
  | TablesDocumentFormat4
  | TablesDocumentFormat5
  | TablesDocumentFormat6;

export type Num = number | null;
export type ModelTables = TablesDocument["models"][number];
export type StoredModelTables = StoredTablesDocument["models"][number];
export type ModelParameters = ModelTables["parameters"];
export type ModelSummary = ModelTables["summary"];
export type RedshiftRow = ModelTables["redshifts"][number];
/** The chart grid column by column: each key of a redshift row maps to one array over the grid points. */
export type RedshiftGrid = ModelTables["grid"];
export type TargetRow = ModelTables["targets"][number];
export type SurveyRow = ModelTables["surveys"][number];
export type ModelDifferences = TablesDocument["differences"][string];
export type Difference = ModelDifferences["summary"][string];
/** Percentiles of one quantity over a spread's draws, and their Monte Carlo errors. */
export type Band = NonNullable<NonNullable<ModelTables["spread"]>["summary"][string]>;
export type ModelSpread = NonNullable<ModelTables["spread"]>;
export type ConstantEntry = TablesDocument["engine"]["constants"][string];
/** The resolved inputs as the document (format 2 on) and every version record store them. */
export type ResolvedInputsRecord = TablesDocument["inputs"];

/** Keys of the newest format's per-redshift rows, summary, targets and survey shells. */
export type RowKey = keyof RedshiftRow;
export type SummaryKey = keyof ModelSummary;
export type TargetKey = keyof TargetRow;
export type SurveyKey = keyof SurveyRow;

/**
 * A quantity of a stored record: its value, or undefined when the record's format does not have the quantity
 * ("not computed in this version"), which is never the same as null (computed: undefined or infinite).
 */
export function quantityValue(
  record: object,
  key: RowKey | SummaryKey | TargetKey | SurveyKey,
): Num | string | undefined {
  return key in record ? (record as Record<string, Num | string>)[key] : undefined;
}
