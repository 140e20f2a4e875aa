import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Who did what to which object, and when. Written by every mutation. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare actorId: number | null;
  /** Dotted verb, e.g. `session.create`, `take.decide`. */
  declare action: string;
  declare subjectType: string;
  declare subjectId: number | null;
  declare detail: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;
}

export function initAuditEvent(sequelize: Sequelize) {
  AuditEvent.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      action: { type: DataTypes.STRING(64), allowNull: false },
      subjectType: { type: DataTypes.STRING(32), allowNull: false },
      subjectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      detail: { type: DataTypes.JSON, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'audit_events', updatedAt: false },
  );
}
