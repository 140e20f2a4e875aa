import 'server-only';
import { QueryTypes } from 'sequelize';
import type { ConverterFinding } from '@/dsp/converter/report';
import { db } from '@/lib/db/connection.server';
import { jsonColumn } from '@/lib/db/jsonColumn';
import type { Verdict } from '@/models/Take';
import { isCheckOverdue } from '@/lib/fleet/alerts';
import { driftFindings, type LastConverterCheck } from './views';

/** A recorder's latest measured converter check, as the fleet table and its alerts read it. */
export interface LatestCheck {
  recorderId: number;
  checkId: number;
  measuredAt: Date;
  state: Verdict | null;
  /** Its findings against the baseline, in plain words. */
  drift: string[];
}

/**
 * The latest measured converter check of each of the studio's recorders (or one recorder). Reads
 * only the findings out of each report, never the whole report.
 */
export async function latestChecks(studioId: number, recorderId?: number): Promise<Map<number, LatestCheck>> {
  const one = recorderId ? ' AND recorderId = :recorderId' : '';
  const rows = await db().query<{ recorderId: number; id: number; measuredAt: Date | string; state: Verdict | null; findings: unknown }>(
    `SELECT c.recorderId, c.id, c.measuredAt, c.state, JSON_EXTRACT(c.report, '$.findings') AS findings
       FROM converter_checks c
       JOIN (SELECT recorderId, MAX(measuredAt) AS lastAt FROM converter_checks
              WHERE studioId = :studioId AND status = 'measured'${one} GROUP BY recorderId) AS m
         ON m.recorderId = c.recorderId AND m.lastAt = c.measuredAt
      WHERE c.studioId = :studioId AND c.status = 'measured'
      ORDER BY c.id`,
    { type: QueryTypes.SELECT, replacements: { studioId, recorderId } },
  );
  const latest = new Map<number, LatestCheck>();
  for (const r of rows) {
    const findings = jsonColumn<ConverterFinding[] | null>(r.findings) ?? [];
    latest.set(Number(r.recorderId), {
      recorderId: Number(r.recorderId),
      checkId: Number(r.id),
      measuredAt: new Date(r.measuredAt),
      state: r.state,
      drift: driftFindings(findings).map((f) => f.message),
    });
  }
  return latest;
}

/** A latest check as the fleet table and the checks overview show it. */
export function toLastCheck(c: LatestCheck, intervalDays: number, now: Date): LastConverterCheck {
  const measuredAt = c.measuredAt.toISOString();
  return { checkId: c.checkId, measuredAt, state: c.state, drifted: c.drift.length > 0, overdue: isCheckOverdue(measuredAt, intervalDays, now) };
}
