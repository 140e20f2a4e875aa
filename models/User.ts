import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const ROLES = ['engineer', 'producer', 'manager'] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare email: string;
  declare name: string;
  declare passwordHash: string | null;
  declare role: Role;
  declare active: CreationOptional<boolean>;
  /** Raised whenever earlier sessions must end (sign-out, deactivation, new password, new role); a session cookie carries the version it was issued under. */
  declare sessionVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initUser(sequelize: Sequelize) {
  User.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      // Unique per studio; at most one active account per address (the `activeEmail` column, kept by the database).
      email: { type: DataTypes.STRING(254), allowNull: false },
      name: { type: DataTypes.STRING(160), allowNull: false },
      passwordHash: { type: DataTypes.STRING(100), allowNull: true },
      role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      sessionVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'users' },
  );
}
