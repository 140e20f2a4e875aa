/**
 * The converter check's public surface for the web app, the worker and the CLI. The browser may
 * import `./report`, `./thresholds` and `./judge` directly (no Node modules); this index pulls in
 * the file and stream code.
 */
export { analyzeConverterCheck, analyzeConverterCheckFile, SIGNAL_VERSION, type ConverterCheckOptions } from './analyzeCheck';
export { checkSignalLayout, MAX_CHECK_CHANNELS, MAX_CHECK_RATE_HZ, MIN_CHECK_RATE_HZ, type CheckSection, type CheckSignalLayout } from './checkSignal';
export { ConverterCheckError, type ConverterCheckErrorReason } from './ConverterCheckError';
export { judgeConverterCheck } from './judge';
export type * from './report';
export { assertCheckSignalFormat, checkSignalWav, checkSignalWavChunks, checkSignalWavStream, writeCheckSignalFile, type CheckSignalFormat, type CheckSignalOptions } from './signalWriter';
export { converterThresholdsSchema, DEFAULT_CONVERTER_THRESHOLDS, type ConverterThresholds } from './thresholds';
