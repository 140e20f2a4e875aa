import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_SPEC } from '../../../dsp/spec';
import { tempDirectory } from '../../support/tempFiles';
import { sine } from '../../support/testSignals';
import { encodeSamples, wavFile } from '../../support/wavWriter';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const temp = tempDirectory();
afterAll(() => temp.remove());

/** Runs the CLI the way `npm run -s analyze -- …` does (tsx dsp/cli.ts). */
const cli = (...args: string[]) =>
  spawnSync(join(root, 'node_modules', '.bin', 'tsx'), ['dsp/cli.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });

// A 997 Hz sine swelling at 3 Hz: programme to measure (a steady sine alone would be a line-up tone, left out of loudness).
const swelling = sine(997, 0.5, 2, 48000).map((x, n) => x * (0.75 + 0.25 * Math.sin((2 * Math.PI * 3 * n) / 48000)));
const take = temp.write('take.wav', wavFile({ sampleRate: 48000, channels: 2, coding: 'pcm24' }, encodeSamples([swelling, swelling.slice()], 'pcm24')));

describe('command line', () => {
  it('--json prints exactly one JSON report and exits 0', () => {
    const run = cli(take, '--json');
    expect(run.status).toBe(0);
    expect(run.stdout.trim().split('\n')).toHaveLength(1);
    const report = JSON.parse(run.stdout);
    expect(report.file).toMatchObject({ container: 'RIFF', channels: 2, sampleRate: 48000, frames: 96000 });
    expect(Array.isArray(report.findings)).toBe(true);
    expect(report.stereo.identicalChannels).toBe(true);
  });

  it('prints a readable summary without --json', () => {
    const run = cli(take);
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/Integrated .* LUFS/);
    expect(run.stdout).toMatch(/Verdict: (PASS|WARN|FAIL)/);
  });

  it('applies a spec file', () => {
    const spec = temp.write('spec.json', JSON.stringify({ ...DEFAULT_SPEC, name: 'Needs 44.1', requiredSampleRate: 44100 }));
    const report = JSON.parse(cli(take, '--json', '--spec', spec).stdout);
    expect(report.findings.some((finding: { check: string; severity: string }) => finding.check === 'sample-rate' && finding.severity === 'fail')).toBe(true);
  });

  it('refuses an unreadable file with one line on stderr and exit 2', () => {
    const junk = temp.write('junk.wav', 'definitely not audio');
    const run = cli(junk, '--json');
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/not a WAV file/);
    expect(run.stderr).not.toMatch(/\s+at\s/);
  });

  it('refuses a missing file, a bad spec file and bad arguments with exit 2 and no stack trace', () => {
    const missing = cli(temp.path('nope.wav'));
    expect(missing.status).toBe(2);
    expect(missing.stderr).toMatch(/no such file/);
    const badJson = temp.write('bad.json', '{ not json');
    expect(cli(take, '--spec', badJson)).toMatchObject({ status: 2, stderr: expect.stringMatching(/not valid JSON/) });
    const badSpec = temp.write('bad-spec.json', JSON.stringify({ ...DEFAULT_SPEC, loudnessTargetLufs: 5 }));
    const invalid = cli(take, '--spec', badSpec);
    expect(invalid.status).toBe(2);
    expect(invalid.stderr).toMatch(/loudnessTargetLufs/);
    expect(cli().status).toBe(2);
    expect(cli(take, '--colour').stderr).toMatch(/Unknown option --colour/);
    for (const run of [invalid, missing]) expect(run.stderr).not.toMatch(/\s+at\s/);
  });
});
