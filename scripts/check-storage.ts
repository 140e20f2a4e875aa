// `npm run check:storage`: lists stored files no take refers to, takes whose file is missing,
// and unfinished writes. Exit code 1 when anything is out of place.
import { db } from '@/lib/db/connection.server';
import { checkStorage } from '@/lib/storage/check.server';

try {
  const report = await checkStorage();
  console.log(`Checked ${report.objects} stored files against ${report.takes} takes.`);
  for (const key of report.filesWithoutRows) console.log(`  file without a take: ${key}`);
  for (const { takeId, key } of report.rowsWithoutFiles) console.log(`  take ${takeId} has no file: ${key}`);
  for (const key of report.partialWrites) console.log(`  unfinished write: ${key}`);
  const problems = report.filesWithoutRows.length + report.rowsWithoutFiles.length + report.partialWrites.length;
  console.log(problems ? `${problems} problem(s) found.` : 'Storage and database agree.');
  process.exitCode = problems ? 1 : 0;
} catch (error) {
  console.error(`The storage check could not run: ${(error as Error).message}`);
  process.exitCode = 2;
} finally {
  await db().close();
}
