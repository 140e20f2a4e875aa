import { DataTypes, type QueryInterface } from 'sequelize';

const ref = (table: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('take_comments', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    studioId: ref('studios', false, 'CASCADE'),
    takeId: ref('takes', false, 'CASCADE'),
    authorId: ref('users', true, 'SET NULL'),
    atSec: { type: DataTypes.DOUBLE, allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  // The review page lists a take's comments in time order.
  await qi.addIndex('take_comments', ['takeId', 'atSec'], { name: 'take_comments_take_time' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('take_comments');
}
