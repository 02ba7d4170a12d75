import { spawn, type ChildProcess } from "node:child_process";
import { BIN } from "./buildDemoSite.js";

/** `cosmoledger serve` in a child process, with everything it printed so far. */
export interface ServedPreview {
  child: ChildProcess;
  url: string;
  stdout: () => string;
  stderr: () => string;
  /** Resolves once stdout has a line matching `pattern` after `from` characters (a deadline, not a sleep). */
  waitForOutput: (pattern: RegExp, from?: number, timeoutMs?: number) => Promise<void>;
  /** Ctrl-C, then the exit status. */
  stop: () => Promise<number | null>;
}

export async function servePreview(args: string[], cwd: string, timeoutMs = 120_000): Promise<ServedPreview> {
  const child = spawn(process.execPath, [BIN, "serve", "--port", "0", ...args], {
    cwd,
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  let err = "";
  child.stdout!.on("data", (d) => (out += d));
  child.stderr!.on("data", (d) => (err += d));
  const waitForOutput = (pattern: RegExp, from = 0, ms = timeoutMs) =>
    new Promise<void>((ok, fail) => {
      const deadline = Date.now() + ms;
      const poll = setInterval(() => {
        if (pattern.test(out.slice(from))) {
          clearInterval(poll);
          ok();
        } else if (child.exitCode !== null || child.signalCode !== null || Date.now() > deadline) {
          clearInterval(poll);
          fail(new Error(`serve did not print ${pattern} (exit ${child.exitCode}):\n${out}\n${err}`));
        }
      }, 20);
    });
  await waitForOutput(/ at (http:\/\/\S+)/);
  const url = / at (http:\/\/\S+)/.exec(out)![1];
  const stop = () =>
    new Promise<number | null>((ok) => {
      if (child.exitCode !== null) return ok(child.exitCode);
      child.on("exit", (code) => ok(code));
      child.kill("SIGINT");
    });
  return { child, url, stdout: () => out, stderr: () => err, waitForOutput, stop };
}
