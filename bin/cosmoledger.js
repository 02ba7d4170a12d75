#!/usr/bin/env node
// Entry point: runs the compiled CLI (npm install / npm ci compile it through the prepare script). Every command but
// `build` and `serve` runs from the bundle in dist/bundle (a few files to load instead of about a hundred: start-up
// is mostly module loading); those two run from dist/ itself, the same modules the Eleventy config imports.
import { existsSync } from "node:fs";

const bundle = new URL("../dist/bundle/cosmoledger.mjs", import.meta.url);
const entry = !["build", "serve"].includes(process.argv[2]) && existsSync(bundle) ? bundle.href : "../dist/cli/main.js";
const { main } = await import(entry);

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
    // A fault of ours that names itself (the helper thread of spreads) needs no stack to be reported.
    const text = error?.name === "HelperThreadFault" ? error.message : error?.stack ? error.stack : error;
    process.stderr.write(`cosmoledger: unexpected failure: ${text}\n`);
    process.exitCode = 1;
  },
);
