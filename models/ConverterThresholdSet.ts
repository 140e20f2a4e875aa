import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ConverterThresholds } from '@/dsp/converter/thresholds';

/** The limits a studio judges converter checks of one recorder model against (its recorders' make-and-model text). */
export class ConverterThresholdSet extends Model<InferAttributes<ConverterThresholdSet>, InferCreationAttributes<ConverterThresholdSet>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare makeModel: string;
  declare thresholds: ConverterThresholds;
  declare updatedById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initConverterThresholdSet(sequelize: Sequelize) {
  ConverterThresholdSet.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      makeModel: { type: DataTypes.STRING(160), allowNull: false },
      thresholds: { type: DataTypes.JSON, allowNull: false },
      updatedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'converter_thresholds' },
  );
}
