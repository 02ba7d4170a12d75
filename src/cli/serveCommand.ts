import {
  copyFileSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  rmSync,
  statSync,
  writeFileSync,
} from "node:fs";
import { tmpdir } from "node:os";
import { join, relative, resolve, sep } from "node:path";
import { displayPath } from "../common/displayPath.js";
import { PACKAGE_ROOT } from "../common/toolVersion.js";
import { defaultArchive } from "./readLedger.js";
import { PreviewServer } from "./previewServer.js";
import { PreviewSite, type PreviewResult } from "./previewSite.js";
import { SITE_MARKER } from "./siteMarker.js";

export interface ServeOptions {
  scenarios?: string;
  archive?: string;
  out?: string;
  port?: string;
  host?: string;
  images?: boolean;
}

/** How long a burst of file events (an editor's save: write, rename, chmod) is gathered before one rebuild. */
const SETTLE_MS = 25;

/**
 * `cosmoledger serve`: previews the site of a scenarios folder on a local address and keeps it current. Each save
 * rebuilds only what depends on the changed file (src/cli/previewSite.ts); open pages reload themselves, and an
 * invalid save shows its located errors over the last good page. Writes only into its own output folder (a fresh
 * temporary folder, removed on exit, unless --out names one). Resolves with the exit status when stopped (Ctrl-C).
 */
export async function serveCommand(o: ServeOptions): Promise<number> {
  const scenariosDir = o.scenarios ?? "scenarios";
  const scenarios = resolve(scenariosDir);
  const archive = resolve(o.archive ?? defaultArchive(scenariosDir));
  const port = o.port === undefined ? 8260 : Number(o.port);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    process.stderr.write(`error: --port ${o.port}: a port is a whole number from 0 (any free port) to 65535\n`);
    return 2;
  }
  if (!existsSync(scenarios) || !statSync(scenarios).isDirectory()) {
    process.stderr.write(`error: scenarios folder ${scenariosDir} does not exist\n`);
    return 2;
  }
  if (o.archive !== undefined && !existsSync(archive)) {
    process.stderr.write(`error: archive folder ${o.archive} does not exist\n`);
    return 2;
  }
  let out: string;
  if (o.out !== undefined) {
    out = resolve(o.out);
    if (existsSync(out) && !existsSync(join(out, SITE_MARKER)) && readdirSync(out).length > 0) {
      process.stderr.write(
        `error: refusing to write into ${o.out}: it is not empty and was not built by cosmoledger (no ${SITE_MARKER}); choose another --out\n`,
      );
      return 2;
    }
    if (inside(out, scenarios) || inside(out, archive)) {
      process.stderr.write(
        `error: --out ${o.out} lies inside the scenarios or archive folder; choose a folder outside them\n`,
      );
      return 2;
    }
    mkdirSync(out, { recursive: true });
  } else out = mkdtempSync(join(tmpdir(), "cosmoledger-preview-"));
  writeFileSync(join(out, SITE_MARKER), "Built by cosmoledger; this folder is replaced by the next build.\n");

  const site = new PreviewSite(scenarios, archive, out, { images: o.images ?? false });
  const server = new PreviewServer(out);
  let address: string;
  try {
    address = await server.listen(o.host ?? "127.0.0.1", port);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    process.stderr.write(
      `error: cannot listen on ${o.host ?? "127.0.0.1"}:${port}: ${code === "EADDRINUSE" ? "the port is in use; choose another with --port (0: any free port)" : (e as Error).message}\n`,
    );
    if (o.out === undefined) rmSync(out, { recursive: true, force: true });
    return 2;
  }

  let saidWarnings = "";
  const report = (r: PreviewResult, ms: number, first: boolean) => {
    // Warnings go to the terminal when they change, not on every save.
    const warnings = r.warnings.join("\n");
    if (warnings !== saidWarnings && warnings) process.stderr.write(`${warnings}\n`);
    saidWarnings = warnings;
    server.broadcast("status", { errors: r.errors, warnings: r.warnings, summary: r.summary });
    if (r.errors.length > 0) {
      for (const line of r.errors) process.stderr.write(`${line}\n`);
      process.stderr.write(`${r.summary} The open pages show the errors and keep their last good numbers.\n`);
      return;
    }
    server.broadcast("reload", { paths: r.rendered });
    process.stdout.write(
      first
        ? `built the preview (${r.rendered.length} page${r.rendered.length === 1 ? "" : "s"}) in ${ms.toFixed(0)} ms\n`
        : `rebuilt ${r.rendered.length} page${r.rendered.length === 1 ? "" : "s"} in ${ms.toFixed(0)} ms (${r.reused} unchanged)\n`,
    );
  };

  let running: Promise<void> | null = null;
  let again = false;
  let first = true;
  const rebuild = async () => {
    if (running) {
      again = true;
      return;
    }
    do {
      again = false;
      const t0 = performance.now();
      running = site.rebuild().then(
        (r) => {
          if (first && r.errors.length > 0) writePlaceholder(out);
          report(r, performance.now() - t0, first);
          if (r.errors.length === 0) first = false;
        },
        (e: unknown) => {
          // A fault of cosmoledger's, not of the scenarios: said in one line; the preview keeps serving.
          const message = `the preview could not be rebuilt: ${(e as Error).message ?? e}`;
          process.stderr.write(`error: ${message}\n`);
          server.broadcast("status", { errors: [`error: ${message}`], warnings: [], summary: "Internal error" });
        },
      );
      await running;
      running = null;
    } while (again);
  };

  process.stdout.write(
    `cosmoledger serve: previewing ${displayPath(scenariosDir)}${o.archive ? ` (archive ${displayPath(o.archive)})` : ""} at ${address}\n` +
      `  pages are written to ${o.out ?? out}${o.out ? "" : " (removed on exit)"}; Ctrl-C stops\n`,
  );
  // Watching starts before the first build: a save made while it runs is not missed.
  const { watch } = await import("chokidar");
  const watcher = watch([scenarios, archive], { ignoreInitial: true, ignored: (p) => inside(p, out) });
  let timer: NodeJS.Timeout | null = null;
  watcher.on("all", (_event, path) => {
    if (inside(path, archive)) site.archiveChanged();
    else if (!/\.ya?ml$/i.test(path)) site.attachmentChanged();
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = null;
      void rebuild();
    }, SETTLE_MS);
  });

  // Ctrl-C is honoured from here on, during the first build too: the server, the watcher and a temporary output go.
  const stopped = new Promise<number>((done) => {
    const stop = async () => {
      process.off("SIGINT", stop);
      process.off("SIGTERM", stop);
      if (timer) clearTimeout(timer);
      await watcher.close();
      await server.close();
      if (o.out === undefined) {
        // A build still running is not waited for: the process ends now, and the folder goes as it ends.
        process.on("exit", () => rmSync(out, { recursive: true, force: true }));
        rmSync(out, { recursive: true, force: true });
      }
      process.stdout.write("stopped\n");
      done(0);
      if (running) setImmediate(() => process.exit(0));
    };
    process.on("SIGINT", stop);
    process.on("SIGTERM", stop);
  });
  void rebuild();
  return stopped;
}

const inside = (path: string, folder: string) => {
  const r = relative(folder, resolve(path));
  return r === "" || (!r.startsWith(`..${sep}`) && r !== ".." && !r.startsWith(sep) && !/^[A-Za-z]:/.test(r));
};

/** Before the first good build: a page that shows the errors and turns into the index once the scenarios are fixed. */
function writePlaceholder(out: string): void {
  mkdirSync(join(out, "assets"), { recursive: true });
  copyFileSync(join(PACKAGE_ROOT, "content/preview/live-preview.js"), join(out, "assets/live-preview.js"));
  copyFileSync(join(PACKAGE_ROOT, "content/assets/site.css"), join(out, "assets/site.css"));
  writeFileSync(
    join(out, "index.html"),
    `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; script-src 'self'; style-src 'self'; connect-src 'self'; base-uri 'none'; form-action 'none'">
<title>Preview waiting for valid scenarios · cosmoledger</title>
<link rel="stylesheet" href="assets/site.css">
</head>
<body>
<main><h1>No preview yet</h1><p>The scenarios folder has errors, so nothing could be built. Fix them and save: this page then shows the site.</p></main>
<script src="assets/live-preview.js"></script>
</body>
</html>
`,
  );
}
