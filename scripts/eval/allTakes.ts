import { CLEAN_TAKES, FAULT_TAKES, type EvalTake } from './corpus';
import { VARIETY_CLEAN_TAKES, VARIETY_FAULT_TAKES } from './varietyCorpus';

/** Every take of the evaluation: both corpora, clean and with planted faults. */
export const ALL_CLEAN_TAKES: EvalTake[] = [...CLEAN_TAKES, ...VARIETY_CLEAN_TAKES];
export const ALL_FAULT_TAKES: EvalTake[] = [...FAULT_TAKES, ...VARIETY_FAULT_TAKES];
export const ALL_TAKES: EvalTake[] = [...ALL_CLEAN_TAKES, ...ALL_FAULT_TAKES];
