import { DataTypes, type QueryInterface } from 'sequelize';

/** A manager can send an active person a link to choose a new password: links get a purpose, e-mails a kind. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('invitations', 'purpose', { type: DataTypes.ENUM('invite', 'reset'), allowNull: false, defaultValue: 'invite' });
  await qi.changeColumn('mail_deliveries', 'kind', { type: DataTypes.ENUM('session_report', 'invitation', 'password_reset'), allowNull: false });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query("DELETE FROM mail_deliveries WHERE kind = 'password_reset'");
  await qi.changeColumn('mail_deliveries', 'kind', { type: DataTypes.ENUM('session_report', 'invitation'), allowNull: false });
  await qi.removeColumn('invitations', 'purpose');
}
