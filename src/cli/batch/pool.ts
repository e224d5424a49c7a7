/**
 * Where batch jobs run: in this thread (one worker) or on a pool of
 * worker_threads. Either way `run` hands back results in submission order
 * while at most `window` jobs are in flight, so memory stays flat however long
 * the input is.
 */
import { Worker } from 'node:worker_threads';
import { computeJob, type BatchSettings, type ConditionJob, type JobResult } from './compute';
import type { RowOutcome } from './inputs';
import type { SiteInput } from '../../physics/mapping';

export interface JobRunner {
  submit(job: ConditionJob): Promise<JobResult>;
  close(): Promise<void>;
}

/** Runs jobs in the calling thread. */
export function inProcessRunner(sites: RowOutcome<SiteInput>[], settings: BatchSettings): JobRunner {
  return {
    submit: (job) => new Promise((resolve) => { setImmediate(() => resolve(computeJob(job, sites, settings))); }),
    close: async () => {},
  };
}

interface Pending { job: ConditionJob; resolve(r: JobResult): void; reject(e: Error): void }

/** A fixed pool of worker threads; each takes up to `perWorker` jobs at a time (hides the message round trip). */
export function threadRunner(n: number, sites: RowOutcome<SiteInput>[], settings: BatchSettings, perWorker = 2): JobRunner {
  const url = new URL('./worker-boot.mjs', import.meta.url);
  const queue: Pending[] = [];
  let failure: Error | null = null;
  let closing = false;
  const slots = Array.from({ length: n }, () => {
    const w = new Worker(url, { workerData: { sites, settings } });
    const busy = new Map<number, Pending>();
    const slot = { w, busy };
    w.on('message', (r: JobResult) => {
      const p = busy.get(r.seq);
      busy.delete(r.seq);
      p?.resolve(r);
      pump();
    });
    const fail = (e: Error) => {
      failure ??= e;
      for (const p of busy.values()) p.reject(e);
      busy.clear();
      for (const p of queue.splice(0)) p.reject(e);
    };
    w.on('error', fail);
    w.on('exit', (code) => { if (code !== 0 && !closing) fail(new Error(`a batch worker stopped with exit code ${code}`)); });
    return slot;
  });
  function pump(): void {
    while (queue.length > 0) {
      let best: (typeof slots)[number] | null = null;
      for (const s of slots) if (s.busy.size < perWorker && (!best || s.busy.size < best.busy.size)) best = s;
      if (!best) return;
      const p = queue.shift()!;
      best.busy.set(p.job.seq, p);
      best.w.postMessage(p.job);
    }
  }
  return {
    submit(job) {
      if (failure) return Promise.reject(failure);
      return new Promise<JobResult>((resolve, reject) => { queue.push({ job, resolve, reject }); pump(); });
    },
    async close() {
      closing = true;
      await Promise.all(slots.map((s) => s.w.terminate()));
    },
  };
}

/** Thrown by runOrdered when `stop` settles first. */
export class Interrupted extends Error {
  constructor() { super('interrupted'); this.name = 'Interrupted'; }
}

/**
 * Feed jobs from `jobs` to the runner and pass results to `sink` in order,
 * with at most `window` jobs submitted but not yet written. When `stop`
 * resolves, no further job is submitted or written and Interrupted is thrown
 * (the caller closes the runner, which ends the jobs in flight).
 */
export async function runOrdered(jobs: AsyncIterable<ConditionJob>, runner: JobRunner, window: number, sink: (r: JobResult) => Promise<void>, stop?: Promise<void>): Promise<void> {
  const inFlight: Promise<JobResult>[] = [];
  // Unobserved rejections are re-thrown when their turn comes.
  const guard = (p: Promise<JobResult>) => { p.catch(() => {}); return p; };
  let stopped = false;
  const stopSignal = stop ? stop.then(() => { stopped = true; return null; }) : new Promise<null>(() => {});
  const next = async (): Promise<void> => {
    const r = await Promise.race([inFlight.shift()!, stopSignal]);
    if (r === null || stopped) throw new Interrupted();
    await sink(r);
  };
  for await (const job of jobs) {
    if (stopped) throw new Interrupted();
    inFlight.push(guard(runner.submit(job)));
    while (inFlight.length >= window) await next();
  }
  while (inFlight.length > 0) await next();
  if (stopped) throw new Interrupted();
}
