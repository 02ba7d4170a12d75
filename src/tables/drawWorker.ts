// A worker thread that evaluates spread draws, and then their bands, beside the main thread (src/tables/drawPool.ts). It claims draws
// from the same counter as the main thread and writes into the same shared buffers, so the results do not depend
// on which thread computed which draw.
import { parentPort } from "node:worker_threads";
import { evaluateClaimedDraws, type DrawJob } from "./drawEvaluation.js";
import { computeClaimedBands, type BandJob } from "./bandStatistics.js";
import { FAULT_INJECTION, JOB_STATE } from "./drawPoolStates.js";

const { WAITING, RUNNING, DONE, FAILED } = JOB_STATE;
/** Tests only (test/spread/drawPoolFaults.test.ts): die, or stop answering, after taking a job. */
const fault = process.env[FAULT_INJECTION];

type Message =
  | { kind: "draws"; job: DrawJob; tally: Int32Array; state: Int32Array }
  | { kind: "bands"; job: BandJob; state: Int32Array }
  | { kind: "prime"; jobs: Omit<DrawJob, "out" | "status" | "next">[] };

parentPort?.on("message", (message: Message) => {
  if (message.kind === "prime") {
    // One draw of each kind of model, evaluated and dropped, so that this thread's code is optimised for all of
    // them (drawPool.primeHelper).
    for (const job of message.jobs) {
      try {
        evaluateClaimedDraws({
          ...job,
          out: new Float64Array(job.layout.size),
          status: new Int8Array(1),
          next: new Int32Array(1),
        });
      } catch {
        // a draw that fails fails again where it counts, on the thread that reports it
      }
    }
    return;
  }
  const { state } = message;
  if (Atomics.compareExchange(state, 0, WAITING, RUNNING) !== WAITING) return; // the main thread finished alone
  if (fault === "helper-exit") process.exit(70);
  if (fault === "helper-hang") for (;;) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0);
  let final: number = DONE;
  try {
    if (message.kind === "draws") evaluateClaimedDraws(message.job, message.tally);
    else computeClaimedBands(message.job);
  } catch {
    final = FAILED; // the main thread re-evaluates what this thread claimed, and reports the error itself
  }
  Atomics.store(state, 0, final);
  Atomics.notify(state, 0);
});
