/** Worker thread of `oval --conditions`: one series step per message. */
import { parentPort } from 'node:worker_threads';
import { computeOvalSeriesStep, type OvalSeriesJob } from './oval-series-step';

parentPort!.on('message', (job: OvalSeriesJob) => {
  parentPort!.postMessage(computeOvalSeriesStep(job));
});
