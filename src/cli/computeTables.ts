// `compute`, `build`, `freeze` and `verify` compute through the same located step as the pages' what-if engine.
export { locatedTables as computeTables } from "../tables/locatedTables.js";
