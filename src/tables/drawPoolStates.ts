/**
 * The states of a job shared with the helper thread of spreads, in one Int32 cell (drawPool.ts and drawWorker.ts):
 * the main thread posts a job WAITING; the helper takes it (RUNNING) and ends it DONE or FAILED; a main thread that
 * finished the work alone closes it (CLOSED) so that a late helper leaves it alone.
 */
export const JOB_STATE = { WAITING: 0, RUNNING: 1, DONE: 2, CLOSED: 3, FAILED: 4 } as const;

/** Test hook: COSMOLEDGER_FAULT_INJECTION=helper-exit or helper-hang makes the helper die or stop answering. */
export const FAULT_INJECTION = "COSMOLEDGER_FAULT_INJECTION";
