import { spawnSync } from "node:child_process";
import type { BrowserContext } from "playwright-core";
import { tempDir } from "./buildDemoSite.js";

/** Debian's chromium (apt-get install -y chromium), or "" when it is not installed. */
export const chromiumPath = spawnSync("sh", ["-c", "command -v chromium"], { encoding: "utf8" }).stdout.trim();

/**
 * Headless Chromium driven by playwright-core (headless, no sandbox, no GPU, no background networking), a fresh user-data folder and no
 * downloads: the one way every browser test starts it.
 */
export async function launchChromium(options: { viewport?: { width: number; height: number } } = {}) {
  const { chromium } = await import("playwright-core");
  const context: BrowserContext = await chromium.launchPersistentContext(tempDir("cosmoledger-chromium-"), {
    executablePath: chromiumPath,
    headless: true,
    ...(options.viewport ? { viewport: options.viewport } : {}),
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--no-first-run",
    ],
  });
  return context;
}
