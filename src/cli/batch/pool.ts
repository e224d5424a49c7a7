/**
 * Where batch jobs run: in this thread (one worker) or on a pool of
 * worker_threads (the CLI's one ordered pool, src/cli/pool/ordered-pool.ts).
 * Either way results come back in submission order with a bounded number in
 * flight, so memory stays flat however long the input is.
 */
import { computeJob, type BatchSettings, type ConditionJob, type JobResult } from './compute';
import type { RowOutcome } from './inputs';
import type { SiteInput } from '../../physics/mapping';
import { inThreadPool, threadPool, type JobPool } from '../pool/ordered-pool';

export type JobRunner = JobPool<ConditionJob, JobResult>;

/** Runs jobs in the calling thread. */
export function inProcessRunner(sites: RowOutcome<SiteInput>[], settings: BatchSettings): JobRunner {
  return inThreadPool((job: ConditionJob) => computeJob(job, sites, settings));
}

/** A fixed pool of worker threads; each takes up to `perWorker` jobs at a time (hides the message round trip). */
export function threadRunner(n: number, sites: RowOutcome<SiteInput>[], settings: BatchSettings, perWorker = 2): JobRunner {
  return threadPool(new URL('./worker-boot.mjs', import.meta.url), n, { sites, settings }, perWorker);
}
