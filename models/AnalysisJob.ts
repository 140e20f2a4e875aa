import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type JobState = (typeof JOB_STATES)[number];
/** `measure`: the whole measurement; `waveform`: only the waveform file of a measured take whose waveform could not be stored. */
export const JOB_PURPOSES = ['measure', 'waveform'] as const;
export type JobPurpose = (typeof JOB_PURPOSES)[number];

/** A request to measure one take or one converter check, claimed by a worker with SELECT … FOR UPDATE SKIP LOCKED. */
export class AnalysisJob extends Model<InferAttributes<AnalysisJob>, InferCreationAttributes<AnalysisJob>> {
  declare id: CreationOptional<number>;
  /** Exactly one of takeId and converterCheckId is set. */
  declare takeId: number | null;
  declare converterCheckId: CreationOptional<number | null>;
  declare state: CreationOptional<JobState>;
  declare purpose: CreationOptional<JobPurpose>;
  /** No worker claims the job before this time (a retry waiting out its backoff). */
  declare runAfter: CreationOptional<Date | null>;
  declare attempts: CreationOptional<number>;
  declare workerId: string | null;
  declare heartbeatAt: Date | null;
  declare lastError: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initAnalysisJob(sequelize: Sequelize) {
  AnalysisJob.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      takeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      converterCheckId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, defaultValue: null },
      state: { type: DataTypes.ENUM(...JOB_STATES), allowNull: false, defaultValue: 'queued' },
      purpose: { type: DataTypes.ENUM(...JOB_PURPOSES), allowNull: false, defaultValue: 'measure' },
      runAfter: { type: DataTypes.DATE, allowNull: true },
      attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      workerId: { type: DataTypes.STRING(120), allowNull: true },
      heartbeatAt: { type: DataTypes.DATE, allowNull: true },
      lastError: { type: DataTypes.TEXT, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'analysis_jobs' },
  );
}
