/**
 * Benchmark: converter-check analysis time and peak memory. Each recording is made once under
 * var/bench/converter/: the check signal through a simulated converter with seconds of noise
 * around it (typical rates and channel counts), or the check signal as written (many channels at
 * 96 kHz, where the simulation itself would need gigabytes). Each analysis runs in a child process
 * of its own, which reports its wall time, CPU time and peak RSS.
 *
 *   npm run bench:converter
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { loadavg } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeConverterCheckFile } from '../dsp/converter/analyzeCheck';
import { writeCheckSignalFile, type CheckSignalFormat } from '../dsp/converter/signalWriter';
import { simulateRecording } from '../tests/support/converterSimulation';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const folder = join(root, 'var', 'bench', 'converter');

interface BenchCase {
  format: CheckSignalFormat;
  /** Through the simulated converter (true) or as written (false). */
  simulated: boolean;
}

const cases: BenchCase[] = [
  { format: { sampleRate: 44100, bitsPerSample: 16, channels: 2 }, simulated: true },
  { format: { sampleRate: 48000, bitsPerSample: 24, channels: 2 }, simulated: true },
  { format: { sampleRate: 96000, bitsPerSample: 24, channels: 2 }, simulated: true },
  { format: { sampleRate: 96000, bitsPerSample: 24, channels: 8 }, simulated: false },
  { format: { sampleRate: 96000, bitsPerSample: 24, channels: 16 }, simulated: false },
];

async function recording({ format, simulated }: BenchCase): Promise<string> {
  const name = `${format.sampleRate}-${format.bitsPerSample}-${format.channels}`;
  const signal = join(folder, `signal-${name}.wav`);
  const recorded = join(folder, `recording-${name}.wav`);
  if (!existsSync(signal)) await writeCheckSignalFile(signal, format);
  if (!simulated) return signal;
  if (!existsSync(recorded)) {
    const channels = format.channels;
    await simulateRecording(signal, (file) => join(folder, file), {
      bits: format.bitsPerSample === 16 ? 16 : 24, gainsDb: Array(channels).fill(-0.2), inverted: Array(channels).fill(false),
      lowPass: { cutoffHz: 0.42 * format.sampleRate, order: 6 }, noiseDbfs: -95, secondOrder: 0.0005,
      crosstalk: [{ from: 0, into: 1, db: -90 }], delaySamples: Array(channels).fill(0), clockPpm: 40, leadSec: 5, tailSec: 5, seed: 9,
    }, recorded);
  }
  return recorded;
}

async function child(path: string): Promise<void> {
  const started = performance.now();
  await analyzeConverterCheckFile(path);
  const usage = process.resourceUsage();
  process.stdout.write(JSON.stringify({ wallSec: (performance.now() - started) / 1000, cpuSec: (usage.userCPUTime + usage.systemCPUTime) / 1e6, peakRssMb: usage.maxRSS / 1024 }));
}

async function main(): Promise<void> {
  mkdirSync(folder, { recursive: true });
  console.log(`load average ${loadavg().map((v) => v.toFixed(1)).join(' ')}`);
  console.log('recording                          MB    analysis s   CPU s   peak RSS MB');
  for (const benchCase of cases) {
    const path = await recording(benchCase);
    const run = spawnSync(join(root, 'node_modules', '.bin', 'tsx'), [fileURLToPath(import.meta.url), '--child', path], { cwd: root, encoding: 'utf8' });
    if (run.status !== 0) throw new Error(`analysis of ${path} failed: ${run.stderr}`);
    const figures = JSON.parse(run.stdout) as { wallSec: number; cpuSec: number; peakRssMb: number };
    const { format, simulated } = benchCase;
    const label = `${format.sampleRate / 1000} kHz ${format.bitsPerSample}-bit ${format.channels} ch${simulated ? ' (converter)' : ' (as written)'}`;
    console.log(`${label.padEnd(34)} ${(statSync(path).size / 1e6).toFixed(0).padStart(4)}   ${figures.wallSec.toFixed(2).padStart(8)}   ${figures.cpuSec.toFixed(2).padStart(5)}   ${figures.peakRssMb.toFixed(0).padStart(6)}`);
  }
}

if (process.argv[2] === '--child') await child(process.argv[3]);
else await main();
