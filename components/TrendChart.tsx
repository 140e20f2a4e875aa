'use client';

import { useMemo } from 'react';
import type uPlot from 'uplot';
import { ChartFigure } from '@/components/charts/ChartFigure';
import { UplotChart, chartAxis, type ChartBuild } from '@/components/charts/UplotChart';
import { formatDate, formatMeasure } from '@/lib/format';

export interface TrendSeries {
  label: string;
  values: (number | null)[];
  /** Palette token the line is drawn in (a CSS variable of app/globals.css). */
  token: 'accent' | 'ink' | 'muted' | 'warn' | 'fail' | 'pass';
  dash?: number[];
}

type TrendSource = { weeks: string[]; series: TrendSeries[]; unit: string; height: number };

/** Room one week's date label needs on the axis, CSS pixels. */
const WEEK_LABEL_PX = 84;

const buildTrend: ChartBuild<TrendSource> = ({ weeks, series, unit, height }, colors, width) => {
  const starts = weeks.map((w) => Date.parse(`${w}T00:00:00Z`) / 1000);
  // Ticks on the week starts themselves, every n-th one so the dates never overlap, in the app's one date format.
  const weekTicks = (u: uPlot) => {
    const every = Math.max(1, Math.ceil((starts.length * WEEK_LABEL_PX * devicePixelRatio) / Math.max(1, u.bbox.width)));
    return starts.filter((_, i) => i % every === 0);
  };
  return {
    data: [starts, ...series.map((s) => s.values)],
    options: {
      width,
      height,
      scales: { x: { time: true } },
      axes: [
        chartAxis(colors, 'Week starting Monday (UTC)', { splits: weekTicks, values: (_u, ticks) => ticks.map((t) => formatDate(new Date(t * 1000))) }),
        chartAxis(colors, unit, { size: 60 }),
      ],
      series: [
        { label: 'Week', value: (_u, v) => (v == null ? '—' : formatDate(new Date(v * 1000))) },
        ...series.map((s) => ({
          label: s.label,
          stroke: colors[s.token],
          width: 2,
          dash: s.dash,
          spanGaps: true,
          points: { show: true, size: 4 },
          value: (_u: uPlot, v: number | null) => formatMeasure(v, 1, unit),
        })),
      ],
    },
  };
};

/**
 * A weekly trend chart drawn with uPlot: time along x, the measure (with its unit) up y. Lines
 * differ by dash as well as colour, and the legend names them.
 */
export function TrendChart({ title, unit, weeks, series, height = 220 }: { title: string; unit: string; weeks: string[]; series: TrendSeries[]; height?: number }) {
  const source = useMemo(() => ({ weeks, series, unit, height }), [weeks, series, unit, height]);
  const table = {
    summary: 'The weekly figures as a table',
    head: ['Week', ...series.map((s) => s.label)],
    rows: weeks.map((w, i) => ({ key: w, cells: [w, ...series.map((s) => formatMeasure(s.values[i]))] })),
  };
  return (
    <ChartFigure title={title} unit={unit} empty={weeks.length === 0 ? 'No measured takes in this period.' : null} table={table}>
      <UplotChart source={source} build={buildTrend} label={`${title}, ${unit}, by week`} />
    </ChartFigure>
  );
}
