'use client';

import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { formatDate, formatMeasure } from '@/lib/format';

export interface TrendSeries {
  label: string;
  values: (number | null)[];
  /** Palette token the line is drawn in (a CSS variable of app/globals.css). */
  token: 'accent' | 'ink' | 'muted' | 'warn' | 'fail' | 'pass';
  dash?: number[];
}

const cssColor = (token: string) => {
  const rgb = getComputedStyle(document.documentElement).getPropertyValue(`--tp-${token}`).trim();
  return rgb ? `rgb(${rgb})` : 'currentColor';
};

/**
 * A weekly trend chart drawn with uPlot: time along x, the measure (with its unit) up y. Colours come
 * from the theme's CSS variables and are re-read when the theme changes; lines differ by dash as well
 * as colour, and the legend names them.
 */
export function TrendChart({ title, unit, weeks, series, height = 220 }: { title: string; unit: string; weeks: string[]; series: TrendSeries[]; height?: number }) {
  const box = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const el = box.current;
    if (!el || weeks.length === 0) return;
    const xs = weeks.map((w) => Date.parse(`${w}T00:00:00Z`) / 1000);
    let plot: uPlot | null = null;
    const build = () => {
      plot?.destroy();
      const ink = cssColor('ink');
      const grid = cssColor('line');
      const axis = { stroke: ink, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid, width: 1 }, font: '12px system-ui, sans-serif', labelFont: '12px system-ui, sans-serif' };
      plot = new uPlot(
        {
          width: Math.max(280, el.clientWidth),
          height,
          scales: { x: { time: true } },
          // Weeks are UTC Mondays: draw the time axis in UTC too, so no zone west of it shows the Sunday before.
          tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), 'Etc/UTC'),
          axes: [
            { ...axis, label: 'Week starting Monday (UTC)' },
            { ...axis, label: unit, size: 60 },
          ],
          series: [
            { label: 'Week', value: (_u, v) => (v == null ? '—' : formatDate(new Date(v * 1000))) },
            ...series.map((s) => ({
              label: s.label,
              stroke: cssColor(s.token),
              width: 2,
              dash: s.dash,
              spanGaps: true,
              points: { show: true, size: 4 },
              value: (_u: uPlot, v: number | null) => formatMeasure(v, 1, unit),
            })),
          ],
        },
        [xs, ...series.map((s) => s.values)] as uPlot.AlignedData,
        el,
      );
    };
    build();
    const resize = new ResizeObserver(() => plot?.setSize({ width: Math.max(280, el.clientWidth), height }));
    resize.observe(el);
    // The theme switcher changes data-theme on <html>; the system theme can change under "system".
    const themeWatch = new MutationObserver(build);
    themeWatch.observe(document.documentElement, { attributes: true, attributeFilter: ['data-theme'] });
    const media = window.matchMedia('(prefers-color-scheme: dark)');
    media.addEventListener('change', build);
    return () => {
      resize.disconnect();
      themeWatch.disconnect();
      media.removeEventListener('change', build);
      plot?.destroy();
    };
  }, [weeks, series, unit, height]);

  return (
    <figure className="tp-card p-4">
      <figcaption className="mb-2 font-semibold">
        {title} <span className="font-normal text-muted">({unit})</span>
      </figcaption>
      {weeks.length === 0 ? <p className="text-muted">No measured takes in this period.</p> : <div ref={box} role="img" aria-label={`${title}, ${unit}, by week`} className="tp-trend" />}
      {weeks.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer text-accent">The weekly figures as a table</summary>
          <div className="max-h-64 overflow-auto">
            <table className="mt-2 w-full text-left font-mono text-xs">
              <thead>
                <tr>
                  <th scope="col" className="pr-3">Week</th>
                  {series.map((s) => (
                    <th key={s.label} scope="col" className="pr-3">
                      {s.label}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {weeks.map((w, i) => (
                  <tr key={w}>
                    <td className="pr-3">{w}</td>
                    {series.map((s) => (
                      <td key={s.label} className="pr-3">
                        {formatMeasure(s.values[i])}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      )}
    </figure>
  );
}
