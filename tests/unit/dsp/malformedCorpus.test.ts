import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeStream } from '@/dsp/pipeline';
import { UnreadableWavError } from '@/dsp/reader/UnreadableWavError';
import { malformedCorpus } from '../../support/malformedWavs';

const PER_FILE_LIMIT_MS = 10_000;
const corpus = malformedCorpus();
const dir = mkdtempSync(path.join(os.tmpdir(), 'takeproof-malformed-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function analyzeBounded(bytes: Buffer) {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`no answer within ${PER_FILE_LIMIT_MS} ms`)), PER_FILE_LIMIT_MS);
  });
  try {
    return await Promise.race([analyzeStream(Readable.from([bytes]), { totalBytes: bytes.length, reopenAt: (offset) => Readable.from([bytes.subarray(offset)]) }), timeout]);
  } finally {
    clearTimeout(timer);
  }
}

describe('damaged and hostile WAV files', () => {
  it('has a corpus that covers every header byte and the impossible formats', () => {
    expect(corpus.length).toBeGreaterThan(90);
  });

  for (const { name, bytes } of corpus) {
    it(`${name}: gives a complete report or a one-line refusal, in bounded time`, async () => {
      try {
        const report = await analyzeBounded(bytes);
        // A report must be whole: every part of the contract present.
        for (const key of ['file', 'channels', 'resolution', 'peak', 'clipping', 'loudness', 'noise', 'bandwidth', 'dropouts', 'findings']) expect(report).toHaveProperty(key);
        expect(report.file.channels).toBeGreaterThan(0);
        expect(report.channels).toHaveLength(report.file.channels);
        expect(Number.isFinite(report.file.durationSec)).toBe(true);
        expect(JSON.parse(JSON.stringify(report)).file.frames).toBe(report.file.frames);
      } catch (error) {
        expect(error).toBeInstanceOf(UnreadableWavError);
        const message = (error as Error).message;
        expect(message.length).toBeGreaterThan(10);
        expect(message.length).toBeLessThan(300);
        expect(message).not.toMatch(/\n/);
      }
    });
  }

  it('the command line refuses unreadable files with exit code 2 and one line on stderr, no stack trace', () => {
    const refusals = ['truncated-at-20', 'no-fmt', 'channels-zero', 'adpcm', 'random-bytes-3', 'fmt-size-runs-off-end'];
    for (const name of refusals) {
      const file = path.join(dir, `${name}.wav`);
      writeFileSync(file, corpus.find((c) => c.name === name)!.bytes);
      const run = spawnSync(process.execPath, ['--import', 'tsx', 'dsp/cli.ts', file, '--json'], { encoding: 'utf8', timeout: 30_000 });
      expect(run.status, `${name}: ${run.stderr}`).toBe(2);
      expect(run.stdout).toBe('');
      const lines = run.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(run.stderr).not.toMatch(/\bat .*:\d+:\d+/);
    }
  });
});
