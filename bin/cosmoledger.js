#!/usr/bin/env node
// Entry point: runs the compiled CLI (npm install / npm ci compile it through the prepare script).
import { main } from "../dist/cli/main.js";

// A closed pipe (cosmoledger ... | head) is not a failure.
process.stdout.on("error", (e) => {
  if (e.code === "EPIPE") process.exit(0);
  throw e;
});

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error) => {
    process.stderr.write(`cosmoledger: unexpected failure: ${error?.stack ? error.stack : error}\n`);
    process.exitCode = 1;
  },
);
