import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const MAIL_KINDS = ['session_report', 'invitation', 'password_reset'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];
export const MAIL_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/** One attempt history of one outgoing e-mail: who sent what to whom, and how it went. */
export class MailDelivery extends Model<InferAttributes<MailDelivery>, InferCreationAttributes<MailDelivery>> {
  declare id: CreationOptional<number>;
  declare studioId: number;
  declare sentById: number | null;
  declare kind: MailKind;
  /** The object the mail is about, e.g. `session` 12 or `user` 7. */
  declare subjectType: string;
  declare subjectId: number | null;
  declare recipients: string[];
  declare subject: string;
  /** What is needed to render the mail again on retry (never a secret). */
  declare payload: Record<string, unknown> | null;
  declare status: CreationOptional<MailStatus>;
  declare messageId: string | null;
  declare error: string | null;
  declare attempts: CreationOptional<number>;
  declare sentAt: Date | null;
  /** When a worker next tries to send a queued e-mail (null: at once). */
  declare nextAttemptAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initMailDelivery(sequelize: Sequelize) {
  MailDelivery.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      sentById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      kind: { type: DataTypes.ENUM(...MAIL_KINDS), allowNull: false },
      subjectType: { type: DataTypes.STRING(32), allowNull: false },
      subjectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      recipients: { type: DataTypes.JSON, allowNull: false },
      subject: { type: DataTypes.STRING(255), allowNull: false },
      payload: { type: DataTypes.JSON, allowNull: true },
      status: { type: DataTypes.ENUM(...MAIL_STATUSES), allowNull: false, defaultValue: 'queued' },
      messageId: { type: DataTypes.STRING(255), allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
      attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      sentAt: { type: DataTypes.DATE, allowNull: true },
      nextAttemptAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'mail_deliveries' },
  );
}
