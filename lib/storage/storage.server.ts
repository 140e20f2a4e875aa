import 'server-only';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { env } from '@/lib/env.server';
import { LocalDiskStorage } from './localDisk.server';
import type { StorageDriver } from './types';

export type { ByteRange, StorageDriver } from './types';

let driver: StorageDriver | undefined;

/** The configured storage driver (local disk under STORAGE_DIR). */
export function storage(): StorageDriver {
  driver ??= new LocalDiskStorage(path.resolve(env().STORAGE_DIR));
  return driver;
}

/** Replaces the driver, e.g. with one that fails, to exercise error paths. */
export function setStorageDriver(next: StorageDriver | undefined): void {
  driver = next;
}

/** A fresh key for an uploaded take: generated, never derived from the file's name. */
export function newTakeKey(now = new Date()): string {
  const month = `${now.getUTCFullYear()}/${String(now.getUTCMonth() + 1).padStart(2, '0')}`;
  return `takes/${month}/${randomUUID()}.wav`;
}

/** A fresh key for an uploaded converter-check recording. */
export function newConverterCheckKey(now = new Date()): string {
  const month = `${now.getUTCFullYear()}/${String(now.getUTCMonth() + 1).padStart(2, '0')}`;
  return `converter-checks/${month}/${randomUUID()}.wav`;
}

/** The waveform peaks file that belongs to a take's audio key. */
export function peaksKeyFor(takeKey: string): string {
  return takeKey.replace(/^takes\//, 'peaks/').replace(/\.wav$/, '.peaks');
}
