// A worker thread that evaluates spread draws beside the main thread (src/tables/drawPool.ts). It claims draws
// from the same counter as the main thread and writes into the same shared buffers, so the results do not depend
// on which thread computed which draw.
import { parentPort } from "node:worker_threads";
import { evaluateClaimedDraws, type DrawJob } from "./drawEvaluation.js";

/** Job states in the shared `state` cell (see drawPool.ts). */
const WAITING = 0;
const RUNNING = 1;
const DONE = 2;
const FAILED = 4;

parentPort?.on("message", (message: { job: DrawJob; state: Int32Array }) => {
  const { job, state } = message;
  if (Atomics.compareExchange(state, 0, WAITING, RUNNING) !== WAITING) return; // the main thread finished alone
  let final = DONE;
  try {
    evaluateClaimedDraws(job);
  } catch {
    final = FAILED; // the main thread re-evaluates what this thread claimed, and reports the error itself
  }
  Atomics.store(state, 0, final);
  Atomics.notify(state, 0);
});
