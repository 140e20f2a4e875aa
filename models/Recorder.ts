import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A converter in the studio's fleet: an audio interface, field recorder or stage box. */
export class Recorder extends Model<InferAttributes<Recorder>, InferCreationAttributes<Recorder>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare label: string;
  declare makeModel: string | null;
  declare serial: string | null;
  declare location: string | null;
  declare notes: string | null;
  /** Text matched against a take's bext originator / originator reference to pick this recorder. */
  declare bextMatch: string | null;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initRecorder(sequelize: Sequelize) {
  Recorder.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      label: { type: DataTypes.STRING(120), allowNull: false },
      makeModel: { type: DataTypes.STRING(160), allowNull: true },
      serial: { type: DataTypes.STRING(120), allowNull: true },
      location: { type: DataTypes.STRING(160), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      bextMatch: { type: DataTypes.STRING(160), allowNull: true },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'recorders' },
  );
}
