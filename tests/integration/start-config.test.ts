import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

/** Runs `npm start`'s script with a production environment; PORT points at the busy test server, so nothing can start. */
function startWith(env: Record<string, string>) {
  const clean = Object.fromEntries(Object.entries(process.env).filter(([k]) => !k.startsWith('NEXTAUTH_') && k !== 'NODE_ENV'));
  return spawnSync('bash', ['scripts/start.sh'], { env: { ...clean, NODE_ENV: 'production', PORT: process.env.PORT ?? '3100', ...env }, encoding: 'utf8', timeout: 30_000 });
}

describe('npm start in production', () => {
  it('refuses the development secret from .env.example', () => {
    const run = startWith({});
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/Refusing to start: NODE_ENV=production needs NEXTAUTH_SECRET/);
  });

  it('refuses an empty or short secret', () => {
    for (const secret of ['', 'short-secret']) {
      const run = startWith({ NEXTAUTH_SECRET: secret });
      expect(run.status).toBe(2);
      expect(run.stderr).toMatch(/at least 32 characters/);
    }
  });

  it('accepts a long random secret (and then stops at the busy port, not at the secret)', () => {
    const run = startWith({ NEXTAUTH_SECRET: 'a'.repeat(20) + 'b'.repeat(20) });
    expect(run.stderr).not.toMatch(/Refusing to start/);
    expect(run.stderr).toMatch(/already in use/);
  });
});
