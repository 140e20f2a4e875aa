'use client';

import type { ReactNode } from 'react';
import { SWRConfig } from 'swr';
import { swrFetcher } from '@/lib/http/fetcher';

/** SWR with the one shared fetcher, seeded with what the server already loaded. */
export function SwrProvider({ fallback, children }: { fallback?: Record<string, unknown>; children: ReactNode }) {
  return <SWRConfig value={{ fetcher: swrFetcher, fallback: fallback ?? {}, revalidateOnFocus: true }}>{children}</SWRConfig>;
}
