import { DataTypes, QueryTypes, type QueryInterface } from 'sequelize';

/**
 * Failed sign-ins kept in the database, so every web instance counts the same attempts; a session
 * version per person, so signing out, deactivation, a password or role change end earlier sessions;
 * and e-mail addresses unique per studio, with at most one active account per address, so inviting
 * an address answers alike whether or not another studio already has it.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('sign_in_failures', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: false },
    address: { type: DataTypes.STRING(64), allowNull: false },
    failedAt: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex('sign_in_failures', ['email', 'address', 'failedAt'], { name: 'sign_in_failures_account' });
  await qi.addIndex('sign_in_failures', ['address', 'failedAt'], { name: 'sign_in_failures_address' });
  await qi.addIndex('sign_in_failures', ['failedAt'], { name: 'sign_in_failures_age' });

  await qi.addColumn('users', 'sessionVersion', { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 });

  await qi.removeIndex('users', 'email');
  await qi.addIndex('users', ['studioId', 'email'], { unique: true, name: 'users_studio_email' });
  // The per-studio index now serves the studio's foreign key; a plain one left by an earlier rollback goes.
  const plainStudioIndex = await qi.sequelize.query("SHOW INDEX FROM users WHERE Key_name = 'studioId'", { type: QueryTypes.SELECT });
  if (plainStudioIndex.length) await qi.removeIndex('users', 'studioId');
  await qi.sequelize.query('ALTER TABLE users ADD COLUMN activeEmail VARCHAR(254) AS (IF(active, email, NULL)) PERSISTENT');
  await qi.addIndex('users', ['activeEmail'], { unique: true, name: 'users_active_email' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  // Addresses unique across all studios again: refuse before changing anything while two studios share one.
  const shared = await qi.sequelize.query('SELECT email FROM users GROUP BY email HAVING COUNT(*) > 1 LIMIT 1', { type: QueryTypes.SELECT });
  if (shared.length) throw new Error('Cannot roll back: an e-mail address belongs to people of several studios; remove the extra invitations first.');
  await qi.removeIndex('users', 'users_active_email');
  await qi.sequelize.query('ALTER TABLE users DROP COLUMN activeEmail');
  await qi.addIndex('users', ['email'], { unique: true, name: 'email' });
  // The studio's foreign key needs an index of its own once the per-studio one is gone.
  await qi.addIndex('users', ['studioId'], { name: 'studioId' });
  await qi.removeIndex('users', 'users_studio_email');
  await qi.sequelize.query('ALTER TABLE users DROP COLUMN sessionVersion');
  await qi.dropTable('sign_in_failures');
}
