import { parse } from "csv-parse/sync";
import { SPREAD_KEYS, type SamplesTable, type SpreadKey } from "./resolvedScenario.js";
import { closest, distance } from "fastest-levenshtein";

/** At most this many rows in a samples file: each row is one full model evaluation. */
export const MAX_SAMPLE_ROWS = 20_000;
/**
 * At least this many rows, the least `draws.count` allows: percentiles and their Monte Carlo errors need a sample
 * (with one row every percentile is that row and its error would read as zero).
 */
export const MIN_SAMPLE_ROWS = 20;
/** A decimal number as a chain file writes one: 70, -0.5, .3, 1e-4, 2.5E+3; never hexadecimal, Infinity or NaN. */
const DECIMAL_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
export const WEIGHT_COLUMN = "weight";

/** The nearest valid key when it is plausibly a misspelling (within a third of its length), else null. */
function closestKey(name: string, valid: string[]): string | null {
  const sameLetters = valid.find((k) => k.toLowerCase() === name.toLowerCase());
  if (sameLetters) return sameLetters;
  const near = closest(name, valid);
  return distance(name.toLowerCase(), near.toLowerCase()) <= Math.max(2, Math.floor(near.length / 3)) ? near : null;
}

/** A cell as messages quote it: at most 40 characters. */
const shortCell = (cell: string) => (cell.length > 40 ? `${cell.slice(0, 39)}\u2026` : cell);

export interface SamplesProblem {
  line: number;
  column: number;
  message: string;
}

/**
 * A samples file (CSV, RFC 4180 through csv-parse): a header of parameter keys and an optional `weight` column,
 * then one row per sample. Every cell must be a finite number and every weight >= 0 with a positive total.
 * Returns the table, or the problems located by line and column in the file.
 */
export function parseSamplesFile(
  text: string,
  path: string,
  frozen = false,
): { table: SamplesTable; problems: [] } | { table: null; problems: SamplesProblem[] } {
  const problems: SamplesProblem[] = [];
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      bom: true,
      // A comment is a line that starts with "#"; a "#" inside a cell is text (and so not a number).
      comment: "#",
      comment_no_infix: !frozen,
      skip_empty_lines: true,
      trim: true,
      relax_column_count: true,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (e) {
    const err = e as { lines?: number; message: string };
    return { table: null, problems: [{ line: err.lines ?? 1, column: 1, message: `not valid CSV: ${err.message}` }] };
  }
  if (records.length === 0)
    return {
      table: null,
      problems: [{ line: 1, column: 1, message: "is empty: give a header of parameter keys, then rows" }],
    };
  const header = records[0].record;
  const headerLine = records[0].info.lines;
  const columns: SpreadKey[] = [];
  let weightAt = -1;
  const seen = new Set<string>();
  const columnStart = (cells: string[], i: number) => cells.slice(0, i).reduce((n, c) => n + c.length + 1, 1);
  header.forEach((name, i) => {
    if (seen.has(name))
      problems.push({ line: headerLine, column: columnStart(header, i), message: `column ${name} is given twice` });
    seen.add(name);
    if (name === WEIGHT_COLUMN) weightAt = i;
    else if ((SPREAD_KEYS as readonly string[]).includes(name)) columns.push(name as SpreadKey);
    else {
      const near = closestKey(name, [...SPREAD_KEYS, WEIGHT_COLUMN]);
      problems.push({
        line: headerLine,
        column: columnStart(header, i),
        message: `column ${JSON.stringify(shortCell(name))} is not a parameter key${near ? `; did you mean ${near}?` : ""} (valid: ${SPREAD_KEYS.join(", ")}, and ${WEIGHT_COLUMN})`,
      });
    }
  });
  if (columns.length === 0 && problems.length === 0)
    problems.push({
      line: headerLine,
      column: 1,
      message: `has no parameter column (valid: ${SPREAD_KEYS.join(", ")})`,
    });
  const rows = records.length - 1;
  if (rows === 0 && problems.length === 0)
    problems.push({ line: headerLine, column: 1, message: "has a header but no rows" });

  if (rows > MAX_SAMPLE_ROWS)
    problems.push({
      line: records[MAX_SAMPLE_ROWS + 1].info.lines,
      column: 1,
      message: `has ${rows} rows; at most ${MAX_SAMPLE_ROWS} are allowed (thin the chain first)`,
    });
  if (problems.length > 0) return { table: null, problems };
  const keyIndex = header.map((name) => columns.indexOf(name as SpreadKey));
  const values = columns.map(() => new Float64Array(rows));
  const weights = weightAt >= 0 ? new Float64Array(rows) : null;
  let total = 0;
  for (let r = 0; r < rows && problems.length < 20; r++) {
    const { record, info } = records[r + 1];
    if (record.length !== header.length) {
      problems.push({
        line: info.lines,
        column: 1,
        message: `row has ${record.length} cells but the header has ${header.length} (${header.join(", ")})`,
      });
      continue;
    }
    record.forEach((cell, i) => {
      const x = frozen
        ? cell === ""
          ? Number.NaN
          : Number(cell)
        : DECIMAL_NUMBER.test(cell)
          ? Number(cell)
          : Number.NaN;
      const name = header[i];
      if (!Number.isFinite(x)) {
        problems.push({
          line: info.lines,
          column: columnStart(record, i),
          message: `${name}: ${JSON.stringify(shortCell(cell))} is not a finite decimal number`,
        });
        return;
      }
      if (i === weightAt) {
        if (x < 0)
          problems.push({
            line: info.lines,
            column: columnStart(record, i),
            message: `weight ${cell} is negative; weights must be >= 0`,
          });
        else {
          weights![r] = x;
          total += x;
        }
      } else values[keyIndex[i]][r] = x;
    });
  }
  if (problems.length === 0 && rows < MIN_SAMPLE_ROWS && !frozen)
    problems.push({
      line: headerLine,
      column: 1,
      message: `has ${rows} row${rows === 1 ? "" : "s"}; at least ${MIN_SAMPLE_ROWS} are needed (as for draws.count), since percentiles and their Monte Carlo errors need a sample`,
    });
  else if (problems.length === 0 && weights !== null && !Number.isFinite(total))
    problems.push({
      line: headerLine,
      column: columnStart(header, weightAt),
      message: "the weights add up to more than a double can hold; scale them down (only their ratios matter)",
    });
  else if (problems.length === 0 && weights !== null && !(total > 0))
    problems.push({
      line: headerLine,
      column: columnStart(header, weightAt),
      message: "every weight is 0: nothing to sample",
    });
  if (problems.length > 0) return { table: null, problems };
  return { table: { path, text, columns, values, weights }, problems: [] };
}
