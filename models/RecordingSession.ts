import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const SESSION_STATUSES = ['open', 'closed'] as const;
export type SessionStatus = (typeof SESSION_STATUSES)[number];

/** One recording session: the takes captured for a show or client on a day, in a room. */
export class RecordingSession extends Model<InferAttributes<RecordingSession>, InferCreationAttributes<RecordingSession>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare title: string;
  declare client: string | null;
  declare recordedOn: string | null;
  declare room: string | null;
  declare engineerId: number | null;
  declare producerId: number | null;
  declare deliverySpecId: number | null;
  declare notes: string | null;
  declare status: CreationOptional<SessionStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initRecordingSession(sequelize: Sequelize) {
  RecordingSession.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      engineerId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      producerId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      deliverySpecId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      title: { type: DataTypes.STRING(200), allowNull: false },
      client: { type: DataTypes.STRING(200), allowNull: true },
      recordedOn: { type: DataTypes.DATEONLY, allowNull: true },
      room: { type: DataTypes.STRING(120), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      status: { type: DataTypes.ENUM(...SESSION_STATUSES), allowNull: false, defaultValue: 'open' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'recording_sessions' },
  );
}
