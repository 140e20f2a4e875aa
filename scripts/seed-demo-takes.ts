// `npm start`: the demo takes of samples/ uploaded into the demo studio's drama session (judged
// against EBU R 128, the level the samples were made at) by its engineer, as an upload would store
// and queue them, so a first look finds takes measured by the worker and waiting for review. A
// session that already has takes is left alone.
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import { db } from '@/lib/db/connection.server';
import { DEMO_STUDIO_NAME } from '@/lib/db/demo.server';
import { plural } from '@/lib/format';
import { newTakeKey, storage } from '@/lib/storage/storage.server';
import { recordTakes } from '@/lib/takes/uploads.server';
import { RecordingSession, Studio, Take, User } from '@/models';

const SESSION_TITLE = 'The Night Ferry — drama day 3';
const samplesDir = process.argv[2] ?? 'samples';

try {
  db();
  const studio = await Studio.findOne({ where: { name: DEMO_STUDIO_NAME } });
  const engineer = studio && (await User.findOne({ where: { studioId: studio.id, email: 'engineer@demo.test' } }));
  const session = studio && (await RecordingSession.findOne({ where: { studioId: studio.id, title: SESSION_TITLE } }));
  if (!studio || !engineer || !session) throw new Error('the demo studio, its engineer or its drama session is missing (run scripts/seed.ts first)');
  if (await Take.count({ where: { sessionId: session.id } })) {
    console.log(`Demo takes already present in “${SESSION_TITLE}”.`);
  } else {
    const files = [];
    for (const name of readdirSync(samplesDir).filter((n) => n.endsWith('.wav')).sort()) {
      const body = readFileSync(path.join(samplesDir, name));
      const key = newTakeKey();
      await storage().put(key, Readable.from([body]));
      files.push({ key, originalName: name, bytes: body.length, sha256: createHash('sha256').update(body).digest('hex') });
    }
    const actor = { id: engineer.id, studioId: studio.id, role: engineer.role, name: engineer.name, email: engineer.email };
    await recordTakes(actor, session.id, files, null);
    console.log(`Demo takes added: ${plural(files.length, 'take')} in “${SESSION_TITLE}”, queued for measuring.`);
  }
} catch (error) {
  console.error(`Adding the demo takes failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await db().close();
}
