import 'server-only';
import { createHash } from 'node:crypto';
import { Op } from 'sequelize';
import { Take } from '@/models';
import { ensureDb } from '@/lib/db/connection.server';
import type { StorageDriver } from './types';

export interface MigrationSummary {
  /** Files copied into the bucket, verified there and removed from local disk. */
  moved: number;
  /** Files whose verified copy was already in the bucket (an earlier run); removed from local disk. */
  alreadyThere: number;
  bytesMoved: number;
  /** Local files no take refers to: left where they are. */
  unreferenced: string[];
  /** Files that could not be moved safely: left where they are, with the reason. */
  problems: { key: string; reason: string }[];
}

async function sha256Of(storage: StorageDriver, key: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of storage.getRange(key)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/**
 * Moves the takes and waveform files that earlier versions kept on local disk into the bucket.
 * A take's file is moved only when its SHA-256 matches the one recorded at upload, read back from
 * the bucket before the local copy is removed; a waveform file must read back identical. Safe to
 * run again: what is already moved is gone from local disk, and a copy already in the bucket is
 * verified instead of sent twice.
 */
export async function migrateToBucket(local: StorageDriver, bucket: StorageDriver, report: (line: string) => void): Promise<MigrationSummary> {
  ensureDb();
  const summary: MigrationSummary = { moved: 0, alreadyThere: 0, bytesMoved: 0, unreferenced: [], problems: [] };
  const problem = (key: string, reason: string) => {
    summary.problems.push({ key, reason });
    report(`  kept on local disk: ${key}: ${reason}`);
  };
  const keys: string[] = [];
  for await (const key of local.list()) keys.push(key);
  for (const key of keys.sort()) {
    const take = await Take.findOne({ where: { [Op.or]: [{ storageKey: key }, { peaksKey: key }] }, attributes: ['id', 'storageKey', 'sha256'], raw: true });
    if (!take) {
      summary.unreferenced.push(key);
      report(`  no take refers to ${key}; left in place`);
      continue;
    }
    const what = key === take.storageKey ? `take ${take.id}` : `waveform file of take ${take.id}`;
    const localHash = await sha256Of(local, key);
    if (key === take.storageKey && localHash !== take.sha256) {
      problem(key, `${what}: the local file's SHA-256 ${localHash} differs from the ${take.sha256} recorded at upload`);
      continue;
    }
    const inBucket = await bucket.stat(key);
    if (inBucket && (await sha256Of(bucket, key)) === localHash) {
      await local.delete(key);
      summary.alreadyThere++;
      report(`  ${what} was already in the bucket (verified): ${key}`);
      continue;
    }
    const { bytes } = await bucket.put(key, local.getRange(key));
    const stored = await sha256Of(bucket, key);
    if (stored !== localHash) {
      await bucket.delete(key);
      problem(key, `${what}: the copy in the bucket read back as ${stored}, not ${localHash}; it was removed again`);
      continue;
    }
    await local.delete(key);
    summary.moved++;
    summary.bytesMoved += bytes;
    report(`  moved ${what} (${bytes} bytes, SHA-256 verified): ${key}`);
  }
  return summary;
}
