import 'server-only';
import { measureTake } from './measure.server';
import { measureConverterCheck } from './measureConverterCheck.server';
import type { ClaimedJob } from './queue.server';

/** Runs a claimed job: a take through the pipeline, or a converter check through the converter analysis. */
export function runJob(job: ClaimedJob, workerId: string): Promise<'measured' | 'unreadable' | 'requeued' | 'lost'> {
  return job.converterCheckId !== null ? measureConverterCheck(job, workerId) : measureTake(job, workerId);
}

/** What a job measures, for the worker's log. */
export function describeJob(job: ClaimedJob): string {
  return job.converterCheckId !== null ? `Converter check ${job.converterCheckId}` : `Take ${job.takeId}`;
}
