import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import os from 'node:os';
import { BASE_URL } from './http';

/** The throwaway MariaDB of this test run, as scripts/db.sh started it. */
const dataDir = process.env.DB_DATA_DIR ?? '';
const socket = `${dataDir}.run/mysqld.sock`;

export function stopDatabase(): void {
  const run = spawnSync('mariadb-admin', ['--no-defaults', `--socket=${socket}`, '-uroot', 'shutdown'], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`Could not stop the test database: ${run.stderr}`);
}

/** Starts the test database again on the same data, port and socket; scripts/db.sh stops it at the end. */
export async function startDatabase(): Promise<void> {
  const child = spawn(
    'mariadbd',
    ['--no-defaults', `--user=${os.userInfo().username}`, `--datadir=${dataDir}`, `--socket=${socket}`, `--pid-file=${dataDir}.run/mysqld.pid`, `--log-error=${dataDir}.run/error.log`, `--port=${process.env.DB_PORT}`, '--bind-address=127.0.0.1', '--skip-name-resolve'],
    { detached: true, stdio: 'ignore' },
  );
  child.unref();
  for (let i = 0; i < 120; i++) {
    if (spawnSync('mariadb-admin', ['--no-defaults', `--socket=${socket}`, '-uroot', 'ping'], { stdio: 'ignore' }).status === 0) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('The test database did not come back');
}

/** The pid of the test server's analysis worker now (its supervisor starts a new one when it dies), or 0. */
export function workerPid(): number {
  try {
    return Number(readFileSync(process.env.TAKEPROOF_WORKER_PID_FILE ?? '', 'utf8').trim()) || 0;
  } catch {
    return 0;
  }
}

export function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Waits until `check` holds, polling every 200 ms; throws with `what` after `timeoutMs`. */
export async function waitUntil(what: string, check: () => boolean | Promise<boolean>, timeoutMs = 60_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > until) throw new Error(`Timed out waiting until ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** Starts another worker (compiled by the test setup, as `npm start` runs it), with some settings changed. */
export function spawnWorker(env: Record<string, string> = {}, stdio: 'ignore' | 'pipe' = 'ignore'): ChildProcess {
  return spawn(process.execPath, ['--conditions=react-server', 'var/build/worker.mjs'], { env: { ...process.env, ...env }, stdio: ['ignore', stdio, stdio] });
}

/** A second web server from the same build, on its own port, with some settings changed. */
export async function startExtraServer(port: number, env: Record<string, string>): Promise<{ url: string; child: ChildProcess }> {
  const url = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/web-server.ts'], {
    env: { ...process.env, ...env, HOST: '127.0.0.1', PORT: String(port), NEXTAUTH_URL: url, TAKEPROOF_TEST_URL: url },
    stdio: 'ignore',
  });
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(`${url}/signin`)).ok) return { url, child };
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  child.kill('SIGKILL');
  throw new Error(`The extra server on ${port} did not start`);
}

export const mainServerUrl = BASE_URL;
