import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const LINK_PURPOSES = ['invite', 'reset'] as const;
export type LinkPurpose = (typeof LINK_PURPOSES)[number];

/**
 * A link that lets an invited person set their password once, or an active person whose manager
 * sent a reset choose a new one. Only the SHA-256 of the
 * token is stored; the token itself exists only in the e-mail.
 */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare userId: number;
  declare invitedById: number | null;
  declare tokenHash: string;
  declare purpose: CreationOptional<LinkPurpose>;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initInvitation(sequelize: Sequelize) {
  Invitation.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      invitedById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      purpose: { type: DataTypes.ENUM(...LINK_PURPOSES), allowNull: false, defaultValue: 'invite' },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'invitations' },
  );
}
