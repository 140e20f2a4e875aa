import type { Tone } from '@/lib/status';

export const REPORT_CAUTION =
  "Takeproof's default thresholds are a starting point only: the studio's and the broadcaster's own delivery specs and local rules take precedence over them.";

/** The colour of each status tone in the PDF and the e-mail (the light palette), always beside a mark and a word. */
export const REPORT_TONE: Record<Tone, string> = { pass: '#1a6636', warn: '#855400', fail: '#aa221c', muted: '#505a68', accent: '#1d4f91' };
