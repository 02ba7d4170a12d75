import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import type { TablesDocument } from "../../src/contract/tablesDocument.js";

/** Resolves and computes a scenario given as text, with the files it names (samples files) given by name. */
export function computeScenario(yaml: string, files: Record<string, string> = {}): TablesDocument {
  const s = loadScenario(yaml, "scenario.yaml", {
    readAttachment: (path) => {
      if (!(path in files)) throw new Error("no such file");
      return files[path];
    },
  });
  return buildTablesDocument(s);
}
