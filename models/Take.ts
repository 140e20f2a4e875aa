import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { AnalysisReport } from '@/dsp/types';

export const TAKE_STATUSES = ['queued', 'measuring', 'measured', 'unreadable'] as const;
export type TakeStatus = (typeof TAKE_STATUSES)[number];
export const VERDICTS = ['pass', 'warn', 'fail'] as const;
export type Verdict = (typeof VERDICTS)[number];
export const DECISIONS = ['pending', 'approved', 'rejected'] as const;
export type Decision = (typeof DECISIONS)[number];

/** One uploaded WAV file, its measurement and the producer's decision on it. */
export class Take extends Model<InferAttributes<Take>, InferCreationAttributes<Take>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare sessionId: number;
  declare recorderId: number | null;
  declare uploadedById: number | null;
  declare originalName: string;
  declare storageKey: string;
  declare bytes: number;
  declare sha256: string;
  declare sampleRate: number | null;
  declare bitsPerSample: number | null;
  declare channels: number | null;
  declare encoding: string | null;
  declare durationSec: number | null;
  declare status: CreationOptional<TakeStatus>;
  declare progress: CreationOptional<number>;
  declare error: string | null;
  declare report: AnalysisReport | null;
  declare peaksKey: string | null;
  /** Measured, but the waveform file could not be stored (a storage fault); a worker writes it later. */
  declare waveformMissing: CreationOptional<boolean>;
  // Summary columns, copied out of the report so lists and fleet statistics run in SQL.
  declare effectiveBits: number | null;
  declare truePeakDbtp: number | null;
  declare integratedLufs: number | null;
  declare noiseFloorDbfs: number | null;
  declare clipEvents: number | null;
  declare belowFullScaleClipEvents: CreationOptional<number | null>;
  declare rateMismatch: CreationOptional<boolean | null>;
  declare aliasingRisk: CreationOptional<boolean | null>;
  declare verdict: Verdict | null;
  /** The verdict's one-line reason (the most important warning or failure); null for a pass. */
  declare reason: CreationOptional<string | null>;
  declare decision: CreationOptional<Decision>;
  declare decidedById: number | null;
  declare decidedAt: Date | null;
  declare decisionNote: string | null;
  declare measuredAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTake(sequelize: Sequelize) {
  Take.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      sessionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      recorderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      uploadedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      decidedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      originalName: { type: DataTypes.STRING(512), allowNull: false },
      storageKey: { type: DataTypes.STRING(200), allowNull: false },
      bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      sampleRate: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      bitsPerSample: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
      channels: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
      encoding: { type: DataTypes.STRING(16), allowNull: true },
      durationSec: { type: DataTypes.DOUBLE, allowNull: true },
      status: { type: DataTypes.ENUM(...TAKE_STATUSES), allowNull: false, defaultValue: 'queued' },
      progress: { type: DataTypes.FLOAT, allowNull: false, defaultValue: 0 },
      error: { type: DataTypes.TEXT, allowNull: true },
      report: { type: DataTypes.JSON, allowNull: true },
      peaksKey: { type: DataTypes.STRING(200), allowNull: true },
      waveformMissing: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      effectiveBits: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
      truePeakDbtp: { type: DataTypes.FLOAT, allowNull: true },
      integratedLufs: { type: DataTypes.FLOAT, allowNull: true },
      noiseFloorDbfs: { type: DataTypes.FLOAT, allowNull: true },
      clipEvents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      belowFullScaleClipEvents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      rateMismatch: { type: DataTypes.BOOLEAN, allowNull: true },
      aliasingRisk: { type: DataTypes.BOOLEAN, allowNull: true },
      verdict: { type: DataTypes.ENUM(...VERDICTS), allowNull: true },
      reason: { type: DataTypes.STRING(200), allowNull: true },
      decision: { type: DataTypes.ENUM(...DECISIONS), allowNull: false, defaultValue: 'pending' },
      decidedAt: { type: DataTypes.DATE, allowNull: true },
      decisionNote: { type: DataTypes.TEXT, allowNull: true },
      measuredAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'takes' },
  );
}
