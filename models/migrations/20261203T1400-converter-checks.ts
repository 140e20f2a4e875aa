import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const ref = (table: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});

/**
 * Converter checks: a recording of Takeproof's check signal per recorder, measured by the same
 * job queue as takes; thresholds per recorder model; a check interval per studio.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('converter_checks', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    studioId: ref('studios', false, 'CASCADE'),
    recorderId: ref('recorders', false, 'CASCADE'),
    uploadedById: ref('users', true, 'SET NULL'),
    originalName: { type: DataTypes.STRING(512), allowNull: false },
    storageKey: { type: DataTypes.STRING(200), allowNull: false, unique: true },
    bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
    sha256: { type: DataTypes.CHAR(64), allowNull: false },
    status: { type: DataTypes.ENUM('queued', 'measuring', 'measured', 'unreadable'), allowNull: false, defaultValue: 'queued' },
    progress: { type: DataTypes.FLOAT, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.TEXT, allowNull: true },
    report: { type: DataTypes.JSON, allowNull: true },
    // The judgement of the report against the thresholds and the baseline at the time it was judged.
    state: { type: DataTypes.ENUM('pass', 'warn', 'fail'), allowNull: true },
    // The check later checks of this recorder are compared with (at most one per recorder).
    isBaseline: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    baselineSetById: ref('users', true, 'SET NULL'),
    baselineSetAt: { type: DataTypes.DATE, allowNull: true },
    measuredAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  // A recorder's history, newest first; the fleet's last check per recorder.
  await qi.addIndex('converter_checks', ['studioId', 'recorderId', 'measuredAt'], { name: 'converter_checks_history' });

  await qi.createTable('converter_thresholds', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    studioId: ref('studios', false, 'CASCADE'),
    // A recorder model as the recorders name it (their make and model text).
    makeModel: { type: DataTypes.STRING(160), allowNull: false },
    thresholds: { type: DataTypes.JSON, allowNull: false },
    updatedById: ref('users', true, 'SET NULL'),
    ...timestamps,
  });
  await qi.addIndex('converter_thresholds', ['studioId', 'makeModel'], { unique: true, name: 'converter_thresholds_model' });

  await qi.addColumn('studios', 'converterCheckIntervalDays', { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 90 });

  // A job measures either a take or a converter check.
  await qi.sequelize.query('ALTER TABLE analysis_jobs MODIFY takeId INT UNSIGNED NULL');
  await qi.addColumn('analysis_jobs', 'converterCheckId', { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, unique: true });
  await qi.addConstraint('analysis_jobs', { fields: ['converterCheckId'], type: 'foreign key', name: 'analysis_jobs_converter_check', references: { table: 'converter_checks', field: 'id' }, onDelete: 'CASCADE', onUpdate: 'CASCADE' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.bulkDelete('analysis_jobs', { takeId: null });
  await qi.removeConstraint('analysis_jobs', 'analysis_jobs_converter_check');
  // Plain SQL: Sequelize's removeColumn fails against the MariaDB driver here.
  await qi.sequelize.query('ALTER TABLE analysis_jobs DROP COLUMN converterCheckId');
  await qi.sequelize.query('ALTER TABLE analysis_jobs MODIFY takeId INT UNSIGNED NOT NULL');
  await qi.sequelize.query('ALTER TABLE studios DROP COLUMN converterCheckIntervalDays');
  await qi.dropTable('converter_thresholds');
  await qi.dropTable('converter_checks');
}
