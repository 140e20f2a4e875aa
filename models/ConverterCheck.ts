import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ConverterReport } from '@/dsp/converter/report';
import { TAKE_STATUSES, VERDICTS, type TakeStatus, type Verdict } from './Take';

/** A recording of Takeproof's check signal through one recorder, and its measurement. */
export class ConverterCheck extends Model<InferAttributes<ConverterCheck>, InferCreationAttributes<ConverterCheck>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare recorderId: number;
  declare uploadedById: number | null;
  declare originalName: string;
  declare storageKey: string;
  declare bytes: number;
  declare sha256: string;
  /** Same life cycle as a take's: queued → measuring → measured or unreadable. */
  declare status: CreationOptional<TakeStatus>;
  declare progress: CreationOptional<number>;
  declare error: CreationOptional<string | null>;
  declare report: CreationOptional<ConverterReport | null>;
  /** The worst severity of the report's findings (info counts as pass). */
  declare state: CreationOptional<Verdict | null>;
  declare isBaseline: CreationOptional<boolean>;
  declare baselineSetById: CreationOptional<number | null>;
  declare baselineSetAt: CreationOptional<Date | null>;
  declare measuredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initConverterCheck(sequelize: Sequelize) {
  ConverterCheck.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      recorderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      uploadedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      originalName: { type: DataTypes.STRING(512), allowNull: false },
      storageKey: { type: DataTypes.STRING(200), allowNull: false },
      bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      status: { type: DataTypes.ENUM(...TAKE_STATUSES), allowNull: false, defaultValue: 'queued' },
      progress: { type: DataTypes.FLOAT, allowNull: false, defaultValue: 0 },
      error: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
      report: { type: DataTypes.JSON, allowNull: true, defaultValue: null },
      state: { type: DataTypes.ENUM(...VERDICTS), allowNull: true, defaultValue: null },
      isBaseline: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      baselineSetById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, defaultValue: null },
      baselineSetAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      measuredAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'converter_checks' },
  );
}
