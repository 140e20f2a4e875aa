import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A time-stamped remark on a take ("door slam at 2:14"), shown on its waveform. */
export class TakeComment extends Model<InferAttributes<TakeComment>, InferCreationAttributes<TakeComment>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare takeId: number;
  declare authorId: number | null;
  /** Seconds from the first sample of the take. */
  declare atSec: number;
  declare body: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTakeComment(sequelize: Sequelize) {
  TakeComment.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      takeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      authorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      atSec: { type: DataTypes.DOUBLE, allowNull: false },
      body: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'take_comments' },
  );
}
