import { DataTypes, type QueryInterface } from 'sequelize';

const ref = (table: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});
const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('mail_deliveries', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    studioId: ref('studios', false, 'CASCADE'),
    sentById: ref('users', true, 'SET NULL'),
    kind: { type: DataTypes.ENUM('session_report', 'invitation'), allowNull: false },
    subjectType: { type: DataTypes.STRING(32), allowNull: false },
    subjectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    recipients: { type: DataTypes.JSON, allowNull: false },
    subject: { type: DataTypes.STRING(255), allowNull: false },
    payload: { type: DataTypes.JSON, allowNull: true },
    status: { type: DataTypes.ENUM('sending', 'sent', 'failed'), allowNull: false, defaultValue: 'sending' },
    messageId: { type: DataTypes.STRING(255), allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  // A session page lists the reports sent for it, newest first.
  await qi.addIndex('mail_deliveries', ['studioId', 'subjectType', 'subjectId', 'createdAt'], { name: 'mail_subject_time' });

  await qi.createTable('invitations', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    studioId: ref('studios', false, 'CASCADE'),
    userId: ref('users', false, 'CASCADE'),
    invitedById: ref('users', true, 'SET NULL'),
    tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('invitations', ['userId'], { name: 'invitations_user' });
  // The audit log filters a studio's events by action and by person.
  await qi.addIndex('audit_events', ['studioId', 'action', 'createdAt'], { name: 'audit_studio_action' });
  await qi.addIndex('audit_events', ['studioId', 'actorId', 'createdAt'], { name: 'audit_studio_actor' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('audit_events', 'audit_studio_actor');
  await qi.removeIndex('audit_events', 'audit_studio_action');
  await qi.dropTable('invitations');
  await qi.dropTable('mail_deliveries');
}
