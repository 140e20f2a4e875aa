import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Studio extends Model<InferAttributes<Studio>, InferCreationAttributes<Studio>> {
  declare id: CreationOptional<number>;
  declare name: string;
  /** Days after which a recorder's converter check is overdue. */
  declare converterCheckIntervalDays: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initStudio(sequelize: Sequelize) {
  Studio.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(160), allowNull: false },
      converterCheckIntervalDays: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 90 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'studios' },
  );
}
