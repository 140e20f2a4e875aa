/**
 * A recording the converter check cannot measure: no check signal in it, only part of it, or a
 * different channel count. `message` is one line a studio manager can act on; `reason` is a
 * stable key for code.
 */
export class ConverterCheckError extends Error {
  readonly reason: ConverterCheckErrorReason;

  constructor(reason: ConverterCheckErrorReason, message: string) {
    super(message);
    this.name = 'ConverterCheckError';
    this.reason = reason;
  }
}

export type ConverterCheckErrorReason = 'unsupported-format' | 'no-signal' | 'incomplete-signal' | 'channel-count';
