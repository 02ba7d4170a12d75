// Build step (run by `npm run build:ts` and `prepare`): precompiles the scenario schema into a standalone ajv
// validator module, dist/schema/scenarioValidator.cjs, so the command line does not compile the schema at start-up.
import { writeFileSync } from "node:fs";
import { Ajv } from "ajv";
import standaloneCode from "ajv/dist/standalone/index.js";
import schema from "./scenario.schema.json" with { type: "json" };
import { SCENARIO_AJV_OPTIONS } from "./scenarioAjvOptions.js";

const ajv = new Ajv({ ...SCENARIO_AJV_OPTIONS, code: { source: true } });
const validate = ajv.compile(schema);
writeFileSync(new URL("./scenarioValidator.cjs", import.meta.url), standaloneCode.default(ajv, validate));
