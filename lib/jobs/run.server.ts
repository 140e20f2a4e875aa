import 'server-only';
import { measureTake, type JobOutcome } from './measure.server';
import { measureConverterCheck } from './measureConverterCheck.server';
import type { ClaimedJob } from './queue.server';
import { writeMissingWaveform } from './waveform.server';

/** Runs a claimed job: a take through the pipeline, a take's missing waveform file, or a converter check through the converter analysis. */
export function runJob(job: ClaimedJob, workerId: string): Promise<JobOutcome> {
  if (job.converterCheckId !== null) return measureConverterCheck(job, workerId);
  return job.purpose === 'waveform' ? writeMissingWaveform(job, workerId) : measureTake(job, workerId);
}

/** What a job works on, for the worker's log. */
export function describeJob(job: ClaimedJob): string {
  return job.converterCheckId !== null ? `Converter check ${job.converterCheckId}` : `Take ${job.takeId} (${job.purpose})`;
}
