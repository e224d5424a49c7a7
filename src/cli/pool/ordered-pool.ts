/**
 * A small pool of worker threads for the streamed commands (`oval --conditions`,
 * `timeline`): jobs go to the least busy worker, results come back in
 * submission order, at most `window` jobs are in flight, so memory stays flat
 * however long the input is. With one worker the jobs run in this thread.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';

export interface Job { seq: number }

export interface JobPool<J extends Job, R extends Job> {
  submit(job: J): Promise<R>;
  close(): Promise<void>;
}

/** The cores this process may use (at least 1). */
export function coreCount(): number {
  return Math.max(1, availableParallelism());
}

/** Runs jobs in this thread with `compute`. */
export function inThreadPool<J extends Job, R extends Job>(compute: (j: J) => R): JobPool<J, R> {
  return {
    submit: (job) => new Promise((resolve, reject) => { setImmediate(() => { try { resolve(compute(job)); } catch (e) { reject(e); } }); }),
    close: async () => {},
  };
}

/** `n` worker threads started from `bootUrl` (a .mjs that registers tsx and loads the worker module). */
export function threadPool<J extends Job, R extends Job>(bootUrl: URL, n: number, workerData: unknown, perWorker = 2): JobPool<J, R> {
  type Pending = { job: J; resolve(r: R): void; reject(e: Error): void };
  const queue: Pending[] = [];
  let failure: Error | null = null;
  let closing = false;
  const slots = Array.from({ length: n }, () => {
    const w = new Worker(bootUrl, { workerData });
    const busy = new Map<number, Pending>();
    w.on('message', (r: R) => {
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
    w.on('exit', (code) => { if (code !== 0 && !closing) fail(new Error(`a worker stopped with exit code ${code}`)); });
    return { w, busy };
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
      return new Promise<R>((resolve, reject) => { queue.push({ job, resolve, reject }); pump(); });
    },
    async close() {
      closing = true;
      await Promise.all(slots.map((s) => s.w.terminate()));
    },
  };
}

/** Thrown by runInOrder when `stop` settles first. */
export class Interrupted extends Error {
  constructor() { super('interrupted'); this.name = 'Interrupted'; }
}

/**
 * Feed `jobs` to `pool` and hand results to `sink` in submission order, with at
 * most `window` jobs submitted but not yet handed on. When `stop` resolves, no
 * further job is submitted or handed on and Interrupted is thrown (the caller
 * closes the pool, which ends the jobs in flight).
 */
export async function runInOrder<J extends Job, R extends Job>(jobs: AsyncIterable<J>, pool: JobPool<J, R>, window: number, sink: (r: R) => void | Promise<void>, stop?: Promise<void>): Promise<void> {
  const inFlight: Promise<R>[] = [];
  // Unobserved rejections are re-thrown when their turn comes.
  const guard = (p: Promise<R>) => { p.catch(() => {}); return p; };
  let stopped = false;
  const stopSignal = stop ? stop.then(() => { stopped = true; return null; }) : new Promise<null>(() => {});
  const next = async (): Promise<void> => {
    const r = await Promise.race([inFlight.shift()!, stopSignal]);
    if (r === null || stopped) throw new Interrupted();
    await sink(r);
  };
  for await (const job of jobs) {
    if (stopped) throw new Interrupted();
    inFlight.push(guard(pool.submit(job)));
    while (inFlight.length >= window) await next();
  }
  while (inFlight.length > 0) await next();
  if (stopped) throw new Interrupted();
}
