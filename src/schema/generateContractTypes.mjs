// Writes src/contract/generated/tablesFormatN.ts from src/schema/tables/N.schema.json for every released tables
// format, with json-schema-to-typescript. Run it after adding a format: `npm run contract:types`. A test checks that
// the committed files equal what this script writes, so the types can never drift from the schemas.
import { readFileSync, readdirSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { compile } from "json-schema-to-typescript";

const here = dirname(fileURLToPath(import.meta.url));
const schemas = join(here, "tables");
const target = join(here, "..", "contract", "generated");

/** The TypeScript text for one tables format (exported for the test that compares it with the committed file). */
export async function contractTypesSource(n) {
  const schema = JSON.parse(readFileSync(join(schemas, `${n}.schema.json`), "utf8"));
  delete schema.$id; // keep the generated names independent of the schema's address
  const banner = `/* Generated from src/schema/tables/${n}.schema.json by src/schema/generateContractTypes.mjs; do not edit. */`;
  return compile({ ...schema, title: `TablesDocumentFormat${n}` }, `TablesDocumentFormat${n}`, {
    bannerComment: banner,
    additionalProperties: false,
    strictIndexSignatures: false,
    unknownAny: true,
    format: true,
    ignoreMinAndMaxItems: true,
    style: { printWidth: 120, semi: true, singleQuote: false, trailingComma: "all" },
  });
}

export const releasedTablesFormats = () =>
  readdirSync(schemas)
    .map((f) => /^([1-9][0-9]*)\.schema\.json$/.exec(f)?.[1])
    .filter(Boolean)
    .map(Number)
    .sort((a, b) => a - b);

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  for (const n of releasedTablesFormats()) {
    writeFileSync(join(target, `tablesFormat${n}.ts`), await contractTypesSource(n));
    process.stdout.write(`wrote src/contract/generated/tablesFormat${n}.ts\n`);
  }
}
