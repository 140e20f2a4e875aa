// `npm run bench:fleet`: times the fleet queries on the studio `npm run seed:fleet` creates and prints
// the figures (no pass/fail). With TAKEPROOF_URL set (a running app), it also times GET /api/fleet over HTTP.
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db/connection.server';
import { fleetAlerts, fleetOverview, recorderTrends } from '@/lib/fleet/service.server';
import type { FleetPeriod } from '@/lib/fleet/views';
import { Studio, Take, User } from '@/models';
import type { Actor } from '@/lib/auth/views';

const STUDIO = 'Brackenridge Sound Depot';
const RUNS = Number(process.env.BENCH_RUNS ?? 15);

async function time(label: string, run: () => Promise<unknown>) {
  await run(); // warm-up
  const ms: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    await run();
    ms.push(performance.now() - t0);
  }
  ms.sort((a, b) => a - b);
  const q = (p: number) => ms[Math.min(ms.length - 1, Math.floor(p * ms.length))].toFixed(1);
  console.log(`${label.padEnd(44)} median ${q(0.5).padStart(7)} ms   p90 ${q(0.9).padStart(7)} ms   min ${ms[0].toFixed(1).padStart(7)} ms   (${RUNS} runs)`);
}

async function main() {
  db();
  const studio = await Studio.findOne({ where: { name: STUDIO } });
  if (!studio) throw new Error(`No studio "${STUDIO}": run \`npm run seed:fleet\` first.`);
  const takes = await Take.count({ where: { studioId: studio.id } });
  const allTakes = await Take.count();
  console.log(`Fleet benchmark: studio ${studio.id}, ${takes} takes (${allTakes} in the whole table)\n`);
  const manager = await User.findOne({ where: { studioId: studio.id, role: 'manager' } });
  const actor: Actor = { id: manager?.id ?? 0, studioId: studio.id, role: 'manager', name: 'bench', email: 'bench@demo.test' };

  for (const period of [7, 30, 90, 'all'] as FleetPeriod[]) {
    await time(`fleet table, period ${period}`, () => fleetOverview(actor, period));
  }
  await time('fleet alerts (dashboard)', () => fleetAlerts(actor));
  const [busiest] = await db().query<{ recorderId: number; n: number }>(
    'SELECT recorderId, COUNT(*) AS n FROM takes WHERE studioId = :s GROUP BY recorderId ORDER BY n DESC LIMIT 1',
    { type: QueryTypes.SELECT, replacements: { s: studio.id } },
  );
  await time(`recorder trends, all time (${busiest.n} takes)`, () => recorderTrends(actor, busiest.recorderId, 'all'));

  const plan = await db().query<Record<string, unknown>>(
    `EXPLAIN SELECT recorderId, noiseFloorDbfs FROM takes WHERE studioId = :s AND status = 'measured' AND recorderId IS NOT NULL AND measuredAt <= NOW() AND measuredAt >= NOW() - INTERVAL 30 DAY`,
    { type: QueryTypes.SELECT, replacements: { s: studio.id } },
  );
  console.log(`\nPlan of the period scan: key=${plan[0].key} type=${plan[0].type} rows≈${plan[0].rows} extra=${plan[0].Extra}`);

  const url = process.env.TAKEPROOF_URL;
  if (url) {
    const email = process.env.BENCH_EMAIL ?? 'fleet-manager@demo.test';
    const password = process.env.DEMO_PASSWORD ?? '';
    const jar = new Map<string, string>();
    const keep = (r: Response) => r.headers.getSetCookie().forEach((c) => { const [p] = c.split(';'); const i = p.indexOf('='); jar.set(p.slice(0, i), p.slice(i + 1)); });
    const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
    const csrfRes = await fetch(`${url}/api/auth/csrf`);
    keep(csrfRes);
    const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
    keep(await fetch(`${url}/api/auth/callback/credentials`, { method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded', origin: new URL(url).origin, cookie: cookie() }, body: new URLSearchParams({ csrfToken, email, password, json: 'true' }) }));
    console.log('');
    for (const days of ['30', 'all']) {
      await time(`HTTP GET /api/fleet?days=${days}`, async () => {
        const r = await fetch(`${url}/api/fleet?days=${days}`, { headers: { cookie: cookie() } });
        if (!r.ok) throw new Error(`GET /api/fleet answered ${r.status}`);
        await r.arrayBuffer();
      });
    }
  }
}

try {
  await main();
} catch (error) {
  console.error(`Benchmark failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  await db().close();
}
