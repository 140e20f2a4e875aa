import { DataTypes, type QueryInterface } from 'sequelize';

/** When a delivery spec was archived: hidden from new sessions, still judging the sessions that use it. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('delivery_specs', 'archivedAt', { type: DataTypes.DATE, allowNull: true });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('delivery_specs', 'archivedAt');
}
