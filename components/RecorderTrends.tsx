'use client';

import { useMemo } from 'react';
import type { RecorderTrendWeek } from '@/lib/fleet/views';
import { TrendChart, type TrendSeries } from './TrendChart';

/** The three weekly trend charts of one recorder. */
export function RecorderTrends({ weeks }: { weeks: RecorderTrendWeek[] }) {
  const charts = useMemo(() => {
    const labels = weeks.map((w) => w.weekStart);
    const floor: TrendSeries[] = [{ label: 'Median noise floor', values: weeks.map((w) => w.medianFloorDbfs), token: 'accent' }];
    const bits: TrendSeries[] = [
      { label: 'Median effective bits', values: weeks.map((w) => w.medianEffectiveBits), token: 'accent' },
      { label: 'Fewest effective bits', values: weeks.map((w) => w.minEffectiveBits), token: 'fail', dash: [6, 4] },
    ];
    const loudness: TrendSeries[] = [
      { label: '90th percentile', values: weeks.map((w) => w.p90Lufs), token: 'muted', dash: [2, 3] },
      { label: 'Median integrated loudness', values: weeks.map((w) => w.medianLufs), token: 'accent' },
      { label: '10th percentile', values: weeks.map((w) => w.p10Lufs), token: 'muted', dash: [6, 4] },
    ];
    return { labels, floor, bits, loudness };
  }, [weeks]);
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <TrendChart title="Noise floor per week" unit="dBFS" weeks={charts.labels} series={charts.floor} />
      <TrendChart title="Effective bits per week" unit="bits" weeks={charts.labels} series={charts.bits} />
      <div className="xl:col-span-2">
        <TrendChart title="Integrated loudness spread per week" unit="LUFS" weeks={charts.labels} series={charts.loudness} />
      </div>
    </div>
  );
}
