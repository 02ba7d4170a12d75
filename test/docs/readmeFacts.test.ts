// The README states facts that the code decides: the formats this release writes, the model limit, the demo
// archive's versions. Each is read from the README's own sentence and compared with the code or the files, so that
// a change of one without the other fails here.
import { describe, expect, it } from "vitest";
import { readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import { TABLES_FORMAT, VERSION_FORMAT } from "../../src/contract/formats.js";
import { ROOT } from "../helpers/buildDemoSite.js";

const readme = readFileSync(join(ROOT, "README.md"), "utf8").replace(/\s+/g, " ");
const match = (re: RegExp) => {
  const m = readme.match(re);
  if (!m) throw new Error(`README has no sentence matching ${re}`);
  return m;
};

describe("README facts agree with the code and the files", () => {
  it("the tables and version-record formats this release writes", () => {
    const m = match(
      /This release writes \*\*format (\d+)\*\* and reads formats 1 to (\d+) \(version records: writes format (\d+), reads 1 to (\d+)\)/,
    );
    expect(`cosmoledger.tables/${m[1]}`).toBe(TABLES_FORMAT);
    expect(`cosmoledger.tables/${m[2]}`).toBe(TABLES_FORMAT);
    expect(`cosmoledger.version/${m[3]}`).toBe(VERSION_FORMAT);
    expect(`cosmoledger.version/${m[4]}`).toBe(VERSION_FORMAT);
  });

  it("the model limit is the scenario schema's", () => {
    const schema = JSON.parse(readFileSync(join(ROOT, "src/schema/scenario.schema.json"), "utf8"));
    expect(Number(match(/\*\*Limits\.\*\* At most ([\d,]+) models/)[1].replace(/,/g, ""))).toBe(
      schema.properties.models.maxItems,
    );
  });

  it("the demo archive holds the versions the README counts", () => {
    const archive = join(ROOT, "scenarios", "archive");
    const count = (id: string) => readdirSync(join(archive, id)).filter((f) => /^v\d+\.json$/.test(f)).length;
    for (const id of ["lantern-deep-field", "harbor-lights-census", "saltmarsh-forecast"])
      expect(Number(match(new RegExp(`\`${id}\` (?:has )?(\\d+) versions`))[1]), id).toBe(count(id));
    expect(readme).toMatch(/`tidewater-geometry` none \(an unfrozen draft\)/);
    expect(readdirSync(archive)).not.toContain("tidewater-geometry");
  });
});
