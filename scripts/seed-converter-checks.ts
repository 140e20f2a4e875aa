// `npm run seed:converter` (and `npm start`): invented converter-check histories for the demo studio's
// recorders — one steady, one drifting, one overdue. Each check is a recording of the real check signal
// through a simulated converter (scripts/demo/simulatedConverter.ts), stored like an upload and
// measured and judged by the engine, so every figure the demo shows comes from an analysis. A recorder
// that already has checks is left alone.
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { analyzeConverterCheck } from '@/dsp/converter';
import { recordMeasuredCheck } from '@/lib/converterChecks/judgement.server';
import { db } from '@/lib/db/connection.server';
import { DEMO_STUDIO_NAME } from '@/lib/db/demo.server';
import { plural } from '@/lib/format';
import { newConverterCheckKey, storage } from '@/lib/storage/storage.server';
import { ConverterCheck, Recorder, Studio, User } from '@/models';
import { recordThrough, type DemoConverter } from './demo/simulatedConverter';

const DAY_MS = 86_400_000;
const quiet: DemoConverter = { gainsDb: [0.05, -0.08], noiseDbfs: -104, secondOrder: 0.00005, lowPassHz: 22_500, crosstalkDb: -110, seed: 1 };

// Days before today each check was made, and the converter it was made through.
const HISTORIES: { label: string; checks: { daysAgo: number; converter: DemoConverter }[] }[] = [
  {
    label: 'Booth A interface',
    checks: [
      { daysAgo: 170, converter: { ...quiet, seed: 101 } },
      { daysAgo: 85, converter: { ...quiet, noiseDbfs: -103.8, seed: 102 } },
      { daysAgo: 12, converter: { ...quiet, noiseDbfs: -104.2, seed: 103 } },
    ],
  },
  {
    // Drifting: its noise rises and its filter's edge falls over the months (an ageing analogue stage).
    label: 'Field kit 2',
    checks: [
      { daysAgo: 150, converter: { ...quiet, gainsDb: [-0.1, 0.1], noiseDbfs: -101, lowPassHz: 22_000, seed: 201 } },
      { daysAgo: 65, converter: { ...quiet, gainsDb: [-0.1, 0.1], noiseDbfs: -99.5, lowPassHz: 21_800, seed: 202 } },
      { daysAgo: 6, converter: { ...quiet, gainsDb: [-0.15, 0.1], noiseDbfs: -93, secondOrder: 0.0002, lowPassHz: 20_800, seed: 203 } },
    ],
  },
  {
    // Overdue: checked once, longer ago than the studio's interval.
    label: 'Stage box West',
    checks: [{ daysAgo: 120, converter: { ...quiet, gainsDb: [0.02, 0.01], noiseDbfs: -106, crosstalkDb: -100, seed: 301 } }],
  },
];

async function seed(): Promise<string[]> {
  db();
  const studio = await Studio.findOne({ where: { name: DEMO_STUDIO_NAME } });
  if (!studio) throw new Error('The demo studio is missing: run the demo seed first.');
  const engineer = await User.findOne({ where: { studioId: studio.id, role: 'engineer' } });
  const done: string[] = [];
  for (const history of HISTORIES) {
    const recorder = await Recorder.findOne({ where: { studioId: studio.id, label: history.label } });
    if (!recorder || (await ConverterCheck.count({ where: { recorderId: recorder.id } })) > 0) continue;
    for (const { daysAgo, converter } of [...history.checks].sort((a, b) => b.daysAgo - a.daysAgo)) {
      const at = new Date(Date.now() - daysAgo * DAY_MS);
      const bytes = recordThrough(converter);
      const key = newConverterCheckKey(at);
      await storage().put(key, Readable.from([bytes]));
      const report = await analyzeConverterCheck(() => Readable.from([bytes]));
      const check = await ConverterCheck.create({
        studioId: studio.id,
        recorderId: recorder.id,
        uploadedById: engineer?.id ?? null,
        originalName: `${history.label.toLowerCase().replace(/\W+/g, '-')}-check-${at.toISOString().slice(0, 10)}.wav`,
        storageKey: key,
        bytes: bytes.length,
        sha256: createHash('sha256').update(bytes).digest('hex'),
        status: 'measuring',
      });
      await db().transaction((transaction) => recordMeasuredCheck(check.id, report, transaction, at));
      await db().query('UPDATE converter_checks SET createdAt = :at WHERE id = :id', { replacements: { at, id: check.id } });
    }
    done.push(`${history.label} (${plural(history.checks.length, "converter check")})`);
  }
  return done;
}

try {
  const done = await seed();
  console.log(done.length ? `Demo converter checks added: ${done.join(', ')}` : 'Demo converter checks already present.');
} catch (error) {
  console.error(`Seeding converter checks failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await db().close();
}
