import type { Verdict } from '@/models/Take';

/** Worst first: fail, warn, pass, then takes without a verdict yet. */
export const VERDICT_RANK: Record<Verdict, number> = { fail: 0, warn: 1, pass: 2 };
const UNJUDGED_RANK = 3;

type Ordered = { id: number; originalName: string; verdict: Verdict | null };

/** The order every list of takes starts in: worst verdict first, then by file name. */
export function worstFirst(a: Ordered, b: Ordered): number {
  const rank = (t: Ordered) => (t.verdict ? VERDICT_RANK[t.verdict] : UNJUDGED_RANK);
  return rank(a) - rank(b) || a.originalName.localeCompare(b.originalName, 'en', { numeric: true }) || a.id - b.id;
}
