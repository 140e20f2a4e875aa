import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeConverterCheckFile } from '../../../dsp/converter/analyzeCheck';
import type { ConverterReport } from '../../../dsp/converter/report';
import { writeCheckSignalFile } from '../../../dsp/converter/signalWriter';
import { simulatedConverter } from '../../support/converterAcceptance';
import { simulateRecording } from '../../support/converterSimulation';
import { tempDirectory } from '../../support/tempFiles';
import { ProgrammeGenerator } from '../../support/testSignals';
import { encodeSamples, wavFile } from '../../support/wavWriter';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const temp = tempDirectory();
afterAll(() => temp.remove());

/** Runs the CLI the way `npm run -s analyze -- …` does (tsx dsp/cli.ts). */
const cli = (...args: string[]) => spawnSync(join(root, 'node_modules', '.bin', 'tsx'), ['dsp/cli.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 120_000 });

describe('converter check on the command line', () => {
  it('refuses a recording without the check signal in one line, exit 2, no stack trace', () => {
    const programme = [new Float64Array(48000 * 12), new Float64Array(48000 * 12)];
    new ProgrammeGenerator(48000, 2, 4).fill(programme, programme[0].length);
    const take = temp.write('take.wav', wavFile({ sampleRate: 48000, channels: 2, coding: 'pcm24' }, encodeSamples(programme, 'pcm24')));
    const run = cli('--converter-check', take, '--json');
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/No converter check signal was found/);
    expect(run.stderr).not.toMatch(/\s+at\s/);
  });

  it('refuses a format it cannot write and options it does not know, with the usage', () => {
    const rate = cli('--make-converter-signal', temp.path('x.wav'), '--rate', '8000');
    expect(rate).toMatchObject({ status: 2, stderr: expect.stringMatching(/32000 to 192000 Hz/) });
    const unknown = cli('--converter-check', temp.path('x.wav'), '--loud');
    expect(unknown).toMatchObject({ status: 2, stderr: expect.stringMatching(/--loud is not an option[\s\S]*--make-converter-signal <out.wav>/) });
    const both = cli('--converter-check', 'a.wav', '--make-converter-signal', 'b.wav');
    expect(both).toMatchObject({ status: 2, stderr: expect.stringMatching(/not both/) });
  });

  it('judges a later check against a baseline report and a thresholds file', async () => {
    const signal = temp.path('signal.wav');
    await writeCheckSignalFile(signal, { sampleRate: 48000, bitsPerSample: 24, channels: 2 });
    const recordWithNoise = async (name: string, noiseDbfs: number) => {
      const path = temp.path(`${name}.wav`);
      await simulateRecording(signal, temp.path, simulatedConverter({ bits: 24, gainsDb: [0, 0], noiseDbfs, secondOrder: 0, lowPass: { cutoffHz: 21000, order: 8 }, clockPpm: 10, seed: noiseDbfs === -110 ? 1 : 2 }), path);
      return path;
    };
    const baseline = temp.write('baseline.json', JSON.stringify(await analyzeConverterCheckFile(await recordWithNoise('first', -110))));
    const later = await recordWithNoise('later', -104);
    const judged = (run: ReturnType<typeof cli>) => (JSON.parse(run.stdout) as ConverterReport).findings.filter((finding) => finding.basis === 'baseline' && finding.check === 'noise');

    // Noise 6 dB up: over the default 3 dB, under a model's 8 dB.
    expect(judged(cli('--converter-check', later, '--json', '--baseline', baseline)).map((finding) => finding.channel)).toEqual([0, 1]);
    const lenient = temp.write('thresholds.json', JSON.stringify({ noiseRiseDb: 8 }));
    expect(judged(cli('--converter-check', later, '--json', '--baseline', baseline, '--thresholds', lenient))).toEqual([]);
    const invalid = temp.write('bad-thresholds.json', JSON.stringify({ noiseRiseDb: -1 }));
    expect(cli('--converter-check', later, '--thresholds', invalid)).toMatchObject({ status: 2, stderr: expect.stringMatching(/thresholds file .* is not valid \(noiseRiseDb/) });
  });
});
