import 'server-only';
import { createReadStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { writePeaksFile } from '@/dsp/peaksPass';
import { Take } from '@/models';
import { untilDatabaseAnswers } from '@/lib/db/availability.server';
import { peaksKeyFor, storage } from '@/lib/storage/storage.server';
import { finishJob, heartbeat, retryJobLater, type ClaimedJob } from './queue.server';

/**
 * Stores a waveform peaks file written by the analysis. Returns its key, or null when storage
 * refused it (full, unreachable…): the measurement stands, and the waveform is written again later.
 */
export async function storeWaveform(takeId: number, takeKey: string, peaksPath: string): Promise<string | null> {
  const peaksKey = peaksKeyFor(takeKey);
  try {
    await storage().put(peaksKey, createReadStream(peaksPath));
    return peaksKey;
  } catch (error) {
    console.error(`Take ${takeId}: the waveform file could not be stored (${(error as Error).message}); it is written again later.`);
    return null;
  }
}

/** The job of a measured take whose waveform file is missing: reads the audio once more and stores only the waveform. */
export async function writeMissingWaveform(job: ClaimedJob, workerId: string): Promise<'measured' | 'lost' | 'requeued'> {
  const take = job.takeId === null ? null : await Take.findByPk(job.takeId, { attributes: ['id', 'storageKey', 'status', 'waveformMissing'] });
  if (!take || take.status !== 'measured' || !take.waveformMissing) {
    await finishJob(job, 'done');
    return 'measured';
  }
  const tmp = await mkdtemp(path.join(os.tmpdir(), 'takeproof-peaks-'));
  const peaksPath = path.join(tmp, 'take.peaks');
  try {
    await writePeaksFile(storage().getRange(take.storageKey), { peaksPath, reopenAt: (offset) => storage().getRange(take.storageKey, { start: offset }) });
    await stat(peaksPath);
    const peaksKey = await storeWaveform(take.id, take.storageKey, peaksPath);
    return await untilDatabaseAnswers(`saving the waveform of take ${take.id}`, async () => {
      if (!(await heartbeat(job, workerId, 100))) return 'lost' as const;
      if (!peaksKey) {
        await retryJobLater(job, 'The waveform file could not be stored.');
        return 'requeued' as const;
      }
      await take.update({ peaksKey, waveformMissing: false });
      await finishJob(job, 'done');
      return 'measured' as const;
    });
  } catch (error) {
    console.error(`Take ${take.id}: writing its waveform again failed:`, error);
    await untilDatabaseAnswers(`putting back the waveform job of take ${take.id}`, () => retryJobLater(job, 'Writing the waveform file failed.'));
    return 'requeued';
  } finally {
    await rm(tmp, { recursive: true, force: true });
  }
}
