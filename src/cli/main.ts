import { parseArgs } from "node:util";

const HELP: Record<string, string> = {
  main: `cosmoledger: compare FLRW background cosmologies from YAML scenario files.

Usage: cosmoledger <command> [options]

Commands:
  check FILE...             validate scenario files only
  compute FILE... [--out DIR] [--json]
                            write DIR/<id>/tables.json and one CSV per table (default DIR: out/tables)
  build [--scenarios DIR] [--out DIR]
                            check and compute every scenario, then render the comparison site
                            (defaults: scenarios/ and _site/)

Run "cosmoledger <command> --help" for a command's options.
Exit status: 0 success, 2 invalid input (nothing written), 1 unexpected failure.`,
  check: `Usage: cosmoledger check FILE...

Validates each scenario file (YAML syntax, keys, types, ranges, inheritance, physics such as a missing big bang)
and prints every problem as file:line:column: key path: message. Writes nothing.`,
  compute: `Usage: cosmoledger compute FILE... [--out DIR] [--json]

Validates and computes every file, then writes DIR/<id>/tables.json plus parameters.csv, summary.csv,
redshifts.csv, differences.csv and, where the scenario has them, targets.csv and surveys.csv.
If any file is invalid, nothing at all is written.

Options:
  --out DIR   output folder (default out/tables)
  --json      print the tables document of a single file to stdout instead of writing files
  --quiet     no progress messages on stderr`,
  build: `Usage: cosmoledger build [--scenarios DIR] [--out DIR] [--quiet]

Checks and computes every *.yaml scenario in DIR (default scenarios/), then renders the static comparison site
with Eleventy into the output folder (default _site/). The site is built in a temporary folder and swapped in,
so an invalid scenario or a failed build leaves the previous site untouched.`,
};

export async function main(argv: string[]): Promise<number> {
  const [command, ...rest] = argv;
  if (command === undefined || command === "--help" || command === "-h" || command === "help") {
    process.stdout.write(HELP[rest[0] ?? ""] ?? HELP.main);
    process.stdout.write("\n");
    return command === undefined ? 2 : 0;
  }
  if (!(command in HELP) || command === "main") {
    process.stderr.write(`cosmoledger: unknown command "${command}"\n\n${HELP.main}\n`);
    return 2;
  }
  let parsed;
  try {
    parsed = parseArgs({
      args: rest, allowPositionals: true, strict: true,
      options: { help: { type: "boolean", short: "h" }, out: { type: "string" }, json: { type: "boolean" }, quiet: { type: "boolean" }, scenarios: { type: "string" } },
    });
  } catch (e) {
    process.stderr.write(`cosmoledger ${command}: ${(e as Error).message}\n\n${HELP[command]}\n`);
    return 2;
  }
  if (parsed.values.help) {
    process.stdout.write(HELP[command] + "\n");
    return 0;
  }
  if (command === "build") {
    if (parsed.positionals.length > 0) {
      process.stderr.write(`cosmoledger build: takes no file names; use --scenarios DIR\n`);
      return 2;
    }
    const { buildSite } = await import("./buildSite.js");
    return buildSite(parsed.values.scenarios ?? "scenarios", parsed.values.out ?? "_site", parsed.values.quiet ?? false);
  }
  const { runCommand } = await import("./runCommand.js");
  return runCommand(command as "check" | "compute", parsed.positionals, parsed.values);
}
