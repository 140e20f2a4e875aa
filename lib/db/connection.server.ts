import 'server-only';
import { Sequelize } from 'sequelize';
import mariadb from 'mariadb';
import { initModels } from '@/models';
import { env } from '@/lib/env.server';

// One instance per module instance: Next.js may bundle the models into several server bundles,
// and each bundle's model classes must be initialised on a connection of their own.
let instance: Sequelize | undefined;

/** The one Sequelize connection of this process, with every model defined. */
export function db(): Sequelize {
  if (instance) return instance;
  const e = env();
  const sequelize = new Sequelize(e.DB_NAME, e.DB_USER, e.DB_PASSWORD, {
    host: e.DB_HOST,
    port: e.DB_PORT,
    dialect: 'mariadb',
    dialectModule: mariadb,
    logging: false,
    pool: { max: 8, min: 0, idle: 10_000 },
    dialectOptions: { connectTimeout: 5_000 },
  });
  initModels(sequelize);
  instance = sequelize;
  return sequelize;
}

/** Makes sure the models are defined before a service touches them. */
export function ensureDb(): void {
  db();
}
