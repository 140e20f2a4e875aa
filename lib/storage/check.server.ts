import 'server-only';
import { ConverterCheck, Take } from '@/models';
import { ensureDb } from '@/lib/db/connection.server';
import { storage } from './storage.server';

export interface StorageReport {
  /** Stored objects no take or converter check refers to (left by a crash, or written while the check ran). */
  filesWithoutRows: string[];
  /** Takes whose audio object is missing. */
  rowsWithoutFiles: { takeId: number; key: string }[];
  /** Unfinished writes (an upload in flight, or one that died). */
  partialWrites: string[];
  objects: number;
  takes: number;
}

/** Compares what storage holds with what the takes and converter checks refer to. */
export async function checkStorage(): Promise<StorageReport> {
  ensureDb();
  const takes = await Take.findAll({ attributes: ['id', 'storageKey', 'peaksKey'], raw: true });
  const referenced = new Set<string>();
  for (const t of takes) {
    referenced.add(t.storageKey);
    if (t.peaksKey) referenced.add(t.peaksKey);
  }
  for (const c of await ConverterCheck.findAll({ attributes: ['storageKey'], raw: true })) referenced.add(c.storageKey);
  const present = new Set<string>();
  for await (const key of storage().list()) present.add(key);
  const partialWrites: string[] = [];
  for await (const write of storage().unfinishedWrites()) partialWrites.push(write);
  return {
    filesWithoutRows: [...present].filter((k) => !referenced.has(k)).sort(),
    rowsWithoutFiles: takes.filter((t) => !present.has(t.storageKey)).map((t) => ({ takeId: t.id, key: t.storageKey })),
    partialWrites: partialWrites.sort(),
    objects: present.size,
    takes: takes.length,
  };
}
