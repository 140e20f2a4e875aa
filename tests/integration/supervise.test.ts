import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { isRunning, waitUntil } from '../support/testServices';

// scripts/supervise.sh as start.sh and test-env.sh use it, around a stand-in process that idles.
const dir = mkdtempSync(path.join(os.tmpdir(), 'takeproof-supervise-'));
const log = path.join(dir, 'idler.log');
const pidOf = (name: string) => (existsSync(path.join(dir, `${name}.pid`)) ? Number(readFileSync(path.join(dir, `${name}.pid`), 'utf8')) : 0);
const script = `source scripts/supervise.sh; SUPERVISE_DIR="${dir}"; PIDS=();
supervise idler "${log}" node -e "console.log('idler up'); setInterval(() => {}, 1000)";
echo "\${PIDS[0]}" > "${dir}/supervisor.pid"; wait`;
const shell = spawn('bash', ['-c', script], { stdio: 'ignore' });

afterAll(() => {
  shell.kill('SIGKILL');
  const idler = pidOf('idler');
  if (idler && isRunning(idler)) process.kill(idler, 'SIGKILL');
  rmSync(dir, { recursive: true, force: true });
});

describe('process supervision (scripts/supervise.sh)', () => {
  it('starts a killed process again with a log line, and stops it when the supervisor is stopped', async () => {
    const started = () => (existsSync(log) ? readFileSync(log, 'utf8').match(/idler up/g)?.length ?? 0 : 0);
    await waitUntil('the process runs', () => pidOf('supervisor') > 0 && started() === 1);
    const first = pidOf('idler');
    process.kill(first, 'SIGKILL');
    await waitUntil('a new process runs', () => pidOf('idler') !== first && isRunning(pidOf('idler')));
    const second = pidOf('idler');
    expect(readFileSync(log, 'utf8')).toMatch(/idler: stopped \(exit code 137\); starting it again in 1 s\./);
    await waitUntil('the new process has started', () => started() === 2);

    process.kill(pidOf('supervisor'), 'SIGTERM');
    await waitUntil('the process has stopped', () => !isRunning(second));
    await waitUntil('the supervisor has stopped', () => !existsSync(path.join(dir, 'idler.pid')));
  });
});

describe('Ctrl-C on a terminal running Takeproof', () => {
  // As `npm start` runs: the script traps INT like start.sh, and the terminal sends SIGINT to the
  // whole foreground process group (the script, every supervisor and every supervised process).
  const home = mkdtempSync(path.join(os.tmpdir(), 'takeproof-ctrl-c-'));
  const pidIn = (name: string) => (existsSync(path.join(home, `${name}.pid`)) ? Number(readFileSync(path.join(home, `${name}.pid`), 'utf8')) : 0);
  afterAll(() => {
    for (const name of ['first', 'second']) if (pidIn(name) && isRunning(pidIn(name))) process.kill(pidIn(name), 'SIGKILL');
    rmSync(home, { recursive: true, force: true });
  });

  it('stops every supervised process and every supervisor, and the script exits', async () => {
    // The second process, like a worker finishing a take, does not stop on SIGINT: its supervisor must stop it.
    const idle = (name: string, onInterrupt = '') => `supervise ${name} "${home}/${name}.log" node -e "${onInterrupt} setInterval(() => {}, 1000)";`;
    const startLike = `source scripts/supervise.sh; SUPERVISE_DIR="${home}"; PIDS=();
trap stop_all_pids EXIT; trap 'exit 130' INT TERM;
${idle('first')} ${idle('second', "process.on('SIGINT', () => {});")}
echo "\${PIDS[*]}" > "${home}/supervisors"; wait "\${PIDS[@]}"`;
    const terminal = spawn('bash', ['-c', startLike], { stdio: 'ignore', detached: true });
    const exited = new Promise<number | null>((resolve) => terminal.on('exit', (code) => resolve(code)));
    await waitUntil('both processes run', () => existsSync(path.join(home, 'supervisors')) && pidIn('first') > 0 && pidIn('second') > 0 && isRunning(pidIn('first')) && isRunning(pidIn('second')));
    const processes = [pidIn('first'), pidIn('second')];
    const supervisors = readFileSync(path.join(home, 'supervisors'), 'utf8').trim().split(' ').map(Number);

    process.kill(-terminal.pid!, 'SIGINT');
    await expect(exited).resolves.toBe(130);
    await waitUntil('every process has stopped', () => [...processes, ...supervisors].every((pid) => !isRunning(pid)));
    // Nothing was started again after the stop.
    expect(existsSync(path.join(home, 'first.pid')) || existsSync(path.join(home, 'second.pid'))).toBe(false);
  });
});
