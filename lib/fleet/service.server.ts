import 'server-only';
import { worstFirst } from '@/lib/takes/order';
import { QueryTypes } from 'sequelize';
import { DEFAULT_SPEC } from '@/dsp/spec';
import { DeliverySpec, Recorder } from '@/models';
import { db } from '@/lib/db/connection.server';
import { DEFAULT_ALERT_SETTINGS, converterAlerts, recorderAlerts, type AlertSettings, type FleetAlert, type RecorderHealth } from './alerts';
import { latestChecks, toLastCheck } from '@/lib/converterChecks/fleet.server';
import { converterCheckIntervalDays } from '@/lib/converterChecks/service.server';
import { findRecorder, getRecorder } from '@/lib/recorders/service.server';
import { RECENT_TAKES, type FleetPeriod, type FleetRow, type RecentTake, type RecorderTrendWeek, type WeekPoint } from './views';
import type { Actor } from '@/lib/auth/views';
import { jsonColumn } from '@/lib/db/jsonColumn';
import type { Thresholds } from '@/models/DeliverySpec';

export type { FleetPeriod, FleetRow, RecentTake, RecorderTrendWeek, WeekPoint } from './views';

const DAY_MS = 86_400_000;

/**
 * Every statistic here runs in SQL over the takes' summary columns (never over the reports),
 * reading the `takes_fleet_period` index. Medians use MariaDB's MEDIAN() window function,
 * which skips NULLs; a grouped query then keeps one value per recorder.
 */
function since(period: FleetPeriod, now: Date): Date | null {
  return period === 'all' ? null : new Date(now.getTime() - period * DAY_MS);
}

const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));
const int = (v: unknown): number => Number(v ?? 0);

// Monday of the take's week (UTC), as text.
const WEEK = `DATE_FORMAT(DATE_SUB(DATE(measuredAt), INTERVAL WEEKDAY(measuredAt) DAY), '%Y-%m-%d')`;

function periodWhere(from: Date | null, recorderId?: number) {
  return `studioId = :studioId AND status = 'measured' AND recorderId IS NOT NULL AND measuredAt <= :now${from ? ' AND measuredAt >= :from' : ''}${recorderId ? ' AND recorderId = :recorderId' : ''}`;
}

interface AggregateRow {
  recorderId: number;
  takes: unknown;
  medianFloorDbfs: unknown;
  clippedTakes: unknown;
  minEffectiveBits: unknown;
  overTakes: unknown;
  rateMismatchTakes: unknown;
  aliasingTakes: unknown;
  rejected: unknown;
  decided: unknown;
}

async function periodAggregates(studioId: number, from: Date | null, now: Date, recorderId?: number) {
  const rows = await db().query<AggregateRow>(
    `SELECT recorderId,
            COUNT(*) AS takes,
            MAX(medianFloor) AS medianFloorDbfs,
            SUM(clipEvents > 0) AS clippedTakes,
            MIN(effectiveBits) AS minEffectiveBits,
            SUM(truePeakDbtp > 0) AS overTakes,
            SUM(rateMismatch = 1) AS rateMismatchTakes,
            SUM(aliasingRisk = 1) AS aliasingTakes,
            SUM(decision = 'rejected') AS rejected,
            SUM(decision <> 'pending') AS decided
       FROM (SELECT recorderId, clipEvents, effectiveBits, truePeakDbtp, rateMismatch, aliasingRisk, decision,
                    MEDIAN(noiseFloorDbfs) OVER (PARTITION BY recorderId) AS medianFloor
               FROM takes
              WHERE ${periodWhere(from, recorderId)}) AS t
      GROUP BY recorderId`,
    { type: QueryTypes.SELECT, replacements: { studioId, now, from, recorderId } },
  );
  return new Map(rows.map((r) => [Number(r.recorderId), r]));
}

async function weeklyFloors(studioId: number, from: Date | null, now: Date): Promise<Map<number, WeekPoint[]>> {
  const rows = await db().query<{ recorderId: number; weekStart: string; takes: unknown; medianFloorDbfs: unknown }>(
    `SELECT recorderId, weekStart, COUNT(*) AS takes, MAX(medianFloor) AS medianFloorDbfs
       FROM (SELECT recorderId, weekStart, MEDIAN(noiseFloorDbfs) OVER (PARTITION BY recorderId, weekStart) AS medianFloor
               FROM (SELECT recorderId, noiseFloorDbfs, ${WEEK} AS weekStart FROM takes WHERE ${periodWhere(from)}) AS w) AS t
      GROUP BY recorderId, weekStart
      ORDER BY recorderId, weekStart`,
    { type: QueryTypes.SELECT, replacements: { studioId, now, from } },
  );
  const byRecorder = new Map<number, WeekPoint[]>();
  for (const r of rows) {
    const list = byRecorder.get(Number(r.recorderId)) ?? [];
    list.push({ weekStart: r.weekStart, takes: int(r.takes), medianFloorDbfs: num(r.medianFloorDbfs) });
    byRecorder.set(Number(r.recorderId), list);
  }
  return byRecorder;
}

/** The effective-bits minimum alerts compare with: the strictest of the studio's specs (Takeproof's default when it has none). */
export async function studioMinEffectiveBits(studioId: number): Promise<number> {
  const specs = await DeliverySpec.findAll({ where: { studioId }, attributes: ['thresholds'] });
  const values = specs
    .map((s) => jsonColumn<Partial<Thresholds> | null>(s.thresholds)?.minEffectiveBits)
    .filter((v): v is number => typeof v === 'number');
  return values.length ? Math.max(...values) : DEFAULT_SPEC.minEffectiveBits;
}

interface HealthRow {
  recorderId: number;
  baselineTakes: unknown;
  recentTakes: unknown;
  baselineFloor: unknown;
  recentFloor: unknown;
  recentMinBits: unknown;
  lowBitsTakes: unknown;
  belowFsTakes: unknown;
  rateMismatchTakes: unknown;
}

/** Baseline-versus-recent aggregates per recorder, in one grouped query (baseline: the `baselineDays` before the recent window). */
export async function recorderHealth(studioId: number, now = new Date(), settings: AlertSettings = DEFAULT_ALERT_SETTINGS, recorderId?: number): Promise<Map<number, Omit<RecorderHealth, 'label'>>> {
  const minBits = await studioMinEffectiveBits(studioId);
  const recentFrom = new Date(now.getTime() - settings.recentDays * DAY_MS);
  const baselineFrom = new Date(recentFrom.getTime() - settings.baselineDays * DAY_MS);
  const rows = await db().query<HealthRow>(
    `SELECT recorderId,
            SUM(recent = 0) AS baselineTakes,
            SUM(recent = 1) AS recentTakes,
            MAX(CASE WHEN recent = 0 THEN medianFloor END) AS baselineFloor,
            MAX(CASE WHEN recent = 1 THEN medianFloor END) AS recentFloor,
            MIN(CASE WHEN recent = 1 THEN effectiveBits END) AS recentMinBits,
            SUM(recent = 1 AND effectiveBits < :minBits) AS lowBitsTakes,
            SUM(recent = 1 AND belowFullScaleClipEvents > 0) AS belowFsTakes,
            SUM(recent = 1 AND rateMismatch = 1) AS rateMismatchTakes
       FROM (SELECT recorderId, effectiveBits, belowFullScaleClipEvents, rateMismatch, recent,
                    MEDIAN(noiseFloorDbfs) OVER (PARTITION BY recorderId, recent) AS medianFloor
               FROM (SELECT recorderId, noiseFloorDbfs, effectiveBits, belowFullScaleClipEvents, rateMismatch,
                            measuredAt >= :recentFrom AS recent
                       FROM takes WHERE ${periodWhere(baselineFrom, recorderId)}) AS s) AS t
      GROUP BY recorderId`,
    { type: QueryTypes.SELECT, replacements: { studioId, now, from: baselineFrom, recentFrom, minBits, recorderId } },
  );
  return new Map(
    rows.map((r) => [
      Number(r.recorderId),
      {
        recorderId: Number(r.recorderId),
        baseline: { takes: int(r.baselineTakes), medianFloorDbfs: num(r.baselineFloor) },
        recent: {
          takes: int(r.recentTakes),
          medianFloorDbfs: num(r.recentFloor),
          minEffectiveBits: num(r.recentMinBits),
          lowBitsTakes: int(r.lowBitsTakes),
          belowFullScaleClipTakes: int(r.belowFsTakes),
          rateMismatchTakes: int(r.rateMismatchTakes),
        },
        specMinEffectiveBits: minBits,
      },
    ]),
  );
}

/** Alerts of the studio's active recorders (or one recorder), most serious first. */
export async function fleetAlerts(actor: Actor, options: { now?: Date; recorderId?: number } = {}): Promise<FleetAlert[]> {
  db();
  const recorders = await Recorder.findAll({
    where: { studioId: actor.studioId, active: true, ...(options.recorderId ? { id: options.recorderId } : {}) },
    attributes: ['id', 'label'],
  });
  const now = options.now ?? new Date();
  const [health, checks, intervalDays] = await Promise.all([
    recorderHealth(actor.studioId, now, DEFAULT_ALERT_SETTINGS, options.recorderId),
    latestChecks(actor.studioId, options.recorderId),
    converterCheckIntervalDays(actor.studioId),
  ]);
  const alerts = recorders.flatMap((r) => {
    const h = health.get(r.id);
    const latest = checks.get(r.id);
    return [
      ...(h ? recorderAlerts({ ...h, label: r.label }) : []),
      ...converterAlerts({ recorderId: r.id, label: r.label, intervalDays, latest: latest ? { checkId: latest.checkId, measuredAt: latest.measuredAt.toISOString(), drift: latest.drift } : null }, now),
    ];
  });
  return alerts.sort((a, b) => (a.severity === b.severity ? a.label.localeCompare(b.label) : a.severity === 'fail' ? -1 : 1));
}

/** The fleet table: one row per recorder (active ones, and retired ones with takes in the period). */
export async function fleetOverview(actor: Actor, period: FleetPeriod, now = new Date()): Promise<{ period: FleetPeriod; from: string | null; recorders: FleetRow[] }> {
  db();
  const from = since(period, now);
  const [recorders, aggregates, weeks, alerts, checks, intervalDays] = await Promise.all([
    Recorder.findAll({ where: { studioId: actor.studioId }, attributes: ['id', 'label', 'makeModel', 'location', 'active'], order: [['label', 'ASC']] }),
    periodAggregates(actor.studioId, from, now),
    weeklyFloors(actor.studioId, from, now),
    fleetAlerts(actor, { now }),
    latestChecks(actor.studioId),
    converterCheckIntervalDays(actor.studioId),
  ]);
  const rows: FleetRow[] = [];
  for (const r of recorders) {
    const a = aggregates.get(r.id);
    if (!r.active && !a) continue;
    const takes = int(a?.takes);
    const decided = int(a?.decided);
    const check = checks.get(r.id);
    rows.push({
      id: r.id,
      label: r.label,
      makeModel: r.makeModel,
      location: r.location,
      active: !!r.active,
      takes,
      medianFloorDbfs: num(a?.medianFloorDbfs),
      clippedShare: takes ? int(a?.clippedTakes) / takes : null,
      minEffectiveBits: num(a?.minEffectiveBits),
      overTakes: int(a?.overTakes),
      rateMismatchTakes: int(a?.rateMismatchTakes),
      aliasingTakes: int(a?.aliasingTakes),
      rejectRate: decided ? int(a?.rejected) / decided : null,
      decided,
      weeks: weeks.get(r.id) ?? [],
      alerts: alerts.filter((x) => x.recorderId === r.id),
      converterCheck: check ? toLastCheck(check, intervalDays, now) : null,
    });
  }
  return { period, from: from?.toISOString() ?? null, recorders: rows };
}


/** One recorder's weekly trends: noise floor, effective bits and the spread of integrated loudness. */
export async function recorderTrends(actor: Actor, recorderId: number, period: FleetPeriod, now = new Date()): Promise<RecorderTrendWeek[]> {
  await findRecorder(actor, recorderId);
  const from = since(period, now);
  const part = 'OVER (PARTITION BY weekStart)';
  const rows = await db().query<Record<string, unknown>>(
    `SELECT weekStart, COUNT(*) AS takes, MAX(mFloor) AS medianFloorDbfs, MIN(effectiveBits) AS minEffectiveBits, MAX(mBits) AS medianEffectiveBits,
            MAX(p10) AS p10Lufs, MAX(mLufs) AS medianLufs, MAX(p90) AS p90Lufs
       FROM (SELECT weekStart, effectiveBits,
                    MEDIAN(noiseFloorDbfs) ${part} AS mFloor,
                    MEDIAN(effectiveBits) ${part} AS mBits,
                    PERCENTILE_CONT(0.1) WITHIN GROUP (ORDER BY integratedLufs) ${part} AS p10,
                    MEDIAN(integratedLufs) ${part} AS mLufs,
                    PERCENTILE_CONT(0.9) WITHIN GROUP (ORDER BY integratedLufs) ${part} AS p90
               FROM (SELECT noiseFloorDbfs, effectiveBits, integratedLufs, ${WEEK} AS weekStart FROM takes WHERE ${periodWhere(from, recorderId)}) AS w) AS t
      GROUP BY weekStart
      ORDER BY weekStart`,
    { type: QueryTypes.SELECT, replacements: { studioId: actor.studioId, now, from, recorderId } },
  );
  return rows.map((r) => ({
    weekStart: String(r.weekStart),
    takes: int(r.takes),
    medianFloorDbfs: num(r.medianFloorDbfs),
    minEffectiveBits: num(r.minEffectiveBits),
    medianEffectiveBits: num(r.medianEffectiveBits),
    p10Lufs: num(r.p10Lufs),
    medianLufs: num(r.medianLufs),
    p90Lufs: num(r.p90Lufs),
  }));
}

/** A recorder's latest measured takes (summary columns only), worst verdict first. */
export async function recorderRecentTakes(actor: Actor, recorderId: number, limit = RECENT_TAKES): Promise<RecentTake[]> {
  await findRecorder(actor, recorderId);
  const rows = await db().query<Record<string, unknown>>(
    `SELECT t.id, t.originalName, t.measuredAt, t.noiseFloorDbfs, t.effectiveBits, t.integratedLufs, t.truePeakDbtp, t.clipEvents,
            t.belowFullScaleClipEvents, t.rateMismatch, t.verdict, t.reason, t.decision, s.title AS sessionTitle
       FROM takes t JOIN recording_sessions s ON s.id = t.sessionId
      WHERE t.studioId = :studioId AND t.recorderId = :recorderId AND t.status = 'measured'
      ORDER BY t.measuredAt DESC, t.id DESC
      LIMIT :limit`,
    { type: QueryTypes.SELECT, replacements: { studioId: actor.studioId, recorderId, limit } },
  );
  const takes: RecentTake[] = rows.map((r) => ({
    id: Number(r.id),
    originalName: String(r.originalName),
    sessionTitle: String(r.sessionTitle),
    measuredAt: new Date(r.measuredAt as string).toISOString(),
    noiseFloorDbfs: num(r.noiseFloorDbfs),
    effectiveBits: num(r.effectiveBits),
    integratedLufs: num(r.integratedLufs),
    truePeakDbtp: num(r.truePeakDbtp),
    clipEvents: num(r.clipEvents),
    belowFullScaleClipEvents: num(r.belowFullScaleClipEvents),
    rateMismatch: r.rateMismatch == null ? null : Boolean(Number(r.rateMismatch)),
    verdict: (r.verdict as RecentTake['verdict']) ?? null,
    reason: r.verdict === 'pass' || r.reason == null ? null : String(r.reason),
    decision: r.decision as RecentTake['decision'],
  }));
  return takes.sort(worstFirst);
}

/** Everything the recorder page of the fleet shows: the recorder, its weekly trends, latest takes and open alerts. */
export async function recorderFleetDetail(actor: Actor, recorderId: number, period: FleetPeriod) {
  const recorder = await getRecorder(actor, recorderId);
  const [weeks, recentTakes, alerts] = await Promise.all([recorderTrends(actor, recorderId, period), recorderRecentTakes(actor, recorderId), fleetAlerts(actor, { recorderId })]);
  return { recorder, period, weeks, recentTakes, alerts };
}
