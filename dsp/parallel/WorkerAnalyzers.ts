import { Worker } from 'node:worker_threads';
import type { LeftOutSpan } from '../analyzers/loudness';
import type { AudioFormat, SampleBlock } from '../types';
import type { FromWorker, ToWorker } from './workerProtocol';

/** Blocks in flight to the worker before the reader waits: deep enough that one thread being descheduled does not stall the other, bounded because each holds one block of audio (up to 4 MiB). */
const MAX_BLOCKS_IN_FLIGHT = 12;
/** Longest wait for the worker to start, ms; past it the analysis runs on one thread. */
const START_TIMEOUT_MS = 15_000;

type Results = Extract<FromWorker, { kind: 'results' }>;

/**
 * The true-peak, loudness and clipping analyzers running on a second thread
 * (they are per-channel filters and runs with state, so they cannot be split
 * in time; moving them off the reading thread uses the second core). A
 * long-lived worker_threads Worker is used rather than a task pool such as
 * piscina: the analyzers keep state from block to block, which a pool of
 * independent tasks does not model.
 */
export class WorkerAnalyzers {
  private readonly worker: Worker;
  private readonly spareBuffers: Float64Array[][] = [];
  private inFlight = 0;
  private wakeReader: (() => void) | null = null;
  private resultsWaiter: ((results: Results) => void) | null = null;
  private failure: Error | null = null;
  private failureWaiter: ((error: Error) => void) | null = null;

  private constructor(worker: Worker) {
    this.worker = worker;
    worker.on('message', (message: FromWorker) => {
      if (message.kind === 'done') {
        this.spareBuffers.push(message.channels);
        this.inFlight--;
        this.wakeReader?.();
        this.wakeReader = null;
      } else if (message.kind === 'results') {
        this.resultsWaiter?.(message);
      } else if (message.kind === 'failed') {
        this.fail(new Error(`Analysis worker failed: ${message.message}`));
      }
    });
    worker.on('error', (error) => this.fail(error));
  }

  private fail(error: Error): void {
    this.failure = error;
    this.wakeReader?.();
    this.failureWaiter?.(error);
  }

  /**
   * Starts the worker for a format.
   * @param perTrack also measure each channel's own loudness (iso tracks)
   * @returns the running worker, or null when worker threads are not available here (the caller then analyses on one thread)
   */
  static async start(format: AudioFormat, perTrack = false): Promise<WorkerAnalyzers | null> {
    let worker: Worker;
    try {
      worker = new Worker(new URL('./analysisWorkerEntry.mjs', import.meta.url));
    } catch {
      return null;
    }
    const ready = await new Promise<boolean>((resolve) => {
      const timer = setTimeout(() => resolve(false), START_TIMEOUT_MS);
      worker.once('message', (message: FromWorker) => {
        clearTimeout(timer);
        resolve(message.kind === 'ready');
      });
      worker.once('error', () => {
        clearTimeout(timer);
        resolve(false);
      });
      worker.postMessage({ kind: 'start', format, perTrack } satisfies ToWorker);
    });
    if (!ready) {
      await worker.terminate();
      return null;
    }
    return new WorkerAnalyzers(worker);
  }

  /** Sends a copy of the block; waits while too many blocks are in flight. */
  async push(block: SampleBlock): Promise<void> {
    while (this.inFlight >= MAX_BLOCKS_IN_FLIGHT && !this.failure) {
      await new Promise<void>((resolve) => (this.wakeReader = resolve));
    }
    if (this.failure) throw this.failure;
    let buffers = this.spareBuffers.pop();
    if (!buffers || buffers[0].length < block.frames) buffers = block.channels.map(() => new Float64Array(Math.max(block.frames, block.channels[0].length)));
    for (let channel = 0; channel < buffers.length; channel++) buffers[channel].set(block.channels[channel].subarray(0, block.frames));
    this.inFlight++;
    const message: ToWorker = { kind: 'block', channels: buffers, frames: block.frames, startFrame: block.startFrame };
    this.worker.postMessage(message, buffers.map((buffer) => buffer.buffer as ArrayBuffer));
  }

  /** Finishes the worker's analyzers (loudness without `leaveOut`) and stops the worker. */
  async finish(leaveOut: LeftOutSpan | null = null): Promise<Results> {
    if (this.failure) throw this.failure;
    try {
      return await new Promise<Results>((resolve, reject) => {
        this.resultsWaiter = resolve;
        this.failureWaiter = reject;
        this.worker.postMessage({ kind: 'finish', leaveOut } satisfies ToWorker);
      });
    } finally {
      await this.worker.terminate();
    }
  }

  /** Stops the worker without results (after a read error). */
  async terminate(): Promise<void> {
    await this.worker.terminate();
  }
}
