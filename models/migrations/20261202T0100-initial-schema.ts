import { DataTypes, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false };
const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const ref = (table: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT') => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('studios', { id, name: { type: DataTypes.STRING(160), allowNull: false }, ...timestamps });

  await qi.createTable('users', {
    id,
    studioId: ref('studios', false, 'CASCADE'),
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(160), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: true },
    role: { type: DataTypes.ENUM('engineer', 'producer', 'manager'), allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  });

  await qi.createTable('recorders', {
    id,
    studioId: ref('studios', false, 'CASCADE'),
    label: { type: DataTypes.STRING(120), allowNull: false },
    makeModel: { type: DataTypes.STRING(160), allowNull: true },
    serial: { type: DataTypes.STRING(120), allowNull: true },
    location: { type: DataTypes.STRING(160), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    bextMatch: { type: DataTypes.STRING(160), allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  });

  await qi.createTable('delivery_specs', {
    id,
    studioId: ref('studios', false, 'CASCADE'),
    name: { type: DataTypes.STRING(120), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: true },
    thresholds: { type: DataTypes.JSON, allowNull: false },
    ...timestamps,
  });

  await qi.createTable('recording_sessions', {
    id,
    studioId: ref('studios', false, 'CASCADE'),
    title: { type: DataTypes.STRING(200), allowNull: false },
    client: { type: DataTypes.STRING(200), allowNull: true },
    recordedOn: { type: DataTypes.DATEONLY, allowNull: true },
    room: { type: DataTypes.STRING(120), allowNull: true },
    engineerId: ref('users', true, 'SET NULL'),
    producerId: ref('users', true, 'SET NULL'),
    deliverySpecId: ref('delivery_specs', true, 'SET NULL'),
    notes: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.ENUM('open', 'closed'), allowNull: false, defaultValue: 'open' },
    ...timestamps,
  });
  // The sessions list is always read per studio, newest first.
  await qi.addIndex('recording_sessions', ['studioId', 'recordedOn']);

  await qi.createTable('takes', {
    id,
    studioId: ref('studios', false, 'CASCADE'),
    sessionId: ref('recording_sessions', false, 'CASCADE'),
    recorderId: ref('recorders', true, 'SET NULL'),
    uploadedById: ref('users', true, 'SET NULL'),
    originalName: { type: DataTypes.STRING(512), allowNull: false },
    storageKey: { type: DataTypes.STRING(200), allowNull: false, unique: true },
    bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
    sha256: { type: DataTypes.CHAR(64), allowNull: false },
    sampleRate: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    bitsPerSample: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
    channels: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
    encoding: { type: DataTypes.STRING(16), allowNull: true },
    durationSec: { type: DataTypes.DOUBLE, allowNull: true },
    status: { type: DataTypes.ENUM('queued', 'measuring', 'measured', 'unreadable'), allowNull: false, defaultValue: 'queued' },
    progress: { type: DataTypes.FLOAT, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.TEXT, allowNull: true },
    report: { type: DataTypes.JSON, allowNull: true },
    peaksKey: { type: DataTypes.STRING(200), allowNull: true },
    effectiveBits: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
    truePeakDbtp: { type: DataTypes.FLOAT, allowNull: true },
    integratedLufs: { type: DataTypes.FLOAT, allowNull: true },
    noiseFloorDbfs: { type: DataTypes.FLOAT, allowNull: true },
    clipEvents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    verdict: { type: DataTypes.ENUM('pass', 'warn', 'fail'), allowNull: true },
    decision: { type: DataTypes.ENUM('pending', 'approved', 'rejected'), allowNull: false, defaultValue: 'pending' },
    decidedById: ref('users', true, 'SET NULL'),
    decidedAt: { type: DataTypes.DATE, allowNull: true },
    decisionNote: { type: DataTypes.TEXT, allowNull: true },
    measuredAt: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  // The same file may not be uploaded twice into one session.
  await qi.addIndex('takes', ['sessionId', 'sha256'], { unique: true, name: 'takes_session_sha256' });
  // Fleet statistics group a studio's takes by recorder over a period.
  await qi.addIndex('takes', ['studioId', 'recorderId', 'measuredAt'], { name: 'takes_fleet' });
  // Review queues filter a studio's takes by decision.
  await qi.addIndex('takes', ['studioId', 'decision'], { name: 'takes_review_queue' });

  await qi.createTable('audit_events', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    studioId: ref('studios', false, 'CASCADE'),
    actorId: ref('users', true, 'SET NULL'),
    action: { type: DataTypes.STRING(64), allowNull: false },
    subjectType: { type: DataTypes.STRING(32), allowNull: false },
    subjectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    detail: { type: DataTypes.JSON, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  // The audit log page lists a studio's events newest first.
  await qi.addIndex('audit_events', ['studioId', 'createdAt'], { name: 'audit_studio_time' });

  await qi.createTable('analysis_jobs', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    takeId: { ...ref('takes', false, 'CASCADE'), unique: true },
    state: { type: DataTypes.ENUM('queued', 'running', 'done', 'failed'), allowNull: false, defaultValue: 'queued' },
    attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    workerId: { type: DataTypes.STRING(120), allowNull: true },
    heartbeatAt: { type: DataTypes.DATE, allowNull: true },
    lastError: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  // Workers claim the oldest queued job, and look for running jobs with a stale heartbeat.
  await qi.addIndex('analysis_jobs', ['state', 'heartbeatAt'], { name: 'jobs_claim' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const table of ['analysis_jobs', 'audit_events', 'takes', 'recording_sessions', 'delivery_specs', 'recorders', 'users', 'studios']) {
    await qi.dropTable(table);
  }
}
