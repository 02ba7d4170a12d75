import { ScenarioInputError, issueLine, issueSummary } from "../scenario/scenarioIssue.js";
import { FILE_SYSTEM_EXIT, fileSystemRefusal } from "./fileSystemRefusal.js";
import { parseArgs } from "node:util";
import { QUOTE_HELP } from "./quoteHelp.js";

const HELP: Record<string, string> = {
  quote: QUOTE_HELP,
  main: `cosmoledger: compare FLRW background cosmologies from YAML scenario files.

Usage: cosmoledger <command> [options]

Commands:
  check FILE...             validate scenario files only
  compute FILE... [--out DIR] [--json]
                            write DIR/<id>/tables.json and one CSV per table (default DIR: out/tables)
  build [--scenarios DIR] [--out DIR] [--archive DIR] [--skip-images]
                            check and compute every scenario, then render the comparison site with every
                            frozen version (defaults: scenarios/, _site/ and scenarios/archive/)
  freeze FILE [-m MESSAGE] [--archive DIR]
                            record the scenario as its next frozen version (default archive: beside FILE)
  serve [--scenarios DIR] [--archive DIR] [--port N]
                            preview the site on a local address; each save rebuilds what it changed
  verify [--scenarios DIR | --archive DIR] [--strict] [--json] [--verbose]
                            check the archive's hashes and chains, and recompute every version
  quote (--model "H0=70 Omega_m=0.3"... | FILE) --z 0.5,1,2 [--quantities D_A,scale] [--format F]
                            print numbers for one or more models at a few redshifts, ages or distances
  export FILE [--version N] [--format F,...] [--out DIR]
                            write every table (csv json md tex html), chart (png svg) and the
                            assumptions paragraph of a scenario or of one frozen version

Run "cosmoledger <command> --help" for a command's options.
Exit status: 0 success, 2 invalid input, a refused output folder or a damaged archive (nothing written),
3 archived numbers drift with no declared reason (verify --strict), 4 the file system refused (permission,
read-only, full disk; nothing half-written is left), 1 unexpected failure (a bug: please report it).`,
  check: `Usage: cosmoledger check FILE|FOLDER... [--strict]

Validates each scenario file (a folder stands for its *.yaml files): YAML syntax, keys, types, ranges,
inheritance, physics such as a missing big bang; computes every model in memory. Prints every problem as
file:line:column: key path: message, and warnings the same way (H0 outside 20 to 150, omega_b above 0.05,
Omega_b below 0.03 or above Omega_m, T_cmb far from 2.7255 K, a recollapse, parameters outside the verified box).
Writes nothing.

Options:
  --strict    warnings are errors (exit 2)`,
  compute: `Usage: cosmoledger compute FILE|FOLDER... [--out DIR] [--json] [--strict]

Validates and computes every file, then writes DIR/<id>/tables.json plus parameters.csv, summary.csv,
redshifts.csv, differences.csv and, where the scenario has them, targets.csv and surveys.csv.
If any file is invalid, nothing at all is written.

Options:
  --out DIR   output folder (default out/tables)
  --json      print the tables document of a single file to stdout instead of writing files
  --quiet     no progress messages on stderr
  --strict    warnings (as check prints them) are errors: exit 2, nothing written`,
  build: `Usage: cosmoledger build [--scenarios DIR] [--out DIR] [--archive DIR] [--skip-images] [--quiet] [--strict]

Checks and computes every *.yaml scenario in DIR (default scenarios/), checks every frozen version in the
archive (default: the folder "archive" inside the scenarios folder), then renders the static comparison site
with Eleventy into the output folder (default _site/): a page per scenario, a page per frozen version at
<id>/vN/, a history page and diff pages. The site is built in a temporary folder and swapped in, so an invalid
scenario, a damaged archive or a failed build leaves the previous site untouched. The same inputs and archive
give byte-identical output. A build into a folder it built before renders only the pages whose inputs changed
(a new version of cosmoledger renders everything again) and checks only the version files it has not checked.

Beside every table the pages offer CSV, JSON, Markdown, LaTeX and HTML exports, and beside every chart PNG and
SVG images (drawn at build time, about 0.5 s per page; kept in node_modules/.cache/cosmoledger/images, so a
frozen version is drawn once). --skip-images leaves the chart images out (the tables' exports stay).
Warnings are printed as check prints them; --strict makes them errors (exit 2, the site untouched).`,
  serve: `Usage: cosmoledger serve [--scenarios DIR] [--archive DIR] [--port N] [--host ADDR] [--out DIR] [--images]

Previews the site of a scenarios folder (default scenarios/, archive as for build) at http://127.0.0.1:8260/ and
keeps it current: a save recomputes only the changed scenario, renders only the pages that depend on it (frozen
version pages are rendered once) and reloads the open pages that changed. An invalid save shows its errors, in
the words of check, over the last good page, which stays marked stale until the next good save; warnings show in
a quieter strip. Nothing is written into the scenarios or archive folders: pages go to a temporary folder removed
on exit, or to --out DIR (kept, and reused by the next serve or build of it). Ctrl-C stops.

Options:
  --port N       port to listen on (default 8260; 0 picks any free port)
  --host ADDR    address to listen on (default 127.0.0.1, this computer only)
  --out DIR      keep the preview's pages in DIR
  --images       also draw the charts' PNG and SVG exports (slower saves; build always draws them)`,
  freeze: `Usage: cosmoledger freeze FILE [-m MESSAGE] [--archive DIR]

Validates and computes FILE, then records it as the next version of its scenario in DIR/<id>/vN.json
(default DIR: the folder "archive" beside FILE; commit it with git). A version holds the source text, the
resolved inputs, the full tables document, the engine version and constants, the time, the message, its own
SHA-256 and the SHA-256 of the version before it. Versions are never rewritten. Freezing inputs identical to
the latest version writes nothing and names that version.

Options:
  -m, --message TEXT  why this version was frozen (shown on the history page)
  --archive DIR       archive folder`,
  export: `Usage: cosmoledger export FILE [--version N] [--format F[,F...]] [--out DIR] [--archive DIR]

Writes the files offered beside each table and chart of the scenario's page: every table (models, at a glance,
each redshift group whole and each of its quantities, early universe, targets, survey shells) as csv, json,
md (pipe table), tex (tabular with booktabs rules) and html (self-contained fragment); every chart as png
(1800 x 1020 px, 300 dpi at 6 inches) and svg; and the assumptions paragraph for a methods section
(assumptions.txt, assumptions.tex). Every file names its scenario, version (or "unfrozen draft"), hash, engine
version and page address.

Options:
  --version N   export frozen version N from the archive (its stored tables; nothing is recomputed)
  --format F    only these formats, comma-separated or repeated: csv, json, md, tex, html, png, svg
  --out DIR     output folder (default out/exports); files go to DIR/<id>/vN/ or DIR/<id>/draft/
  --archive DIR archive folder (default: the folder "archive" beside FILE)`,
  verify: `Usage: cosmoledger verify [--scenarios DIR | --archive DIR] [--strict] [--json] [--verbose] [--quiet]

Checks every version in the archive (default: the folder "archive" beside the scenario files, as for every command:
DIR/archive for --scenarios DIR, default scenarios/, or ./archive where there is no scenarios/ folder), in whatever data-contract format it was
frozen: its schema, its own SHA-256, its number and the hash chain. A tampered, missing or reordered version,
or one written by a newer cosmoledger, is an error naming the file (exit 2). Then recomputes every version
from its frozen source with the current code and separates: quantities added since the version was frozen
(not drift), drift that a declared engine change explains (named), and drift that nothing explains.

Options:
  --strict   fail (exit 3) on unexplained drift, changed resolved inputs or a source that no longer validates
  --json     print the report as JSON
  --verbose  also print the largest relative change of every quantity
  --quiet    print only the summary and the problems`,
};

const OPTIONS = {
  help: { type: "boolean", short: "h" },
  out: { type: "string" },
  json: { type: "boolean" },
  quiet: { type: "boolean" },
  scenarios: { type: "string" },
  archive: { type: "string" },
  message: { type: "string", short: "m" },
  strict: { type: "boolean" },
  version: { type: "string" },
  format: { type: "string", multiple: true },
  "skip-images": { type: "boolean" },
  port: { type: "string" },
  host: { type: "string" },
  images: { type: "boolean" },
  verbose: { type: "boolean" },
} as const;

const parseOptions = (args: string[]) => parseArgs({ args, allowPositionals: true, strict: true, options: OPTIONS });

/** Runs a command; an error the file system raised becomes one located line and exit 4, never a stack trace. */
export async function main(argv: string[]): Promise<number> {
  try {
    return await runMain(argv);
  } catch (e) {
    if (e instanceof ScenarioInputError) {
      for (const i of e.issues) process.stderr.write(`${issueLine(i)}\n`);
      process.stderr.write(`${issueSummary(e.issues, "nothing was written.")}\n`);
      return 2;
    }
    const refusal = fileSystemRefusal(e);
    if (refusal === null) throw e;
    process.stderr.write(`${refusal}\n`);
    return FILE_SYSTEM_EXIT;
  }
}

async function runMain(argv: string[]): Promise<number> {
  const [command, ...rest] = argv;
  if (command === undefined || command === "--help" || command === "-h" || command === "help") {
    process.stdout.write(HELP[rest[0] ?? ""] ?? HELP.main);
    process.stdout.write("\n");
    return command === undefined ? 2 : 0;
  }
  if (command === "quote") {
    const { quoteCommand } = await import("./quoteCommand.js");
    return quoteCommand(rest);
  }
  if (!(command in HELP) || command === "main") {
    process.stderr.write(`cosmoledger: unknown command "${command}"\n\n${HELP.main}\n`);
    return 2;
  }
  let parsed: ReturnType<typeof parseOptions>;
  try {
    parsed = parseOptions(rest);
  } catch (e) {
    process.stderr.write(`cosmoledger ${command}: ${(e as Error).message}\n\n${HELP[command]}\n`);
    return 2;
  }
  if (parsed.values.help) {
    process.stdout.write(`${HELP[command]}\n`);
    return 0;
  }
  if (command === "build") {
    if (parsed.positionals.length > 0) {
      process.stderr.write(`cosmoledger build: takes no file names; use --scenarios DIR\n`);
      return 2;
    }
    const { buildSite } = await import("./buildSite.js");
    return buildSite(
      parsed.values.scenarios ?? "scenarios",
      parsed.values.out ?? "_site",
      parsed.values.quiet ?? false,
      parsed.values.archive,
      { images: !parsed.values["skip-images"], strict: parsed.values.strict ?? false },
    );
  }
  const known: Record<string, string[]> = {
    serve: ["scenarios", "archive", "out", "port", "host", "images"],
    check: ["quiet", "strict"],
    compute: ["out", "json", "quiet", "strict"],
    freeze: ["archive", "message"],
    verify: ["archive", "scenarios", "strict", "json", "quiet", "verbose"],
    export: ["version", "format", "out", "archive"],
  };
  const stray = Object.keys(parsed.values).filter((k) => k !== "help" && !known[command].includes(k));
  if (stray.length > 0) {
    process.stderr.write(
      `cosmoledger ${command}: option --${stray[0]} does not apply to this command\n\n${HELP[command]}\n`,
    );
    return 2;
  }
  if (command === "serve") {
    if (parsed.positionals.length > 0) {
      process.stderr.write(`cosmoledger serve: takes no file names; use --scenarios DIR\n`);
      return 2;
    }
    const { serveCommand } = await import("./serveCommand.js");
    return serveCommand(parsed.values);
  }
  if (command === "freeze") {
    const { freezeCommand } = await import("./freezeCommand.js");
    return freezeCommand(parsed.positionals, parsed.values);
  }
  if (command === "export") {
    const { exportCommand } = await import("./exportCommand.js");
    return exportCommand(parsed.positionals, parsed.values);
  }
  if (command === "verify") {
    if (parsed.positionals.length > 0) {
      process.stderr.write(`cosmoledger verify: takes no file names; use --scenarios DIR or --archive DIR\n`);
      return 2;
    }
    const { verifyCommand } = await import("./verifyCommand.js");
    return verifyCommand(parsed.values);
  }
  const { runCommand } = await import("./runCommand.js");
  return runCommand(command as "check" | "compute", parsed.positionals, parsed.values);
}
