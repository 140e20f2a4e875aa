import { analyzeFile } from '../pipeline';
import { refusal } from './refusal';
import type { DeliverySpec } from '../spec';
import type { AnalysisReport } from '../types';

export type TaskResult = { report: AnalysisReport } | { refused: string };

/**
 * One file of a batch, run on a pool thread (piscina). Each file runs on one thread (`parallel: false`):
 * the pool already keeps every core busy with files of its own.
 */
export default async function analyzeTask({ file, spec }: { file: string; spec: DeliverySpec }): Promise<TaskResult> {
  try {
    return { report: await analyzeFile(file, { spec, parallel: false }) };
  } catch (error) {
    const refused = refusal(error, file);
    if (refused === null) throw error;
    return { refused };
  }
}
