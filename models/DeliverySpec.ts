import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { DeliverySpec as SpecThresholds } from '@/dsp/spec';

export type Thresholds = Omit<SpecThresholds, 'name'>;

/** A studio's named set of delivery thresholds (the measures are defined in dsp/spec.ts). */
export class DeliverySpec extends Model<InferAttributes<DeliverySpec>, InferCreationAttributes<DeliverySpec>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare name: string;
  declare description: string | null;
  declare thresholds: Thresholds;
  /** Set when a manager archives the spec: no longer offered for new sessions, still used by old ones. */
  declare archivedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initDeliverySpec(sequelize: Sequelize) {
  DeliverySpec.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: true },
      thresholds: { type: DataTypes.JSON, allowNull: false },
      archivedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'delivery_specs' },
  );
}
