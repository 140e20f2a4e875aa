'use client';

import useSWR from 'swr';
import type { ApiError } from '@/lib/http/fetcher';
import { takePeaksKey } from '@/lib/http/swrKeys';
import type { TakePeaks } from '@/lib/review/views';

/** About 100 buckets a second: fine enough for the closest zoom on a laptop screen, capped for long takes. */
export function peaksBuckets(durationSec: number): number {
  return Math.min(60_000, Math.max(2_000, Math.ceil(durationSec * 100)));
}

/** The take's waveform envelope, through SWR (stored peaks do not change while the page is open). */
export function usePeaks(takeId: number, durationSec: number): { peaks: TakePeaks | null; error: string | null } {
  const { data, error } = useSWR<TakePeaks, ApiError>(takePeaksKey(takeId, peaksBuckets(durationSec)), { revalidateOnFocus: false });
  return { peaks: data ?? null, error: error ? error.message : null };
}
