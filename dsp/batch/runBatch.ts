import os from 'node:os';
import { Piscina } from 'piscina';
import type { DeliverySpec } from '../spec';
import type { TaskResult } from './analyzeTask';

/** The pool's task file: the compiled one beside a compiled command line, else the TypeScript source (under tsx). */
function taskFile(): URL {
  return import.meta.url.endsWith('.mjs') ? new URL('./analyzeTask.mjs', import.meta.url) : new URL('./analyzeTask.ts', import.meta.url);
}

/**
 * Analyses several files on a pool of threads, one per core, and hands each result to `print`
 * in the order the files were named (a result that is ready early waits for the ones before it).
 */
export async function runBatch(files: string[], spec: DeliverySpec, print: (file: string, result: TaskResult) => void): Promise<void> {
  const threads = Math.max(1, Math.min(files.length, os.availableParallelism()));
  const pool = new Piscina({ filename: taskFile().href, minThreads: threads, maxThreads: threads });
  try {
    const pending = files.map((file) => pool.run({ file, spec }) as Promise<TaskResult>);
    for (let i = 0; i < files.length; i++) print(files[i], await pending[i]);
  } finally {
    await pool.destroy();
  }
}
