// cosmoledger serve without a browser: refusals (exit 2, one line, nothing written), and the served site following
// a freeze and a deleted scenario over HTTP. Expectations are the command's own contract (cosmoledger serve --help).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createServer } from "node:net";
import { mkdirSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { spawnSync } from "node:child_process";
import { BIN, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { servePreview, type ServedPreview } from "../helpers/servePreview.js";

const scenario = (id: string, h0: number) =>
  `title: ${id}\nid: ${id}\nmodels:\n  - { id: a, H0: ${h0}, Omega_m: 0.3 }\n`;

/** serve that must refuse: a generous deadline, so that a serve that wrongly starts fails the test, not CI's clock. */
function refused(args: string[], cwd = process.cwd()) {
  const r = spawnSync(process.execPath, [BIN, "serve", ...args], { cwd, encoding: "utf8", timeout: 120_000 });
  return { code: r.status, stderr: r.stderr };
}

describe("cosmoledger serve refuses what it cannot do, with exit 2 and one line", () => {
  beforeAll(() => compileProject());

  it("a port outside 0 to 65535", () => {
    const r = refused(["--port", "70000"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--port 70000: a port is a whole number from 0 \(any free port\) to 65535/);
  });

  it("a scenarios folder that does not exist", () => {
    const r = refused(["--scenarios", "no-such-folder"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/scenarios folder no-such-folder does not exist/);
  });

  it("file names instead of a folder", () => {
    const r = refused(["scenarios/tidewater-geometry.yaml"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/takes no file names; use --scenarios DIR/);
  });

  it("an --out folder with files that cosmoledger did not write, which is left untouched", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "mine"));
    writeFileSync(join(dir, "mine/notes.txt"), "mine\n");
    const r = refused(["--scenarios", join(process.cwd(), "scenarios"), "--out", "mine", "--port", "0"], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/refusing to write into mine: it is not empty and was not built by cosmoledger/);
    expect(readdirSync(join(dir, "mine"))).toEqual(["notes.txt"]);
  });

  it("a port in use", async () => {
    const blocker = createServer();
    await new Promise<void>((ok) => blocker.listen(0, "127.0.0.1", () => ok()));
    const port = (blocker.address() as { port: number }).port;
    try {
      const r = refused(["--port", String(port)]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/the port is in use; choose another with --port/);
    } finally {
      blocker.close();
    }
  });
});

describe("the served site follows the archive and the folder", { timeout: 300_000 }, () => {
  let served: ServedPreview;
  let dir: string;
  const status = async (path: string) => (await fetch(served.url + path)).status;

  beforeAll(async () => {
    compileProject();
    dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/one.yaml"), scenario("one", 70));
    writeFileSync(join(dir, "scenarios/two.yaml"), scenario("two", 68));
    served = await servePreview(["--scenarios", "scenarios"], dir);
    await served.waitForOutput(/built the preview/);
  });
  afterAll(async () => {
    await served?.stop();
  });

  it("a freeze adds the version page (the archive is watched too)", async () => {
    expect(await status("one/v1/index.html")).toBe(404);
    const before = served.stdout().length;
    const f = runCli(["freeze", "scenarios/one.yaml", "-m", "first"], dir);
    expect(f.code, f.stderr).toBe(0);
    await served.waitForOutput(/rebuilt \d+ pages?/, before);
    const deadline = Date.now() + 60_000;
    while ((await status("one/v1/index.html")) !== 200 && Date.now() < deadline)
      await new Promise((r) => setTimeout(r, 100));
    expect(await status("one/v1/index.html")).toBe(200);
    expect(await status("one/latest.js")).toBe(200);
  });

  it("a deleted scenario file takes its page with it", async () => {
    expect(await status("two/index.html")).toBe(200);
    rmSync(join(dir, "scenarios/two.yaml"));
    const deadline = Date.now() + 60_000;
    while ((await status("two/index.html")) !== 404 && Date.now() < deadline)
      await new Promise((r) => setTimeout(r, 100));
    expect(await status("two/index.html")).toBe(404);
    expect(await status("two/tables.json")).toBe(404);
  });

  it("does not serve its own bookkeeping (dot files)", async () => {
    expect(await status(".cosmoledger-pages.json")).toBe(403);
  });
});
