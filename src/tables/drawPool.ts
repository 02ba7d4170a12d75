import { Worker } from "node:worker_threads";
import { availableParallelism } from "node:os";
import { evaluateClaimedDraws, type DrawJob } from "./drawEvaluation.js";
import { computeClaimedBands, type BandJob } from "./bandStatistics.js";
import { SPREAD_PERCENTILES } from "../statistics/index.js";
import { JOB_STATE } from "./drawPoolStates.js";

const { WAITING, RUNNING, CLOSED, FAILED } = JOB_STATE;

/**
 * How long the main thread waits for the helper's last claimed chunk once it has done its own share: a chunk is 8
 * draws or 64 quantities, milliseconds of work, so a minute means the helper died or stopped answering
 * (COSMOLEDGER_HELPER_STALL_MS overrides it).
 */
const stallMs = () => Number(process.env.COSMOLEDGER_HELPER_STALL_MS) || 60_000;

/** The helper thread died or stopped answering: a fault of cosmoledger, never of the user's input (exit 1). */
export class HelperThreadFault extends Error {
  override name = "HelperThreadFault";
}

/** Below this many model-redshift evaluations a second thread costs more to start than it saves. */
const PARALLEL_WORK = 40_000;

let worker: Worker | null | undefined;

/** The one helper thread of this process, started on first use; null when threads are off or unavailable. */
function helper(): Worker | null {
  if (worker !== undefined) return worker;
  worker = null;
  if (process.env.COSMOLEDGER_DRAW_THREADS === "1" || availableParallelism() < 2) return worker;
  // Beside this module: dist/tables/drawWorker.js, or dist/bundle/drawWorker.mjs in the bundle.
  const file = new URL(import.meta.url.endsWith(".mjs") ? "./drawWorker.mjs" : "./drawWorker.js", import.meta.url);
  try {
    worker = new Worker(file);
    worker.unref(); // never keeps the process alive
    worker.on("error", () => {
      worker = null;
    });
  } catch {
    worker = null;
  }
  return worker;
}

/**
 * Lets the helper thread meet every kind of model of a scenario before its code is optimised: it evaluates the first
 * draw of each job that it will share and drops the result. Without this the helper optimised its draw code for the
 * first model's kind and threw it away again at each new kind (--trace-deopt: insufficient type feedback), some
 * 50 compilations per run of the spread benchmark. Nothing waits for it; the numbers do not depend on it.
 */
export function primeHelper(jobs: Omit<DrawJob, "out" | "status" | "next">[], pointsPerDraw: number): void {
  const shared = jobs.filter((j) => j.count * pointsPerDraw >= PARALLEL_WORK && j.count > 0);
  const thread = shared.length > 0 ? helper() : null;
  if (!thread) return;
  thread.postMessage({
    kind: "prime",
    jobs: shared.map((j) => ({ ...j, values: j.values.slice(0, j.keys.length), weights: null, count: 1 })),
  });
}

let spare: ArrayBuffer | SharedArrayBuffer | null = null;

/**
 * A buffer for draw vectors, reused from one model to the next (their bands are done before the next model's draws
 * start): writing tens of megabytes into fresh memory costs a page fault per 4 KiB. Slots of rejected draws keep
 * whatever was there; only accepted draws' vectors are read, and those are written in full.
 */
function resultBuffer(bytes: number, shared: boolean): ArrayBuffer | SharedArrayBuffer {
  if (spare === null || spare.byteLength < bytes || spare instanceof SharedArrayBuffer !== shared)
    spare = shared ? new SharedArrayBuffer(bytes) : new ArrayBuffer(bytes);
  return spare;
}

/**
 * Evaluates every draw of a job, on this thread and, for large jobs, on one helper thread at once: both claim
 * draws from a shared counter and write into shared buffers, so the output is the same byte for byte whichever
 * thread evaluated a draw (and with threads off: COSMOLEDGER_DRAW_THREADS=1). Synchronous: this thread waits
 * (Atomics.wait) for the helper to finish the draws it claimed.
 */
export function evaluateDraws(
  job: Omit<DrawJob, "out" | "status" | "next">,
  pointsPerDraw: number,
): { out: Float64Array; status: Int8Array; helperDraws: number } {
  const Q = job.layout.size;
  const parallel = job.count * pointsPerDraw >= PARALLEL_WORK ? helper() : null;
  const shared = (bytes: number) => (parallel ? new SharedArrayBuffer(bytes) : new ArrayBuffer(bytes));
  const full: DrawJob = {
    ...job,
    out: new Float64Array(resultBuffer(job.count * Q * 8, parallel !== null), 0, job.count * Q),
    status: new Int8Array(shared(job.count)).fill(-1),
    next: new Int32Array(shared(4)),
  };
  if (!parallel) {
    evaluateClaimedDraws(full);
    return { out: full.out, status: full.status, helperDraws: 0 };
  }
  const tally = new Int32Array(new SharedArrayBuffer(4));
  runShared(
    parallel,
    "draws",
    { job: full, tally },
    () => evaluateClaimedDraws(full),
    () => {
      Atomics.store(tally, 0, 0);
      evaluateClaimedDraws({ ...full, next: new Int32Array(1) });
    },
  );
  return { out: full.out, status: full.status, helperDraws: Atomics.load(tally, 0) };
}

/**
 * Runs one job on this thread and the helper together: the helper is sent the job, both claim work from its
 * shared counter, and this thread waits for the helper's claimed part. If the helper had not started by the time
 * this thread ran out of work, it never starts on this job; if it failed, `redo` does everything here again (so
 * that an unexpected error surfaces on this thread, with its stack).
 */
function runShared(
  helperThread: Worker,
  kind: "draws" | "bands",
  payload: { job: object; tally?: Int32Array },
  work: () => void,
  redo: () => void,
) {
  const state = new Int32Array(new SharedArrayBuffer(4));
  helperThread.postMessage({ kind, ...payload, state });
  work();
  if (Atomics.compareExchange(state, 0, WAITING, CLOSED) !== WAITING) {
    // The helper holds at most one claimed chunk now; a bounded wait for it, never a hang.
    const deadline = Date.now() + stallMs();
    while (Atomics.load(state, 0) === RUNNING) {
      const left = deadline - Date.now();
      if (left <= 0) {
        void helperThread.terminate();
        worker = null;
        throw new HelperThreadFault(
          `the helper thread of spreads stopped answering during the ${kind === "draws" ? "draws" : "percentile bands"} (no result within ${Math.round(stallMs() / 1000)} s); this is a fault of cosmoledger, not of the scenario: please report it (COSMOLEDGER_DRAW_THREADS=1 computes on one thread meanwhile)`,
        );
      }
      Atomics.wait(state, 0, RUNNING, Math.min(left, 1000));
    }
  }
  if (Atomics.load(state, 0) === FAILED) redo();
}

/** The bands of every quantity of a spread (bandStatistics.ts), shared with the helper thread when it is running. */
export function computeBands(
  job: Omit<BandJob, "q_" | "e_" | "missing" | "next">,
): Pick<BandJob, "q_" | "e_" | "missing"> {
  const parallel = job.values.buffer instanceof SharedArrayBuffer ? helper() : null;
  const shared = (bytes: number) => (parallel ? new SharedArrayBuffer(bytes) : new ArrayBuffer(bytes));
  const full: BandJob = {
    ...job,
    accepted: parallel ? copyToShared(job.accepted) : job.accepted,
    weights: job.weights && parallel ? copyToShared(job.weights) : job.weights,
    q_: new Float64Array(shared(job.Q * SPREAD_PERCENTILES.length * 8)),
    e_: new Float64Array(shared(job.Q * SPREAD_PERCENTILES.length * 8)),
    missing: new Int32Array(shared(job.Q * 4)),
    next: new Int32Array(shared(4)),
  };
  if (parallel)
    runShared(
      parallel,
      "bands",
      { job: full },
      () => computeClaimedBands(full),
      () => computeClaimedBands({ ...full, next: new Int32Array(1) }),
    );
  else computeClaimedBands(full);
  return full;
}

function copyToShared<T extends Int32Array | Float64Array>(a: T): T {
  const out = new (a.constructor as new (b: SharedArrayBuffer) => T)(new SharedArrayBuffer(a.byteLength));
  out.set(a);
  return out;
}
