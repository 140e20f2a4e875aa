'use client';

import { useEffect, useEffectEvent, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { useThemeColors, type ThemeColors } from './useThemeColors';

/** Options and data of one chart, from what it shows, the palette and the width it has. */
export type ChartBuild<T> = (source: T, colors: ThemeColors, width: number) => { options: uPlot.Options; data: uPlot.AlignedData };

/**
 * One uPlot chart that follows its container's width and the colour theme. It is built again
 * when the palette changes or `source` (what the chart shows) is a new object; give it a
 * memoised source so that a parent's unrelated renders do not rebuild it.
 */
export function UplotChart<T>({ source, build, label, testId }: { source: T; build: ChartBuild<T>; label: string; testId?: string }) {
  const colors = useThemeColors();
  const box = useRef<HTMLDivElement>(null);
  const buildChart = useEffectEvent((palette: ThemeColors, width: number) => build(source, palette, width));
  useEffect(() => {
    const el = box.current;
    if (!el || !colors) return;
    const { options, data } = buildChart(colors, Math.max(280, el.clientWidth));
    const plot = new uPlot(options, data, el);
    const observer = new ResizeObserver(() => plot.setSize({ width: Math.max(280, el.clientWidth), height: options.height }));
    observer.observe(el);
    return () => {
      observer.disconnect();
      plot.destroy();
    };
  }, [colors, source]);
  return <div ref={box} role="img" aria-label={label} data-testid={testId} className="tp-plot w-full" />;
}

/** An axis in the palette's muted ink with the app's own type. */
export const chartAxis = (colors: ThemeColors, label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis => ({
  label,
  stroke: colors.muted,
  labelFont: '600 12px var(--font-sans), sans-serif',
  font: '11px var(--font-sans), sans-serif',
  grid: { stroke: colors.alpha('line', 0.8), width: 1 },
  ticks: { stroke: colors.line, width: 1 },
  ...extra,
});

/** Labels a log frequency axis at 1, 2 and 5 of each decade only ("200", "2k"); the other grid lines stay unlabelled. */
export const decadeLabel = (hz: number | null) => {
  if (hz == null || !(hz > 0)) return '';
  const lead = hz / 10 ** Math.floor(Math.log10(hz) + 1e-9);
  if (![1, 2, 5].some((d) => Math.abs(lead - d) < 1e-6)) return '';
  return hz >= 1000 ? `${Number((hz / 1000).toFixed(1))}k` : `${Math.round(hz)}`;
};
