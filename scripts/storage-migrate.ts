// `npm run storage:migrate`: moves takes and waveform files that earlier versions kept below
// STORAGE_DIR into the S3 bucket, verifying every SHA-256, and prints a summary. Run it once after
// upgrading; running it again is safe. Exit code 1 when a file had to be left on local disk.
import { db } from '@/lib/db/connection.server';
import { env } from '@/lib/env.server';
import { formatBytes } from '@/lib/format';
import { migrateToBucket } from '@/lib/storage/migrate.server';
import { bucketStorage, diskStorage } from '@/lib/storage/storage.server';

try {
  const config = env();
  console.log(`Moving takes from ${config.STORAGE_DIR} into bucket ${config.S3_BUCKET}…`);
  const summary = await migrateToBucket(diskStorage(), bucketStorage(), (line) => console.log(line));
  console.log(
    `Moved ${summary.moved} file(s) (${formatBytes(summary.bytesMoved)}); ${summary.alreadyThere} already in the bucket; ` +
      `${summary.unreferenced.length} without a take left in place; ${summary.problems.length} kept on local disk because they did not verify.`,
  );
  process.exitCode = summary.problems.length ? 1 : 0;
} catch (error) {
  console.error(`The move into the bucket could not run: ${(error as Error).message}`);
  process.exitCode = 2;
} finally {
  await db().close();
}
