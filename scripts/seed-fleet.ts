// `npm run seed:fleet`: an invented studio with a large fleet, for the fleet pages and their benchmark.
// 100 recorders and 50 000 measured takes over the last year, written with bulk inserts. Run it while
// the database is up (`npm start` in another terminal). Running it again replaces that studio's fleet.
// Sizes can be changed: `npm run seed:fleet -- --recorders 20 --takes 5000`.
import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db/connection.server';
import { hashPassword } from '@/lib/auth/passwords.server';
import { DeliverySpec, Recorder, RecordingSession, Studio, Take, User } from '@/models';
import { DEFAULT_SPEC } from '@/dsp/spec';
import { seededRandom } from '../dsp/util/seededRandom';

const STUDIO = 'Brackenridge Sound Depot';
const MANAGER_EMAIL = 'fleet-manager@demo.test';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  const v = i >= 0 ? Number(process.argv[i + 1]) : NaN;
  return Number.isFinite(v) && v > 0 ? Math.floor(v) : fallback;
}
const RECORDERS = arg('recorders', 100);
const TAKES = arg('takes', 50_000);
const DAY_MS = 86_400_000;

// A small seeded generator, so every run builds the same fleet.
const random = seededRandom(0x2f6b1d3);
const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
const pick = <T,>(xs: readonly T[]) => xs[Math.floor(random() * xs.length)];
const round = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;

// Invented makes and models only.
const MODELS = [
  { makeModel: 'Halden A2 USB interface', kind: 'interface', floor: -96 },
  { makeModel: 'Halden A8 rack interface', kind: 'interface', floor: -98 },
  { makeModel: 'Corvid FR-8 field recorder', kind: 'field recorder', floor: -90 },
  { makeModel: 'Corvid FR-2 pocket recorder', kind: 'field recorder', floor: -84 },
  { makeModel: 'Tidewater 16x stage box', kind: 'stage box', floor: -93 },
  { makeModel: 'Tidewater 32x stage box', kind: 'stage box', floor: -94 },
  { makeModel: 'Osprey 8i converter', kind: 'interface', floor: -100 },
  { makeModel: 'Marlow MX-4 field mixer', kind: 'field recorder', floor: -88 },
] as const;
const PLACES = ['Booth A', 'Booth B', 'Booth C', 'Live room', 'Studio 2', 'Drama floor', 'Equipment room', 'OB van', 'News desk', 'Field store'];

type Trouble = 'none' | 'drift' | 'lowBits' | 'preamp' | 'clock' | 'aliasing';

interface Profile {
  floor: number;
  spread: number;
  trouble: Trouble;
  /** For drift: dB gained by now, and the day (from the start) the rise begins. */
  driftDb: number;
  driftStartDay: number;
  weight: number;
}

function profileFor(i: number, baseFloor: number): Profile {
  // Roughly one recorder in ten drifts; a few have another fault.
  const trouble: Trouble = i % 10 === 3 ? 'drift' : i % 17 === 5 ? 'lowBits' : i % 19 === 7 ? 'preamp' : i % 23 === 11 ? 'clock' : i % 29 === 13 ? 'aliasing' : 'none';
  return {
    floor: baseFloor + gauss() * 2,
    spread: 0.8 + random() * 1.5,
    trouble,
    driftDb: trouble === 'drift' ? 4 + random() * 8 : 0,
    driftStartDay: trouble === 'drift' ? 250 + Math.floor(random() * 90) : 0,
    weight: 0.3 + random() * 1.7,
  };
}

async function main() {
  const sequelize = db();
  const started = Date.now();
  const [studio] = await Studio.findOrCreate({ where: { name: STUDIO }, defaults: { name: STUDIO } });
  const password = process.env.DEMO_PASSWORD;
  if (password) {
    await User.findOrCreate({
      where: { email: MANAGER_EMAIL },
      defaults: { email: MANAGER_EMAIL, name: 'Odile Fenwick', role: 'manager', studioId: studio.id, passwordHash: await hashPassword(password) },
    });
  }
  // Start from a clean fleet: the takes go with their sessions (ON DELETE CASCADE).
  await Take.destroy({ where: { studioId: studio.id } });
  await RecordingSession.destroy({ where: { studioId: studio.id } });
  await Recorder.destroy({ where: { studioId: studio.id } });
  const { name: _n, ...defaults } = DEFAULT_SPEC;
  await DeliverySpec.findOrCreate({
    where: { studioId: studio.id, name: 'Broadcast capture (EBU R 128)' },
    defaults: { studioId: studio.id, name: 'Broadcast capture (EBU R 128)', description: 'EBU R 128 loudness and true peak; 48 kHz, 24-bit capture. The broadcaster’s own spec comes first.', thresholds: { ...defaults, requiredSampleRate: 48000, requiredBitDepth: 24, minEffectiveBits: 20 } },
  });

  const recorderRows = Array.from({ length: RECORDERS }, (_, i) => {
    const model = MODELS[i % MODELS.length];
    const n = String(i + 1).padStart(3, '0');
    return {
      studioId: studio.id,
      label: `${pick(PLACES)} ${model.kind} ${n}`,
      makeModel: model.makeModel,
      serial: `BSD-${n}-${Math.floor(1000 + random() * 9000)}`,
      location: pick(PLACES),
      notes: null,
      bextMatch: `BSD-REC-${n}`,
      active: i % 41 !== 40,
    };
  });
  const recorders = await Recorder.bulkCreate(recorderRows);
  const profiles = recorders.map((_, i) => profileFor(i, MODELS[i % MODELS.length].floor));
  const totalWeight = profiles.reduce((s, p) => s + p.weight, 0);

  // One session per week of the year.
  const now = Date.now();
  const start = now - 365 * DAY_MS;
  const sessionRows = Array.from({ length: 53 }, (_, w) => ({
    studioId: studio.id,
    title: `Fleet week ${w + 1}`,
    client: 'Brackenridge house programmes',
    recordedOn: new Date(start + w * 7 * DAY_MS).toISOString().slice(0, 10),
    room: null,
    engineerId: null,
    producerId: null,
    deliverySpecId: null,
    notes: null,
  }));
  const sessions = await RecordingSession.bulkCreate(sessionRows);

  // Takes per recorder follow its weight; each take lands at a random moment of the year.
  const counts = profiles.map((p) => Math.floor((p.weight / totalWeight) * TAKES));
  let short = TAKES - counts.reduce((a, b) => a + b, 0);
  for (let i = 0; short > 0; i = (i + 1) % counts.length, short--) counts[i]++;

  const BATCH = 2000;
  let batch: Record<string, unknown>[] = [];
  let written = 0;
  const flush = async () => {
    if (!batch.length) return;
    await Take.bulkCreate(batch as never[], { validate: false, hooks: false });
    written += batch.length;
    batch = [];
  };
  for (let r = 0; r < recorders.length; r++) {
    const p = profiles[r];
    for (let k = 0; k < counts[r]; k++) {
      const at = start + random() * (now - start);
      const day = (at - start) / DAY_MS;
      const drift = p.trouble === 'drift' && day > p.driftStartDay ? (p.driftDb * (day - p.driftStartDay)) / (365 - p.driftStartDay) : 0;
      const floor = round(p.floor + drift + gauss() * p.spread, 2);
      // Effective bits count the data grid the samples sit on, not the noise: 24 unless a stage runs at 16-bit.
      const bits = p.trouble === 'lowBits' && random() < 0.6 ? 16 : random() < 0.01 ? 23 : 24;
      const lufs = round(-23 + gauss() * 2.5, 2);
      const tp = round(lufs + 14 + gauss() * 3.5, 2);
      const belowFs = p.trouble === 'preamp' && random() < 0.4 ? 1 + Math.floor(random() * 6) : random() < 0.01 ? 1 : 0;
      const fullScale = tp > 0 && random() < 0.5 ? 1 + Math.floor(random() * 3) : 0;
      const rateMismatch = p.trouble === 'clock' ? random() < 0.25 : random() < 0.002;
      const aliasing = p.trouble === 'aliasing' ? random() < 0.3 : random() < 0.005;
      const fails = bits < 20 || fullScale + belowFs > 0 || floor > -60;
      const warns = tp > -1 || rateMismatch || aliasing || Math.abs(lufs + 23) > 1;
      const verdict = fails ? 'fail' : warns ? 'warn' : 'pass';
      // The reason a judged take would carry, worded like the engine's one-line summaries.
      const reason =
        fullScale + belowFs > 0 ? `${fullScale + belowFs} clipping event${fullScale + belowFs > 1 ? 's' : ''}`
        : bits < 20 ? `Only ${bits} bits used`
        : floor > -60 ? `Noise floor ${floor.toFixed(1)} dBFS, above the -60.0 dBFS limit`
        : tp > -1 ? `True peak ${tp.toFixed(1)} dBTP, above the -1.0 dBTP limit`
        : rateMismatch ? 'Recorded at another sample rate than the header declares'
        : aliasing ? 'Strong energy up to Nyquist: possible aliasing'
        : warns ? `Loudness ${lufs.toFixed(1)} LUFS, off the -23.0 LUFS target`
        : null;
      const u = random();
      const decision = u < 0.3 ? 'pending' : u < (verdict === 'fail' ? 0.65 : 0.92) ? 'approved' : 'rejected';
      const measuredAt = new Date(at);
      const session = sessions[Math.min(sessions.length - 1, Math.floor(day / 7))];
      batch.push({
        studioId: studio.id,
        sessionId: session.id,
        recorderId: recorders[r].id,
        uploadedById: null,
        originalName: `${recorders[r].bextMatch}_${measuredAt.toISOString().slice(0, 10)}_${k + 1}.wav`,
        storageKey: `seed-fleet/${randomUUID()}`,
        bytes: 50_000_000 + Math.floor(random() * 400_000_000),
        sha256: randomUUID().replace(/-/g, '') + randomUUID().replace(/-/g, ''),
        sampleRate: 48000,
        bitsPerSample: 24,
        channels: 2,
        encoding: 'pcm',
        durationSec: round(60 + random() * 3000, 1),
        status: 'measured',
        progress: 100,
        error: null,
        report: null,
        peaksKey: null,
        effectiveBits: bits,
        truePeakDbtp: tp,
        integratedLufs: lufs,
        noiseFloorDbfs: floor,
        clipEvents: fullScale + belowFs,
        belowFullScaleClipEvents: belowFs,
        rateMismatch,
        aliasingRisk: aliasing,
        verdict,
        reason,
        decision,
        decidedById: null,
        decidedAt: decision === 'pending' ? null : measuredAt,
        decisionNote: null,
        measuredAt,
        createdAt: measuredAt,
        updatedAt: measuredAt,
      });
      if (batch.length >= BATCH) await flush();
    }
  }
  await flush();
  // Fresh statistics, so the planner sees the new rows.
  await sequelize.query('ANALYZE TABLE takes', { type: QueryTypes.SELECT });
  const troubled = profiles.map((p, i) => (p.trouble === 'none' ? null : `${recorders[i].label} (${p.trouble})`)).filter(Boolean);
  console.log(`Studio "${STUDIO}" (id ${studio.id}): ${recorders.length} recorders, ${sessions.length} sessions, ${written} measured takes in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
  console.log(`Recorders with a built-in fault (${troubled.length}): ${troubled.join('; ')}`);
  if (password) console.log(`Sign in as ${MANAGER_EMAIL} with the demo password to see this fleet.`);
}

try {
  await main();
} catch (error) {
  console.error(`Seeding the fleet failed: ${(error as Error).message}`);
  if (process.env.DEBUG) console.error(error);
  process.exitCode = 1;
} finally {
  await db().close();
}
