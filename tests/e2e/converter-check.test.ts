import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { writeCheckSignalFile } from '@/dsp/converter/signalWriter';
import { db } from '@/lib/db/connection.server';
import { Recorder, User } from '@/models';
import { simulatedConverter } from '../support/converterAcceptance';
import { plantedValues, simulateRecording } from '../support/converterSimulation';
import { BASE_URL, launchBrowser, screenshot, signInAs } from '../support/browser';
import { tempDirectory } from '../support/tempFiles';

let browser: Browser;
const tag = Math.random().toString(36).slice(2, 6);
const LABEL = `Booth K interface ${tag}`;
const tmp = tempDirectory('takeproof-converter-e2e-');
let recorderId = 0;
let recording = '';
const converter = simulatedConverter({ bits: 24, gainsDb: [0, 0], noiseDbfs: -98, secondOrder: 0.00002, lowPass: { cutoffHz: 22_000, order: 8 }, clockPpm: 5, leadSec: 2, tailSec: 2, seed: 21 });

beforeAll(async () => {
  db();
  const manager = await User.findOne({ where: { email: 'manager@demo.test' } });
  const recorder = await Recorder.create({ studioId: manager!.studioId, label: LABEL, makeModel: `Wren 2x interface ${tag}`, serial: null, location: 'Booth K', notes: null, bextMatch: null });
  recorderId = recorder.id;
  const signal = tmp.path('signal.wav');
  await writeCheckSignalFile(signal, { sampleRate: 48_000, bitsPerSample: 24, channels: 2 });
  recording = tmp.path('booth-k-check.wav');
  await simulateRecording(signal, tmp.path, converter, recording);
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  tmp.remove();
  await db().close();
});

describe('a converter check in the browser', () => {
  it('takes an engineer from the recorder’s converter page through the upload to the result page', async () => {
    const context = await browser.newContext({ viewport: { width: 1400, height: 900 } });
    const page = await context.newPage();
    await signInAs(page, 'engineer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Converter checks' }).click();
    await page.getByRole('link', { name: LABEL }).click();
    await page.waitForURL(`${BASE_URL}/recorders/${recorderId}/converter`);

    // The caution stands beside the download, which is preset to 48 kHz, 24 bits, stereo (no takes yet).
    await expect(page.getByTestId('playback-caution').textContent()).resolves.toMatch(/line inputs.*not|never into monitors or headphones/);
    const download = page.getByRole('link', { name: 'Download the check signal' });
    await expect(download.getAttribute('href')).resolves.toBe(`/api/recorders/${recorderId}/converter-signal?rate=48000&bits=24&channels=2`);

    await page.getByLabel('Recording (WAV)').setInputFiles(recording);
    await page.waitForURL(/\/converter-checks\/\d+$/, { timeout: 60_000 });
    // The page refreshes itself until the worker has measured the recording.
    await page.getByTestId('level-reference').waitFor({ timeout: 150_000 });
    await expect(page.getByTestId('level-reference').textContent()).resolves.toContain('full-scale sine at 0 dB FS');
    await expect(page.getByTestId('response-plot').locator('canvas').count()).resolves.toBeGreaterThan(0);
    await expect(page.getByText('⚑ Baseline').first().isVisible()).resolves.toBe(true);
    const noiseRow = page.getByRole('row', { name: /^Idle noise \(dB FS\)/ });
    const cells = await noiseRow.getByRole('cell').allTextContents();
    // Two channels and the limit, each channel within the feature's 1.5 dB of the planted idle noise (AES17 band, computed from the converter's parameters).
    const planted = plantedValues(converter, 48_000, 24).noiseFloorDbfs;
    expect(cells).toHaveLength(3);
    for (const cell of cells.slice(0, 2)) expect(Math.abs(Number(cell.replace('−', '-')) - planted)).toBeLessThan(1.5);
    await screenshot(page, 'converter-check-result');

    // No baseline control for an engineer: that is a manager's choice.
    await expect(page.getByRole('button', { name: 'Make this check the baseline' }).count()).resolves.toBe(0);
    await context.close();
  });
});
