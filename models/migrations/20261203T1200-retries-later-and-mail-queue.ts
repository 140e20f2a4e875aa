import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Work that failed for a reason outside the file waits before it is tried again:
 * - analysis jobs get a purpose (a full measurement, or only the waveform file of a take whose
 *   waveform could not be stored) and a time before which no worker claims them;
 * - a take can be measured with its waveform file missing;
 * - report e-mails are queued in `mail_deliveries` and sent by the workers, with the time of the next try.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('analysis_jobs', 'purpose', { type: DataTypes.ENUM('measure', 'waveform'), allowNull: false, defaultValue: 'measure' });
  await qi.addColumn('analysis_jobs', 'runAfter', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('takes', 'waveformMissing', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false });
  await qi.changeColumn('mail_deliveries', 'status', { type: DataTypes.ENUM('queued', 'sending', 'sent', 'failed'), allowNull: false, defaultValue: 'queued' });
  await qi.addColumn('mail_deliveries', 'nextAttemptAt', { type: DataTypes.DATE, allowNull: true });
  await qi.addIndex('mail_deliveries', ['status', 'nextAttemptAt'], { name: 'mail_deliveries_queue' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('mail_deliveries', 'mail_deliveries_queue');
  await qi.removeColumn('mail_deliveries', 'nextAttemptAt');
  await qi.sequelize.query(`UPDATE mail_deliveries SET status = 'failed' WHERE status = 'queued'`);
  await qi.changeColumn('mail_deliveries', 'status', { type: DataTypes.ENUM('sending', 'sent', 'failed'), allowNull: false, defaultValue: 'sending' });
  await qi.removeColumn('takes', 'waveformMissing');
  await qi.removeColumn('analysis_jobs', 'runAfter');
  await qi.removeColumn('analysis_jobs', 'purpose');
}
