import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Per-take flags the fleet statistics read in SQL (filled by the worker from the report, see
 * lib/takes/verdicts.server.ts measuredFields), and the indexes the fleet queries use.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  // Clip events that flat-top below 0 dBFS (a gain stage clipping before the converter).
  await qi.addColumn('takes', 'belowFullScaleClipEvents', { type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
  // The audio was probably recorded at another rate than its header declares (tone or band limit).
  await qi.addColumn('takes', 'rateMismatch', { type: DataTypes.BOOLEAN, allowNull: true });
  // Strong energy up to Nyquist with no filter roll-off.
  await qi.addColumn('takes', 'aliasingRisk', { type: DataTypes.BOOLEAN, allowNull: true });
  // The fleet table and the alerts read one studio's measured takes over a period, then group them
  // by recorder: (studioId, status, measuredAt) lets the period be a range scan, and the trailing
  // columns cover every column those queries read, so MariaDB never touches the rows (whose
  // `report` JSON is large).
  await qi.addIndex('takes', ['studioId', 'status', 'measuredAt', 'recorderId', 'noiseFloorDbfs', 'effectiveBits', 'clipEvents', 'belowFullScaleClipEvents', 'truePeakDbtp', 'integratedLufs', 'rateMismatch', 'aliasingRisk', 'decision'], {
    name: 'takes_fleet_period',
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('takes', 'takes_fleet_period');
  for (const column of ['aliasingRisk', 'rateMismatch', 'belowFullScaleClipEvents']) await qi.removeColumn('takes', column);
}
