import { ScenarioInputError } from "./scenarioIssue.js";

/** Largest scenario file read, in bytes (a 1,000-model scenario is about 150 kB). */
export const MAX_SCENARIO_BYTES = 2 * 1024 * 1024;

/** Offset of the first byte that does not continue valid UTF-8 (RFC 3629: no overlongs, surrogates or > U+10FFFF), or -1. */
export function firstInvalidUtf8(b: Uint8Array): number {
  let i = 0;
  while (i < b.length) {
    const c = b[i];
    if (c < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let min: number;
    if (c >= 0xc2 && c <= 0xdf) [need, min] = [1, 0x80];
    else if (c >= 0xe0 && c <= 0xef) [need, min] = [2, 0x800];
    else if (c >= 0xf0 && c <= 0xf4) [need, min] = [3, 0x10000];
    else return i;
    let cp = c & (0x3f >> need);
    for (let k = 1; k <= need; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (d & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return -1;
}

/** Line and column (1-based, columns in characters) of a byte offset in valid UTF-8 text before it. */
export function positionOf(b: Uint8Array, offset: number): { line: number; column: number } {
  const before = new TextDecoder("utf-8").decode(b.subarray(0, offset));
  const lines = before.split(/\r\n|\r|\n/);
  return { line: lines.length, column: [...lines[lines.length - 1]].length + 1 };
}

/**
 * The bytes of a scenario file as text, or a located refusal: larger than MAX_SCENARIO_BYTES, not UTF-8 (a Latin-1
 * file, a stray byte), or holding a NUL or another control character that YAML does not allow. Bytes are never
 * replaced by U+FFFD, so hashes always cover the text the user wrote. A leading byte-order mark is dropped.
 */
export function decodeScenarioText(bytes: Uint8Array, file: string): string {
  const fail = (at: { line: number; column: number }, message: string): never => {
    throw new ScenarioInputError([{ file, ...at, path: "", message }]);
  };
  if (bytes.length > MAX_SCENARIO_BYTES) {
    fail(
      { line: 1, column: 1 },
      `the file is ${bytes.length} bytes; scenario files may be at most ${MAX_SCENARIO_BYTES} bytes`,
    );
  }
  const bad = firstInvalidUtf8(bytes);
  if (bad >= 0) {
    const hex = bytes[bad].toString(16).padStart(2, "0");
    fail(
      positionOf(bytes, bad),
      `byte 0x${hex} is not valid UTF-8: save the file as UTF-8 (it may be Latin-1 or binary)`,
    );
  }
  let text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  if (text.startsWith("\ufeff")) text = text.slice(1);
  // YAML 1.2 allows tab, LF, CR and printable characters only (YAML 1.2 spec, section 5.1).
  // biome-ignore lint/suspicious/noControlCharactersInRegex: control characters are exactly what is refused
  const control = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f\ufffe\uffff]/.exec(text);
  if (control) {
    const lines = text.slice(0, control.index).split(/\r\n|\r|\n/);
    const code = control[0].charCodeAt(0).toString(16).padStart(4, "0").toUpperCase();
    fail(
      { line: lines.length, column: [...lines[lines.length - 1]].length + 1 },
      `control character U+${code}${code === "0000" ? " (NUL)" : ""} is not allowed in a scenario file`,
    );
  }
  return text;
}
