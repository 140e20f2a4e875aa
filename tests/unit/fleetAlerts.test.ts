import { describe, expect, it } from 'vitest';
import { DEFAULT_ALERT_SETTINGS, recorderAlerts, type RecorderHealth } from '@/lib/fleet/alerts';

// A seeded trend: one take a day for 104 days (90 baseline + 14 recent), a floor that may step up
// over the last 14 days, reduced to the aggregates SQL hands over (medians computed here directly).
function seeded(opts: { floor?: number; riseDb?: number; bits?: (day: number) => number; belowFs?: (day: number) => number; rateMismatch?: (day: number) => boolean } = {}): RecorderHealth {
  let state = 42;
  const noise = () => {
    state = (state * 1103515245 + 12345) % 2 ** 31;
    return (state / 2 ** 31 - 0.5) * 1.0; // ±0.5 dB
  };
  const days = Array.from({ length: 104 }, (_, d) => d);
  const recent = (d: number) => d >= 90;
  const floors = days.map((d) => (opts.floor ?? -90) + (recent(d) ? (opts.riseDb ?? 0) : 0) + noise());
  const median = (xs: number[]) => {
    const s = [...xs].sort((a, b) => a - b);
    const m = s.length >> 1;
    return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
  };
  const recentDays = days.filter(recent);
  const bits = recentDays.map((d) => opts.bits?.(d) ?? 22);
  return {
    recorderId: 7,
    label: 'Booth C interface',
    baseline: { takes: 90, medianFloorDbfs: median(floors.slice(0, 90)) },
    recent: {
      takes: 14,
      medianFloorDbfs: median(floors.slice(90)),
      minEffectiveBits: Math.min(...bits),
      lowBitsTakes: bits.filter((b) => b < 20).length,
      belowFullScaleClipTakes: recentDays.filter((d) => (opts.belowFs?.(d) ?? 0) > 0).length,
      rateMismatchTakes: recentDays.filter((d) => opts.rateMismatch?.(d) ?? false).length,
    },
    specMinEffectiveBits: 20,
  };
}

describe('fleet alerts', () => {
  it('flags a recorder whose noise floor rose 6 dB against its own baseline', () => {
    const alerts = recorderAlerts(seeded({ riseDb: 6 }));
    expect(alerts.map((a) => a.kind)).toEqual(['noise-drift']);
    expect(alerts[0].title).toMatch(/^Noise floor up (5\.\d|6\.\d) dB$/);
    expect(alerts[0].message).toContain('-90');
    expect(alerts[0].severity).toBe('warn');
  });

  it('says nothing about a steady recorder', () => {
    expect(recorderAlerts(seeded())).toEqual([]);
    // A 2 dB rise stays under the 3 dB default…
    expect(recorderAlerts(seeded({ riseDb: 2 }))).toEqual([]);
    // …and a noisy but steady recorder is judged against itself, not against quieter ones.
    expect(recorderAlerts(seeded({ floor: -62 }))).toEqual([]);
  });

  it('honours a different drift threshold and escalates a rise of more than twice it', () => {
    expect(recorderAlerts(seeded({ riseDb: 2 }), { ...DEFAULT_ALERT_SETTINGS, driftDb: 1.5 }).map((a) => a.kind)).toEqual(['noise-drift']);
    expect(recorderAlerts(seeded({ riseDb: 9 }))[0].severity).toBe('fail');
  });

  it('does not judge a drift on too few takes', () => {
    const h = seeded({ riseDb: 8 });
    expect(recorderAlerts({ ...h, recent: { ...h.recent, takes: 2 } })).toEqual([]);
    expect(recorderAlerts({ ...h, baseline: { ...h.baseline, takes: 4 } })).toEqual([]);
  });

  it('flags effective bits below the spec minimum', () => {
    const alerts = recorderAlerts(seeded({ bits: (d) => (d % 3 === 0 ? 16 : 22) }));
    expect(alerts.map((a) => a.kind)).toEqual(['low-bits']);
    expect(alerts[0].message).toContain('fewer than 20 effective bits (lowest 16)');
    // A single short take is not yet a pattern.
    expect(recorderAlerts(seeded({ bits: (d) => (d === 95 ? 16 : 22) }))).toEqual([]);
  });

  it('flags repeated below-full-scale clipping as a preamp problem, not a single one', () => {
    const repeated = recorderAlerts(seeded({ belowFs: (d) => (d % 4 === 0 ? 2 : 0) }));
    expect(repeated.map((a) => a.kind)).toEqual(['preamp-clipping']);
    expect(repeated[0].message).toMatch(/^3 takes of the last 14 days flat-top below 0 dBFS/);
    expect(recorderAlerts(seeded({ belowFs: (d) => (d === 100 ? 1 : 0) }))).toEqual([]);
  });

  it('flags declared-rate mismatches and puts failures first', () => {
    const alerts = recorderAlerts(seeded({ riseDb: 4, rateMismatch: (d) => d === 99, bits: () => 16 }));
    expect(alerts.map((a) => a.kind)).toEqual(['low-bits', 'noise-drift', 'rate-mismatch']);
    expect(alerts.find((a) => a.kind === 'rate-mismatch')!.message).toMatch(/^1 take of the last 14 days/);
  });
});
