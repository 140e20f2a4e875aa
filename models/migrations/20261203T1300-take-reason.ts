import { DataTypes, QueryTypes, type QueryInterface } from 'sequelize';
import { reasonOf } from '@/dsp/findings';
import type { Finding } from '@/dsp/types';

/**
 * The one-line reason for a take's verdict (the most important warning or failure), stored beside
 * the verdict so lists, reports and e-mails show why without reading the report JSON. Null for a
 * pass. Existing measured takes get theirs from the findings already in their report.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('takes', 'reason', { type: DataTypes.STRING(200), allowNull: true });
  const rows = await qi.sequelize.query<{ id: number; findings: string | null }>(
    "SELECT id, JSON_EXTRACT(report, '$.findings') AS findings FROM takes WHERE status = 'measured' AND verdict IN ('warn', 'fail')",
    { type: QueryTypes.SELECT },
  );
  for (const row of rows) {
    const findings = (typeof row.findings === 'string' ? JSON.parse(row.findings) : row.findings) as Finding[] | null;
    const reason = Array.isArray(findings) ? reasonOf(findings) : null;
    if (reason) await qi.sequelize.query('UPDATE takes SET reason = ? WHERE id = ?', { replacements: [reason, row.id] });
  }
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('takes', 'reason');
}
