/**
 * The one error the reader throws for a file it cannot analyse: not a WAV,
 * no `fmt ` chunk, an encoding Takeproof does not decode, a header cut short...
 * `message` is one line a producer can read; `reason` is a stable key for code.
 */
export class UnreadableWavError extends Error {
  readonly reason: UnreadableReason;

  constructor(reason: UnreadableReason, message: string) {
    super(message);
    this.name = 'UnreadableWavError';
    this.reason = reason;
  }
}

export type UnreadableReason =
  | 'not-wav'
  | 'no-fmt'
  | 'no-data'
  | 'bad-fmt'
  | 'unsupported-encoding'
  | 'truncated-header'
  | 'chunk-overrun'
  | 'data-before-fmt';
