// Preloaded with node --import: writes the process's peak resident memory (kB) to $COSMOLEDGER_PEAK_FILE at exit.
import { writeFileSync } from "node:fs";

process.on("exit", () => {
  if (process.env.COSMOLEDGER_PEAK_FILE)
    writeFileSync(process.env.COSMOLEDGER_PEAK_FILE, String(process.resourceUsage().maxRSS));
});
