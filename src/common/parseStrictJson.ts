import { visit } from "jsonc-parser";

/**
 * JSON.parse that refuses what JSON.parse forgives: a key repeated within one object (JSON.parse keeps the last,
 * so a reader that keeps the first would see other text than a hash covered; RFC 8259 says names SHOULD be unique).
 * Duplicates are found by jsonc-parser's visitor, one set of keys per open object. Throws a SyntaxError naming the
 * key and its offset.
 */
export function parseStrictJson(text: string): unknown {
  const stack: Set<string>[] = [];
  let duplicate: { key: string; offset: number } | null = null;
  visit(
    text,
    {
      onObjectBegin: () => {
        stack.push(new Set());
      },
      onObjectEnd: () => {
        stack.pop();
      },
      onObjectProperty: (key, offset) => {
        const keys = stack[stack.length - 1];
        if (keys.has(key)) duplicate ??= { key, offset };
        keys.add(key);
      },
    },
    { disallowComments: true, allowTrailingComma: false },
  );
  if (duplicate) {
    const d = duplicate as { key: string; offset: number };
    throw new SyntaxError(`duplicate key "${d.key}" at offset ${d.offset}`);
  }
  return JSON.parse(text);
}
