'use client';

import { useMemo } from 'react';
import type { ConverterReport } from '@/dsp/converter/report';
import { channelName, formatKhz } from '@/lib/format';
import { comparable } from '@/lib/converterChecks/figures';
import { ChartFigure } from '@/components/charts/ChartFigure';
import { UplotChart, chartAxis, decadeLabel, type ChartBuild } from '@/components/charts/UplotChart';
import type { ThemeColors } from '@/components/charts/useThemeColors';

const TOKENS = ['accent', 'ink', 'warn', 'pass', 'fail', 'muted'] as const;
const DASHES: (number[] | undefined)[] = [undefined, [8, 4], [2, 3], [10, 3, 2, 3]];
/** The plot shows at most this far below the 997 Hz level; the table below it has every figure. */
const FLOOR_DB = -30;

const hzLabel = (hz: number) => (hz >= 1000 ? formatKhz(Math.round(hz / 10) * 10) : `${Math.round(hz)} Hz`);

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

const buildResponse: ChartBuild<{ report: ConverterReport; baseline: ConverterReport | null }> = ({ report, baseline }, colors, width) => {
  const { grid, lines } = seriesOf(report, baseline, colors);
  const all = lines.flatMap((l) => l.values).filter((v): v is number => v !== null);
  const top = Math.max(3, Math.ceil(Math.max(...all)));
  const bottom = Math.max(FLOOR_DB, Math.floor(Math.min(...all)));
  return {
    data: [grid, ...lines.map((l) => l.values)],
    options: {
      width,
      height: 280,
      scales: { x: { time: false, distr: 3 }, y: { range: [bottom, top] } },
      axes: [chartAxis(colors, 'Frequency (Hz, log scale)', { values: (_u, ticks) => ticks.map(decadeLabel) }), chartAxis(colors, 'dB re 997 Hz', { size: 56 })],
      series: [
        { label: 'Frequency', value: (_u, v) => (v == null ? '—' : hzLabel(v)) },
        ...lines.map((l) => ({ label: l.label, stroke: l.stroke, width: l.width, dash: l.dash, spanGaps: true, points: { show: false }, value: (_u: unknown, v: number | null) => (v == null ? '—' : `${v.toFixed(2)} dB`) })),
      ],
    },
  };
};

/**
 * The frequency response of each channel relative to 997 Hz, on a logarithmic frequency axis,
 * with the baseline's response dashed when it was measured on the same grid. Drawn with uPlot;
 * colours from the theme, lines told apart by dash and the legend as well as colour.
 */
export function ResponsePlot({ report, baseline }: { report: ConverterReport; baseline: ConverterReport | null }) {
  const source = useMemo(() => ({ report, baseline }), [report, baseline]);
  const count = report.channels.length;
  const grid = report.channels.find((c) => c.frequencyResponse)?.frequencyResponse?.hz ?? [];
  const table = {
    summary: 'The response as a table',
    head: ['Frequency', ...report.channels.map((_c, i) => `${channelName(i, count)} (dB)`)],
    rows: grid.map((hz, k) => ({ key: hz, cells: [hzLabel(hz), ...report.channels.map((c) => c.frequencyResponse?.db[k]?.toFixed(2) ?? '—')] })),
  };
  return (
    <ChartFigure title="Frequency response" unit="dB relative to 997 Hz" empty={grid.length === 0 ? 'No channel carried the multitone.' : null} table={table}>
      <UplotChart
        source={source}
        build={buildResponse}
        label={`Frequency response of ${count === 1 ? 'the channel' : `${count} channels`} from ${hzLabel(grid[0])} to ${hzLabel(grid[grid.length - 1])}, relative to 997 Hz`}
        testId="response-plot"
      />
    </ChartFigure>
  );
}
