/** The measurement engine's public surface for the web app, the worker process and the CLI. */
export { analyzeFile, analyzeStream, PARALLEL_MIN_BYTES, PROGRESS_INTERVAL_MS, type AnalyzeOptions } from './pipeline';
export { judgeReport, reasonOf, REASON_MAX_LENGTH, verdictOf } from './findings';
export { channelLayout, ixmlTrackNames, type LayoutInfo } from './layout';
export * from './format';
export { UnreadableWavError, type UnreadableReason } from './reader/UnreadableWavError';
export { DEFAULT_SPEC, deliverySpecSchema, type DeliverySpec } from './spec';
export type * from './types';
