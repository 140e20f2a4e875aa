import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One wrong password: which account was tried, from which client address, when. */
export class SignInFailure extends Model<InferAttributes<SignInFailure>, InferCreationAttributes<SignInFailure>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare address: string;
  declare failedAt: Date;
}

export function initSignInFailure(sequelize: Sequelize) {
  SignInFailure.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      address: { type: DataTypes.STRING(64), allowNull: false },
      failedAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { sequelize, tableName: 'sign_in_failures', timestamps: false },
  );
}
