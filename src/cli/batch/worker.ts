/**
 * A batch worker thread: receives the sites and settings once, then condition
 * jobs; answers each with its formatted rows. Plain messages (structured
 * clone of small objects and one string per job), no shared state.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { computeJob, type BatchSettings, type ConditionJob } from './compute';
import type { RowOutcome } from './inputs';
import type { SiteInput } from '../../physics/mapping';

interface Init { sites: RowOutcome<SiteInput>[]; settings: BatchSettings }

const { sites, settings } = workerData as Init;
parentPort!.on('message', (job: ConditionJob) => {
  parentPort!.postMessage(computeJob(job, sites, settings));
});
