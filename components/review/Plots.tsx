'use client';

import { useEffect, useEffectEvent, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { formatClock, formatKhz } from '@/lib/format';
import { useThemeColors, type ThemeColors } from './useThemeColors';

type Build = (colors: ThemeColors, width: number) => { options: uPlot.Options; data: uPlot.AlignedData };

/** One uPlot chart that follows its container's width and the colour theme. */
function Chart({ build, label, testId }: { build: Build; label: string; testId: string }) {
  const colors = useThemeColors();
  const box = useRef<HTMLDivElement>(null);
  // The chart is rebuilt when the palette changes; it always draws the latest data.
  const buildChart = useEffectEvent((palette: ThemeColors, width: number) => build(palette, width));
  useEffect(() => {
    const el = box.current;
    if (!el || !colors) return;
    const width = Math.max(280, el.clientWidth);
    const { options, data } = buildChart(colors, width);
    const plot = new uPlot(options, data, el);
    const observer = new ResizeObserver(() => plot.setSize({ width: Math.max(280, el.clientWidth), height: options.height }));
    observer.observe(el);
    return () => {
      observer.disconnect();
      plot.destroy();
    };
  }, [colors]);
  return <div ref={box} role="img" aria-label={label} data-testid={testId} className="tp-plot w-full" />;
}

const axis = (colors: ThemeColors, label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis => ({
  label,
  stroke: colors.muted,
  labelFont: '600 12px var(--font-sans), sans-serif',
  font: '11px var(--font-sans), sans-serif',
  grid: { stroke: colors.alpha('line', 0.8), width: 1 },
  ticks: { stroke: colors.line, width: 1 },
  ...extra,
});

/** Labels a log axis at 1, 2 and 5 of each decade only ("200", "2k"); the other grid lines stay unlabelled. */
const decadeLabel = (hz: number | null) => {
  if (hz == null || !(hz > 0)) return '';
  const lead = hz / 10 ** Math.floor(Math.log10(hz) + 1e-9);
  if (![1, 2, 5].some((d) => Math.abs(lead - d) < 1e-6)) return '';
  return hz >= 1000 ? `${Number((hz / 1000).toFixed(1))}k` : `${Math.round(hz)}`;
};

/** A vertical marker line with a caption, drawn on top of the plot. */
function verticalLine(u: uPlot, x: number, color: string, caption: string, row: number) {
  const left = u.valToPos(x, 'x', true);
  if (!Number.isFinite(left) || left < u.bbox.left - 1 || left > u.bbox.left + u.bbox.width + 1) return;
  const ctx = u.ctx;
  ctx.save();
  ctx.strokeStyle = color;
  ctx.fillStyle = color;
  ctx.lineWidth = 2 * devicePixelRatio;
  ctx.setLineDash([6 * devicePixelRatio, 4 * devicePixelRatio]);
  ctx.beginPath();
  ctx.moveTo(left, u.bbox.top);
  ctx.lineTo(left, u.bbox.top + u.bbox.height);
  ctx.stroke();
  ctx.font = `600 ${11 * devicePixelRatio}px sans-serif`;
  ctx.textAlign = 'right';
  ctx.fillText(caption, left - 4 * devicePixelRatio, u.bbox.top + (14 + row * 14) * devicePixelRatio);
  ctx.restore();
}

export function SpectrumPlot({ hz, db, nyquistHz, effectiveHz }: { hz: number[]; db: number[]; nyquistHz: number; effectiveHz: number | null }) {
  const build: Build = (colors, width) => ({
    data: [hz, db.map((v) => (Number.isFinite(v) ? v : null))],
    options: {
      width,
      height: 240,
      legend: { show: false },
      cursor: { drag: { x: false, y: false } },
      scales: { x: { time: false, distr: 3, log: 10, range: () => [20, nyquistHz * 1.05] }, y: { range: (_u, min, max) => [Math.min(-100, Math.floor(min / 10) * 10), Math.max(10, Math.ceil(max / 10) * 10)] } },
      axes: [axis(colors, 'Frequency (Hz, log scale)', { values: (_u, splits) => splits.map(decadeLabel) }), axis(colors, 'Level (dB re passband)', { size: 56 })],
      series: [{ label: 'Frequency' }, { label: 'Long-term spectrum', stroke: colors.accent, width: 2, spanGaps: true, points: { show: false } }],
      hooks: {
        draw: [
          (u) => {
            verticalLine(u, nyquistHz, colors.muted, `Nyquist ${formatKhz(nyquistHz)} (declared rate)`, 0);
            if (effectiveHz) verticalLine(u, effectiveHz, colors.warn, `audio ends ${formatKhz(effectiveHz)}`, 1);
          },
        ],
      },
    },
  });
  const caption = `Long-term spectrum from 20 Hz to ${formatKhz(nyquistHz)}${effectiveHz ? `; the audio ends at about ${formatKhz(effectiveHz)}` : ''}.`;
  return <Chart build={build} label={caption} testId="spectrum-plot" />;
}

export function LoudnessPlot({ stepSec, values, targetLufs, toleranceLu, integratedLufs }: { stepSec: number; values: (number | null)[]; targetLufs: number; toleranceLu: number; integratedLufs: number | null }) {
  const times = values.map((_, i) => (i + 1) * stepSec);
  const build: Build = (colors, width) => ({
    data: [times, values.map((v) => (v == null ? null : v))],
    options: {
      width,
      height: 220,
      legend: { show: false },
      cursor: { drag: { x: false, y: false } },
      scales: {
        x: { time: false },
        y: { range: (_u, min, max) => [Math.floor(Math.min(min ?? -40, targetLufs - toleranceLu - 6) / 5) * 5, Math.ceil(Math.max(max ?? -10, targetLufs + toleranceLu + 3) / 5) * 5] },
      },
      axes: [axis(colors, 'Time (minutes:seconds)', { values: (_u, splits) => splits.map((s) => formatClock(s).replace(/\.0$/, '')) }), axis(colors, 'Short-term loudness (LUFS)', { size: 56 })],
      series: [{ label: 'Time' }, { label: 'Short-term loudness', stroke: colors.ink, width: 1.5, spanGaps: false, points: { show: false } }],
      hooks: {
        drawClear: [
          (u) => {
            // The spec's target band, shaded under the line.
            const top = u.valToPos(targetLufs + toleranceLu, 'y', true);
            const bottom = u.valToPos(targetLufs - toleranceLu, 'y', true);
            const ctx = u.ctx;
            ctx.save();
            ctx.fillStyle = colors.alpha('pass', 0.18);
            ctx.fillRect(u.bbox.left, top, u.bbox.width, bottom - top);
            ctx.strokeStyle = colors.pass;
            ctx.lineWidth = devicePixelRatio;
            ctx.setLineDash([4 * devicePixelRatio, 3 * devicePixelRatio]);
            const mid = u.valToPos(targetLufs, 'y', true);
            ctx.beginPath();
            ctx.moveTo(u.bbox.left, mid);
            ctx.lineTo(u.bbox.left + u.bbox.width, mid);
            ctx.stroke();
            ctx.fillStyle = colors.pass;
            ctx.font = `600 ${11 * devicePixelRatio}px sans-serif`;
            ctx.fillText(`target ${targetLufs} LUFS ± ${toleranceLu} LU`, u.bbox.left + 6 * devicePixelRatio, top - 4 * devicePixelRatio);
            ctx.restore();
          },
        ],
      },
    },
  });
  const caption = `Short-term loudness over the take against the target band of ${targetLufs} LUFS ± ${toleranceLu} LU${integratedLufs != null ? `; integrated ${integratedLufs.toFixed(1)} LUFS` : ''}.`;
  return <Chart build={build} label={caption} testId="loudness-plot" />;
}
