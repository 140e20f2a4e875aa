// Applies pending migrations (`down` rolls back the newest one).
import { migrator } from '@/lib/db/migrations.server';
import { db } from '@/lib/db/connection.server';

const umzug = migrator();
try {
  if (process.argv[2] === 'down') {
    const undone = await umzug.down();
    console.log(undone.length ? `Rolled back ${undone.map((m) => m.name).join(', ')}` : 'Nothing to roll back.');
  } else {
    const done = await umzug.up();
    console.log(done.length ? `Applied ${done.length} migration(s): ${done.map((m) => m.name).join(', ')}` : 'Schema is up to date.');
  }
} catch (error) {
  console.error(`Migration failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await db().close();
}
