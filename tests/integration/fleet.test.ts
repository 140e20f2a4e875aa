import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db/connection.server';
import { Take, User } from '@/models';
import { signedInAll, type Client, type DemoPerson } from '../support/http';
import { summaryTake, type SummaryRow } from '../support/fleetData';
import type { FleetRow } from '@/lib/fleet/views';

let as: Record<DemoPerson | 'anonymous', Client>;
const unique = () => Math.random().toString(36).slice(2, 8);
const DAY = 86_400_000;
const ago = (days: number) => new Date(Date.now() - days * DAY);

interface Fleet {
  recorders: FleetRow[];
}

// Known takes, computed on independently below.
const steady: SummaryRow[] = [
  { measuredAt: ago(1), noiseFloorDbfs: -92, clipEvents: 2, effectiveBits: 24, truePeakDbtp: 0.4, decision: 'approved' },
  { measuredAt: ago(3), noiseFloorDbfs: -90, effectiveBits: 18, rateMismatch: true, decision: 'rejected' },
  { measuredAt: ago(5), noiseFloorDbfs: -88, clipEvents: 1, belowFullScaleClipEvents: 1, aliasingRisk: true, decision: 'approved', effectiveBits: 24 },
  { measuredAt: ago(9), noiseFloorDbfs: -87, aliasingRisk: true, effectiveBits: 24 },
  { measuredAt: ago(12), noiseFloorDbfs: null, effectiveBits: 24 }, // digital silence: no floor reading
  { measuredAt: ago(60), noiseFloorDbfs: -50, effectiveBits: 24, truePeakDbtp: 1.2, decision: 'rejected' }, // outside 30 days
];
const drifting: SummaryRow[] = [
  ...Array.from({ length: 10 }, (_, i) => ({ measuredAt: ago(20 + i * 7), noiseFloorDbfs: -95 + (i % 3) * 0.4, effectiveBits: 24 })),
  ...Array.from({ length: 5 }, (_, i) => ({ measuredAt: ago(1 + i * 2), noiseFloorDbfs: -88 + (i % 2) * 0.2, effectiveBits: 24, belowFullScaleClipEvents: i < 3 ? 2 : 0, clipEvents: i < 3 ? 2 : 0 })),
];
const calm: SummaryRow[] = [
  ...Array.from({ length: 8 }, (_, i) => ({ measuredAt: ago(20 + i * 5), noiseFloorDbfs: -95, effectiveBits: 24 })),
  ...Array.from({ length: 4 }, (_, i) => ({ measuredAt: ago(1 + i), noiseFloorDbfs: -94.5, effectiveBits: 24 })),
];

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
const within = (rows: SummaryRow[], days: number) => rows.filter((r) => r.measuredAt.getTime() >= Date.now() - days * DAY);

const ids = { steady: 0, drifting: 0, calm: 0 };

beforeAll(async () => {
  db(); // the models, on the test database
  as = await signedInAll();
  const manager = await User.findOne({ where: { email: 'manager@demo.test' } });
  const session = await (await as.manager.fetch('/api/sessions', { method: 'POST', json: { title: `Fleet figures ${unique()}` } })).json();
  for (const [key, rows] of [['steady', steady], ['drifting', drifting], ['calm', calm]] as const) {
    const r = await (await as.manager.fetch('/api/recorders', { method: 'POST', json: { label: `Fleet test ${key} ${unique()}`, makeModel: 'Kestrel PR-2 field recorder' } })).json();
    ids[key] = r.id;
    await Take.bulkCreate(rows.map((row) => summaryTake(manager!.studioId, session.id, r.id, row)) as never[]);
  }
});
afterAll(async () => {
  await db().close();
});

async function fleet(client: Client, days: string) {
  const response = await client.fetch(`/api/fleet?days=${days}`);
  return { status: response.status, body: (await response.json()) as Fleet };
}

describe('GET /api/fleet', () => {
  it('computes takes, median floor and the shares over the last 30 days', async () => {
    const { status, body } = await fleet(as.manager, '30');
    expect(status).toBe(200);
    const row = body.recorders.find((r) => r.id === ids.steady)!;
    const rows = within(steady, 30);
    const floors = rows.map((r) => r.noiseFloorDbfs).filter((v): v is number => v !== null);
    const decided = rows.filter((r) => r.decision && r.decision !== 'pending');
    expect(row.takes).toBe(rows.length);
    expect(row.medianFloorDbfs).toBeCloseTo(median(floors), 5); // -89: between -90 and -88, the null ignored
    expect(row.clippedShare).toBeCloseTo(rows.filter((r) => (r.clipEvents ?? 0) > 0).length / rows.length, 5);
    expect(row.minEffectiveBits).toBe(Math.min(...rows.map((r) => r.effectiveBits ?? 22)));
    expect(row.overTakes).toBe(rows.filter((r) => (r.truePeakDbtp ?? -3) > 0).length);
    expect(row.rateMismatchTakes).toBe(rows.filter((r) => r.rateMismatch).length);
    expect(row.aliasingTakes).toBe(rows.filter((r) => r.aliasingRisk).length);
    expect(row.rejectRate).toBeCloseTo(decided.filter((r) => r.decision === 'rejected').length / decided.length, 5);
  });

  it('widens with the period: the take of 60 days ago counts over 90 days', async () => {
    const row = (await fleet(as.manager, '90')).body.recorders.find((r) => r.id === ids.steady)!;
    const rows = within(steady, 90);
    expect(row.takes).toBe(rows.length);
    expect(row.medianFloorDbfs).toBeCloseTo(median(rows.map((r) => r.noiseFloorDbfs).filter((v): v is number => v !== null)), 5);
    expect(row.overTakes).toBe(2);
    const week = (await fleet(as.manager, '7')).body.recorders.find((r) => r.id === ids.steady)!;
    expect(week.takes).toBe(within(steady, 7).length);
    expect((await fleet(as.manager, 'all')).body.recorders.find((r) => r.id === ids.steady)!.takes).toBe(steady.length);
  });

  it('gives weekly medians for the trend line', async () => {
    const row = (await fleet(as.manager, 'all')).body.recorders.find((r) => r.id === ids.drifting)!;
    const byWeek = new Map<string, number[]>();
    for (const r of drifting) {
      const d = new Date(Date.UTC(r.measuredAt.getUTCFullYear(), r.measuredAt.getUTCMonth(), r.measuredAt.getUTCDate()));
      d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7));
      const key = d.toISOString().slice(0, 10);
      byWeek.set(key, [...(byWeek.get(key) ?? []), r.noiseFloorDbfs!]);
    }
    const expected = [...byWeek].sort(([a], [b]) => a.localeCompare(b)).map(([weekStart, xs]) => ({ weekStart, medianFloorDbfs: median(xs) }));
    expect(row.weeks.map((w) => w.weekStart)).toEqual(expected.map((w) => w.weekStart));
    row.weeks.forEach((w, i) => expect(w.medianFloorDbfs).toBeCloseTo(expected[i].medianFloorDbfs, 4));
  });

  it('raises a drift alert for the recorder whose floor rose over 6 dB, with repeated below-full-scale clipping, and none for the calm one', async () => {
    const { body } = await fleet(as.manager, '30');
    const drift = body.recorders.find((r) => r.id === ids.drifting)!;
    expect(drift.alerts.map((a) => a.kind).sort()).toEqual(['noise-drift', 'preamp-clipping']);
    const recent = drifting.filter((r) => r.measuredAt.getTime() >= Date.now() - 14 * DAY).map((r) => r.noiseFloorDbfs!);
    const baseline = drifting.filter((r) => r.measuredAt.getTime() < Date.now() - 14 * DAY).map((r) => r.noiseFloorDbfs!);
    const rise = median(recent) - median(baseline);
    expect(rise).toBeGreaterThan(6);
    expect(drift.alerts.find((a) => a.kind === 'noise-drift')).toMatchObject({ severity: 'fail', title: `Noise floor up ${rise.toFixed(1)} dB` });
    expect(body.recorders.find((r) => r.id === ids.calm)!.alerts).toEqual([]);
    // The steady recorder's one rate mismatch raises an alert; one 18-bit take and one clip below full scale do not.
    expect(body.recorders.find((r) => r.id === ids.steady)!.alerts.map((a) => a.kind)).toEqual(['rate-mismatch']);
  });

  it('gives one recorder its weekly trends, alerts and latest takes', async () => {
    const response = await as.manager.fetch(`/api/fleet/${ids.drifting}?days=all`);
    expect(response.status).toBe(200);
    const body = await response.json();
    expect(body.weeks.reduce((n: number, w: { takes: number }) => n + w.takes, 0)).toBe(drifting.length);
    expect(body.recentTakes).toHaveLength(drifting.length);
    // Listed worst first, like every list of takes; the newest (a day old) has the risen floor.
    const newest = body.recentTakes.reduce((a: { measuredAt: string }, b: { measuredAt: string }) => (b.measuredAt > a.measuredAt ? b : a));
    expect(newest.noiseFloorDbfs).toBeCloseTo(-88, 3);
    expect(body.alerts.map((a: { kind: string }) => a.kind)).toContain('noise-drift');
  });

  it('answers 400 for an unknown period, 401 signed out, 403 to engineers and producers', async () => {
    const bad = await as.manager.fetch('/api/fleet?days=12');
    expect(bad.status).toBe(400);
    expect((await bad.json()).fields).toEqual({ days: ['Use 7, 30, 90 or all'] });
    expect((await as.anonymous.fetch('/api/fleet')).status).toBe(401);
    for (const person of ['engineer', 'producer'] as const) {
      const response = await as[person].fetch('/api/fleet?days=30');
      expect(response.status).toBe(403);
      expect((await response.json()).error).toBe('forbidden:fleet:view');
      expect((await as[person].fetch(`/api/fleet/${ids.steady}`)).status).toBe(403);
    }
  });

  it('keeps another studio out: 404 for the recorder, and not in their fleet', async () => {
    expect((await as.outsider.fetch(`/api/fleet/${ids.drifting}`)).status).toBe(404);
    const theirs = (await fleet(as.outsider, 'all')).body.recorders.map((r) => r.id);
    expect(theirs).not.toContain(ids.drifting);
    expect(theirs).not.toContain(ids.steady);
  });
});
