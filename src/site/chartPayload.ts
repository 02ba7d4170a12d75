import serialize from "serialize-javascript";

/**
 * JSON safe to place inside a <script> element: serialize-javascript in JSON mode escapes <, >, / and the line
 * separators U+2028 and U+2029, so no text can close the element or start markup.
 */
export function jsonForScriptElement(value: unknown): string {
  return serialize(value, { isJSON: true });
}
