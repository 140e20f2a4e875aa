import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { tempDirectory } from '../../support/tempFiles';
import { sine } from '../../support/testSignals';
import { encodeSamples, wavFile } from '../../support/wavWriter';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const temp = tempDirectory();
afterAll(() => temp.remove());

const cli = (...args: string[]) => spawnSync(join(root, 'node_modules', '.bin', 'tsx'), ['dsp/cli.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 120_000 });

const stereo = temp.write('stereo.wav', wavFile({ sampleRate: 48000, channels: 2, coding: 'pcm24' }, encodeSamples([sine(997, 0.5, 3, 48000), sine(997, 0.25, 3, 48000)], 'pcm24')));
const mono = temp.write('mono.wav', wavFile({ sampleRate: 44100, channels: 1, coding: 'pcm16' }, encodeSamples([sine(440, 0.1, 2, 44100)], 'pcm16')));
const missing = temp.path('not-there.wav');

describe('command line, several files at once', () => {
  it('prints one JSON report per line in the order named, the same as one file at a time, and a line for a refused file', () => {
    const run = cli(stereo, missing, mono, '--json');
    expect(run.status).toBe(2);
    const lines = run.stdout.trim().split('\n').map((line) => JSON.parse(line));
    expect(lines).toHaveLength(3);
    expect(lines[0].file).toMatchObject({ channels: 2, sampleRate: 48000, frames: 3 * 48000 });
    expect(lines[1]).toEqual({ file: missing, refused: `Cannot open ${missing} (no such file).` });
    expect(lines[2].file).toMatchObject({ channels: 1, sampleRate: 44100, frames: 2 * 44100 });
    expect(run.stderr).toContain('no such file');
    for (const [index, file] of [[0, stereo], [2, mono]] as const) {
      const single = cli(file, '--json');
      expect(single.status).toBe(0);
      expect(lines[index]).toEqual(JSON.parse(single.stdout));
    }
  });
});
