import { spawnSync } from 'node:child_process';

/** Integrated loudness, loudness range and true peak as ffmpeg's ebur128 filter prints them after "Summary:". */
export interface FfmpegLoudness {
  integratedLufs: number;
  rangeLu: number;
  truePeakDbfs: number;
}

/** Runs `ffmpeg -af ebur128=peak=true` on a file and parses its summary; throws when ffmpeg fails. */
export function ffmpegEbur128(path: string): FfmpegLoudness {
  const run = spawnSync('ffmpeg', ['-hide_banner', '-nostats', '-i', path, '-af', 'ebur128=peak=true', '-f', 'null', '-'], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`ffmpeg exited with ${run.status}: ${run.stderr.slice(-500)}`);
  const summary = run.stderr.slice(run.stderr.lastIndexOf('Summary:'));
  const number = (pattern: RegExp) => {
    const match = pattern.exec(summary);
    if (!match) throw new Error(`ffmpeg summary lacks ${pattern}: ${summary}`);
    return Number(match[1]);
  };
  return { integratedLufs: number(/I:\s+(-?[\d.]+) LUFS/), rangeLu: number(/LRA:\s+(-?[\d.]+) LU/), truePeakDbfs: number(/Peak:\s+(-?[\d.]+) dBFS/) };
}

/** `sox X -n stats` figures: the value columns of each row (Overall, then one per channel). */
export function soxStats(path: string): Map<string, string[]> {
  const run = spawnSync('sox', [path, '-n', 'stats'], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`sox exited with ${run.status}: ${run.stderr}`);
  const rows = new Map<string, string[]>();
  for (const line of run.stderr.split('\n')) {
    const match = /^(\S.*?\S)\s{2,}(.*)$/.exec(line.trimEnd());
    if (match) rows.set(match[1], match[2].trim().split(/\s+/));
  }
  return rows;
}

/** `soxi` (sox --info) figures of a file: sample rate, bits per sample, channels and length in seconds. */
export function soxInfo(path: string): { rate: number; bits: number; channels: number; seconds: number } {
  const field = (flag: string) => {
    const run = spawnSync('sox', ['--info', flag, path], { encoding: 'utf8' });
    if (run.status !== 0) throw new Error(`sox --info exited with ${run.status}: ${run.stderr}`);
    return Number(run.stdout.trim());
  };
  return { rate: field('-r'), bits: field('-b'), channels: field('-c'), seconds: field('-D') };
}
