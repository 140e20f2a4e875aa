import type { FleetAlert } from './alerts';
import type { LastConverterCheck } from '@/lib/converterChecks/views';

/** Shapes of the fleet statistics, safe to import from client components. */
export const FLEET_PERIODS = [7, 30, 90, 'all'] as const;
export type FleetPeriod = (typeof FLEET_PERIODS)[number];

export function parsePeriod(value: string | null | undefined): FleetPeriod | null {
  if (value === undefined || value === null || value === '') return 30;
  if (value === 'all') return 'all';
  const n = Number(value);
  return (FLEET_PERIODS as readonly unknown[]).includes(n) ? (n as FleetPeriod) : null;
}

export const PERIOD_LABEL: Record<string, string> = { '7': 'Last 7 days', '30': 'Last 30 days', '90': 'Last 90 days', all: 'All time' };

export interface WeekPoint {
  weekStart: string;
  takes: number;
  medianFloorDbfs: number | null;
}

export interface FleetRow {
  id: number;
  label: string;
  makeModel: string | null;
  location: string | null;
  active: boolean;
  /** Takes measured in the period. */
  takes: number;
  medianFloorDbfs: number | null;
  /** Share of the period's takes with at least one clipping event (at or below full scale), 0–1. */
  clippedShare: number | null;
  minEffectiveBits: number | null;
  /** Takes whose true peak is above 0 dBTP. */
  overTakes: number;
  rateMismatchTakes: number;
  aliasingTakes: number;
  /** Rejected share of the takes a producer decided on, 0–1 (null when none was decided). */
  rejectRate: number | null;
  decided: number;
  weeks: WeekPoint[];
  alerts: FleetAlert[];
  /** The recorder's latest measured converter check; null when it was never checked. */
  converterCheck: LastConverterCheck | null;
}

export interface RecentTake {
  id: number;
  originalName: string;
  sessionTitle: string;
  measuredAt: string;
  noiseFloorDbfs: number | null;
  effectiveBits: number | null;
  integratedLufs: number | null;
  truePeakDbtp: number | null;
  clipEvents: number | null;
  belowFullScaleClipEvents: number | null;
  rateMismatch: boolean | null;
  verdict: 'pass' | 'warn' | 'fail' | null;
  reason: string | null;
  decision: 'pending' | 'approved' | 'rejected';
}

export interface RecorderTrendWeek {
  weekStart: string;
  takes: number;
  medianFloorDbfs: number | null;
  minEffectiveBits: number | null;
  medianEffectiveBits: number | null;
  p10Lufs: number | null;
  medianLufs: number | null;
  p90Lufs: number | null;
}

/** How many of a recorder's latest measured takes its fleet page lists. */
export const RECENT_TAKES = 20;
