// Loads the invented demo studio (idempotent: existing rows are kept).
import { db } from '@/lib/db/connection.server';
import { seedDemo } from '@/lib/db/demo.server';

const password = process.env.DEMO_PASSWORD;
if (!password) {
  console.error('DEMO_PASSWORD is not set; see .env.example.');
  process.exit(2);
}
try {
  const { created } = await seedDemo(password);
  console.log(created.length ? `Demo data added: ${created.join(', ')}` : 'Demo data already present.');
} catch (error) {
  console.error(`Seeding failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await db().close();
}
