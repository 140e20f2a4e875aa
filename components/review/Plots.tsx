'use client';

import { useMemo } from 'react';
import type uPlot from 'uplot';
import { formatClock, formatKhz } from '@/lib/format';
import { UplotChart, chartAxis, decadeLabel, type ChartBuild } from '@/components/charts/UplotChart';

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

const buildSpectrum: ChartBuild<{ hz: number[]; db: number[]; nyquistHz: number; effectiveHz: number | null }> = ({ hz, db, nyquistHz, effectiveHz }, colors, width) => ({
  data: [hz, db.map((v) => (Number.isFinite(v) ? v : null))],
  options: {
    width,
    height: 240,
    legend: { show: false },
    cursor: { drag: { x: false, y: false } },
    scales: { x: { time: false, distr: 3, log: 10, range: () => [20, nyquistHz * 1.05] }, y: { range: (_u, min, max) => [Math.min(-100, Math.floor(min / 10) * 10), Math.max(10, Math.ceil(max / 10) * 10)] } },
    axes: [chartAxis(colors, 'Frequency (Hz, log scale)', { values: (_u, splits) => splits.map(decadeLabel) }), chartAxis(colors, 'Level (dB re passband)', { size: 56 })],
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

export function SpectrumPlot({ hz, db, nyquistHz, effectiveHz }: { hz: number[]; db: number[]; nyquistHz: number; effectiveHz: number | null }) {
  const source = useMemo(() => ({ hz, db, nyquistHz, effectiveHz }), [hz, db, nyquistHz, effectiveHz]);
  const caption = `Long-term spectrum from 20 Hz to ${formatKhz(nyquistHz)}${effectiveHz ? `; the audio ends at about ${formatKhz(effectiveHz)}` : ''}.`;
  return <UplotChart source={source} build={buildSpectrum} label={caption} testId="spectrum-plot" />;
}

const buildLoudness: ChartBuild<{ stepSec: number; values: (number | null)[]; targetLufs: number; toleranceLu: number }> = ({ stepSec, values, targetLufs, toleranceLu }, colors, width) => ({
  data: [values.map((_, i) => (i + 1) * stepSec), values],
  options: {
    width,
    height: 220,
    legend: { show: false },
    cursor: { drag: { x: false, y: false } },
    scales: {
      x: { time: false },
      y: { range: (_u, min, max) => [Math.floor(Math.min(min ?? -40, targetLufs - toleranceLu - 6) / 5) * 5, Math.ceil(Math.max(max ?? -10, targetLufs + toleranceLu + 3) / 5) * 5] },
    },
    axes: [chartAxis(colors, 'Time (minutes:seconds)', { values: (_u, splits) => splits.map((s) => formatClock(s).replace(/\.0$/, '')) }), chartAxis(colors, 'Short-term loudness (LUFS)', { size: 56 })],
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

export function LoudnessPlot({ stepSec, values, targetLufs, toleranceLu, integratedLufs }: { stepSec: number; values: (number | null)[]; targetLufs: number; toleranceLu: number; integratedLufs: number | null }) {
  const source = useMemo(() => ({ stepSec, values, targetLufs, toleranceLu }), [stepSec, values, targetLufs, toleranceLu]);
  const caption = `Short-term loudness over the take against the target band of ${targetLufs} LUFS ± ${toleranceLu} LU${integratedLufs != null ? `; integrated ${integratedLufs.toFixed(1)} LUFS` : ''}.`;
  return <UplotChart source={source} build={buildLoudness} label={caption} testId="loudness-plot" />;
}
