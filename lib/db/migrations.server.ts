import 'server-only';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { SequelizeStorage, Umzug } from 'umzug';
import type { QueryInterface } from 'sequelize';
import { db } from './connection.server';

const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'models', 'migrations');

/** Umzug over models/migrations, recording what ran in the `schema_migrations` table. */
export function migrator() {
  const sequelize = db();
  return new Umzug<QueryInterface>({
    migrations: {
      glob: ['*.ts', { cwd: migrationsDir }],
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () => (await import(file!)).up({ context }),
        down: async () => (await import(file!)).down({ context }),
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}
