import 'server-only';
import type { Transaction } from 'sequelize';
import { judgeConverterCheck } from '@/dsp/converter/judge';
import type { ConverterFinding, ConverterReport } from '@/dsp/converter/report';
import { DEFAULT_CONVERTER_THRESHOLDS, converterThresholdsSchema, type ConverterThresholds } from '@/dsp/converter/thresholds';
import { ConverterCheck, ConverterThresholdSet, Recorder } from '@/models';
import { jsonColumn } from '@/lib/db/jsonColumn';
import { isAcceptable, stateOfFindings } from './views';

/**
 * Judging stored converter checks: the thresholds of the recorder's model, its baseline (at most
 * one check per recorder), and re-judging every check when either changes. The engine's pure
 * `judgeConverterCheck` makes every finding; this module only chooses what it is judged against.
 */

const BASELINE_ITSELF: ConverterFinding = {
  check: 'baseline',
  severity: 'info',
  basis: 'baseline',
  message: 'This check is the recorder’s baseline: later checks of this recorder are compared with it.',
};

/** The thresholds a recorder model is judged against: the studio's own for that model, else Takeproof's defaults. */
export async function thresholdsFor(studioId: number, makeModel: string | null, transaction?: Transaction): Promise<{ thresholds: ConverterThresholds; isDefault: boolean }> {
  const row = makeModel ? await ConverterThresholdSet.findOne({ where: { studioId, makeModel }, transaction }) : null;
  if (!row) return { thresholds: DEFAULT_CONVERTER_THRESHOLDS, isDefault: true };
  // Stored sets were validated when saved; fields added to the schema later take their defaults.
  return { thresholds: converterThresholdsSchema.parse({ ...DEFAULT_CONVERTER_THRESHOLDS, ...jsonColumn<Partial<ConverterThresholds>>(row.thresholds) }), isDefault: false };
}

/** A check's findings: against the baseline's report, or, for the baseline itself, against the thresholds alone. */
export function judgeAgainst(report: ConverterReport, baseline: ConverterReport | null, isBaseline: boolean, thresholds: ConverterThresholds): ConverterFinding[] {
  if (!isBaseline) return judgeConverterCheck(report, baseline, thresholds);
  return [...judgeConverterCheck(report, null, thresholds).filter((f) => f.basis !== 'baseline'), BASELINE_ITSELF];
}

/**
 * Stores a fresh measurement: judged against the recorder's baseline and its model's thresholds;
 * the recorder's first acceptable check becomes its baseline. The recorder row is locked so two
 * workers finishing at once cannot both make a baseline.
 */
export async function recordMeasuredCheck(checkId: number, report: ConverterReport, transaction: Transaction, measuredAt = new Date()): Promise<void> {
  const check = await ConverterCheck.findByPk(checkId, { attributes: { exclude: ['report'] }, transaction });
  if (!check) return;
  const recorder = await Recorder.findByPk(check.recorderId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!recorder) return;
  const { thresholds } = await thresholdsFor(check.studioId, recorder.makeModel, transaction);
  const baseline = await ConverterCheck.findOne({ where: { recorderId: recorder.id, isBaseline: true }, transaction });
  let findings = judgeAgainst(report, baseline ? jsonColumn<ConverterReport>(baseline.report) : null, false, thresholds);
  const becomesBaseline = !baseline && isAcceptable(findings);
  if (becomesBaseline) findings = judgeAgainst(report, null, true, thresholds);
  await check.update(
    {
      report: { ...report, findings },
      state: stateOfFindings(findings),
      status: 'measured',
      progress: 100,
      error: null,
      measuredAt,
      ...(becomesBaseline ? { isBaseline: true, baselineSetById: null, baselineSetAt: measuredAt } : {}),
    },
    { transaction },
  );
}

/** Judges every measured check of a recorder again (after a new baseline or new thresholds). */
export async function rejudgeRecorder(recorderId: number, transaction: Transaction): Promise<void> {
  const recorder = await Recorder.findByPk(recorderId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!recorder) return;
  const { thresholds } = await thresholdsFor(recorder.studioId, recorder.makeModel, transaction);
  const checks = await ConverterCheck.findAll({ where: { recorderId, status: 'measured' }, transaction });
  const baseline = checks.find((c) => c.isBaseline);
  const baselineReport = baseline ? jsonColumn<ConverterReport>(baseline.report) : null;
  for (const check of checks) {
    const report = jsonColumn<ConverterReport>(check.report);
    const findings = judgeAgainst(report, baselineReport, check.isBaseline, thresholds);
    await check.update({ report: { ...report, findings }, state: stateOfFindings(findings) }, { transaction });
  }
}
