'use client';

import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { ConverterReport } from '@/dsp/converter/report';
import { channelName, formatKhz } from '@/lib/format';
import { comparable } from '@/lib/converterChecks/figures';
import { useThemeColors, type ThemeColors } from '../review/useThemeColors';

const TOKENS = ['accent', 'ink', 'warn', 'pass', 'fail', 'muted'] as const;
const DASHES: (number[] | undefined)[] = [undefined, [8, 4], [2, 3], [10, 3, 2, 3]];
/** The plot shows at most this far below the 997 Hz level; the table below it has every figure. */
const FLOOR_DB = -30;

const hzLabel = (hz: number) => (hz >= 1000 ? formatKhz(Math.round(hz / 10) * 10) : `${Math.round(hz)} Hz`);

/** Labels 1, 2 and 5 × 10ⁿ Hz on the logarithmic axis; the other grid lines stay unlabelled. */
function tickLabel(hz: number | null): string {
  if (hz === null || !(hz > 0)) return '';
  const lead = hz / 10 ** Math.floor(Math.log10(hz) + 1e-9);
  return [1, 2, 5].some((d) => Math.abs(lead - d) < 1e-6) ? hzLabel(hz) : '';
}

function seriesOf(report: ConverterReport, baseline: ConverterReport | null, colors: ThemeColors) {
  const count = report.channels.length;
  const grid = report.channels.find((c) => c.frequencyResponse)?.frequencyResponse?.hz ?? [];
  const sameGrid = (r: ConverterReport | null) => !!r && comparable(report, r) && r.channels.every((c) => !c.frequencyResponse || c.frequencyResponse.hz.length === grid.length);
  const lines: { label: string; values: (number | null)[]; stroke: string; dash?: number[]; width: number }[] = [];
  report.channels.forEach((c, i) => {
    if (!c.frequencyResponse) return;
    lines.push({ label: channelName(i, count), values: c.frequencyResponse.db, stroke: colors[TOKENS[i % TOKENS.length]], dash: DASHES[Math.floor(i / TOKENS.length) % DASHES.length], width: 2 });
  });
  if (baseline && sameGrid(baseline)) {
    baseline.channels.forEach((c, i) => {
      if (!c.frequencyResponse) return;
      lines.push({ label: `Baseline, ${channelName(i, count)}`, values: c.frequencyResponse.db, stroke: colors.alpha(TOKENS[i % TOKENS.length], 0.6), dash: [4, 4], width: 1 });
    });
  }
  return { grid, lines };
}

/**
 * The frequency response of each channel relative to 997 Hz, on a logarithmic frequency axis,
 * with the baseline's response dashed when it was measured on the same grid. Drawn with uPlot;
 * colours from the theme, lines told apart by dash and the legend as well as colour.
 */
export function ResponsePlot({ report, baseline }: { report: ConverterReport; baseline: ConverterReport | null }) {
  const box = useRef<HTMLDivElement>(null);
  const colors = useThemeColors();

  useEffect(() => {
    const el = box.current;
    if (!el || !colors) return;
    const { grid, lines } = seriesOf(report, baseline, colors);
    if (grid.length === 0) return;
    const all = lines.flatMap((l) => l.values).filter((v): v is number => v !== null);
    const top = Math.max(3, Math.ceil(Math.max(...all)));
    const bottom = Math.max(FLOOR_DB, Math.floor(Math.min(...all)));
    const axis = { stroke: colors.ink, grid: { stroke: colors.line, width: 1 }, ticks: { stroke: colors.line, width: 1 }, font: '12px system-ui, sans-serif', labelFont: '12px system-ui, sans-serif' };
    const plot = new uPlot(
      {
        width: Math.max(280, el.clientWidth),
        height: 280,
        scales: { x: { time: false, distr: 3 }, y: { range: [bottom, top] } },
        axes: [
          { ...axis, label: 'Frequency', values: (_u, ticks) => ticks.map(tickLabel) },
          { ...axis, label: 'dB re 997 Hz', size: 56 },
        ],
        series: [
          { label: 'Frequency', value: (_u, v) => (v == null ? '—' : hzLabel(v)) },
          ...lines.map((l) => ({ label: l.label, stroke: l.stroke, width: l.width, dash: l.dash, spanGaps: true, points: { show: false }, value: (_u: uPlot, v: number | null) => (v == null ? '—' : `${v.toFixed(2)} dB`) })),
        ],
      },
      [grid, ...lines.map((l) => l.values)] as uPlot.AlignedData,
      el,
    );
    const resize = new ResizeObserver(() => plot.setSize({ width: Math.max(280, el.clientWidth), height: 280 }));
    resize.observe(el);
    return () => {
      resize.disconnect();
      plot.destroy();
    };
  }, [report, baseline, colors]);

  const count = report.channels.length;
  const grid = report.channels.find((c) => c.frequencyResponse)?.frequencyResponse?.hz ?? [];
  return (
    <figure className="tp-card p-4">
      <figcaption className="mb-2 font-semibold">
        Frequency response <span className="font-normal text-muted">(dB relative to 997 Hz)</span>
      </figcaption>
      {grid.length === 0 ? (
        <p className="text-muted">No channel carried the multitone.</p>
      ) : (
        <div ref={box} role="img" aria-label={`Frequency response of ${count === 1 ? 'the channel' : `${count} channels`} from ${hzLabel(grid[0])} to ${hzLabel(grid[grid.length - 1])}, relative to 997 Hz`} data-testid="response-plot" />
      )}
      {grid.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer text-accent">The response as a table</summary>
          <div className="max-h-64 overflow-auto">
            <table className="mt-2 w-full text-left font-mono text-xs">
              <thead>
                <tr>
                  <th scope="col" className="pr-3">Frequency</th>
                  {report.channels.map((_c, i) => (
                    <th key={i} scope="col" className="pr-3">
                      {channelName(i, count)} (dB)
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {grid.map((hz, k) => (
                  <tr key={hz}>
                    <td className="pr-3">{hzLabel(hz)}</td>
                    {report.channels.map((c, i) => (
                      <td key={i} className="pr-3">
                        {c.frequencyResponse?.db[k]?.toFixed(2) ?? '—'}
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
