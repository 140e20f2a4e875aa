import bcrypt from 'bcryptjs';
import mariadb from 'mariadb';
import { randomBytes } from 'node:crypto';

/**
 * Studios and people a test makes for itself, written straight into the test database, so a test
 * that signs people out, locks them out or uses up their allowances touches nobody else's.
 */
export const testDb = mariadb.createPool({
  host: process.env.DB_HOST ?? '127.0.0.1',
  port: Number(process.env.DB_PORT ?? 3317),
  user: process.env.DB_USER,
  password: process.env.DB_PASSWORD,
  database: process.env.DB_NAME,
  connectionLimit: 2,
});

const tag = () => `${Date.now().toString(36)}-${randomBytes(3).toString('hex')}`;

export async function newStudio(label: string): Promise<number> {
  const result = await testDb.query('INSERT INTO studios (name, createdAt, updatedAt) VALUES (?, NOW(), NOW())', [`${label} ${tag()}`]);
  return Number(result.insertId);
}

export interface Person {
  id: number;
  studioId: number;
  email: string;
  password: string;
}

/** An active person with a password of their own. */
export async function newPerson(studioId: number, role: 'engineer' | 'producer' | 'manager', label: string): Promise<Person> {
  const email = `${label}-${tag()}@demo.test`;
  const password = `pw-${randomBytes(9).toString('base64url')}`;
  // Cost 4 keeps the test quick; sign-in reads the cost from the hash itself.
  const hash = await bcrypt.hash(password, 4);
  const result = await testDb.query(
    'INSERT INTO users (studioId, email, name, passwordHash, role, active, createdAt, updatedAt) VALUES (?, ?, ?, ?, ?, 1, NOW(), NOW())',
    [studioId, email, `Test ${label}`, hash, role],
  );
  return { id: Number(result.insertId), studioId, email, password };
}
