import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkSignalWav } from '@/dsp/converter/signalWriter';
import type { ConverterReport } from '@/dsp/converter/report';
import { DEFAULT_CONVERTER_THRESHOLDS } from '@/dsp/converter/thresholds';
import { db } from '@/lib/db/connection.server';
import type { ConverterCheckDetail, RecorderChecksView } from '@/lib/converterChecks/views';
import type { FleetAlert } from '@/lib/fleet/alerts';
import type { FleetRow } from '@/lib/fleet/views';
import { ConverterCheck, User } from '@/models';
import { simulatedConverter } from '../support/converterAcceptance';
import { plantedValues, simulateRecording, type SimulatedConverter } from '../support/converterSimulation';
import { BASE_URL, signedInAll, type Client, type DemoPerson } from '../support/http';
import { soxInfo } from '../support/referenceTools';
import { makeWav } from '../support/takes';
import { tempDirectory } from '../support/tempFiles';

/**
 * The converter check through the product: the recorder's signal download, an upload of a
 * recording made through a simulated converter (tests/support/converterSimulation.ts), the
 * measurement by the worker, the history, the fleet table and its alerts.
 */
let as: Record<DemoPerson | 'anonymous', Client>;
const tmp = tempDirectory('takeproof-converter-');
const unique = () => Math.random().toString(36).slice(2, 8);
const RATE = 48_000;
// State-changing requests name the app's own origin, as the browser does.
const origin = { origin: BASE_URL };

// A quiet converter, then the same converter 10 dB noisier: the noise drift the fleet must flag.
// Mild enough that every other figure stays put between the two (distortion far below the noise).
const steady = simulatedConverter({ bits: 24, gainsDb: [0, -0.1], noiseDbfs: -100, secondOrder: 0.00002, lowPass: { cutoffHz: 23_000, order: 8 }, clockPpm: 10, leadSec: 2, tailSec: 2, seed: 11 });
const noisier: SimulatedConverter = { ...steady, noiseDbfs: -90, seed: 12 };

let recorderId = 0;
let signalPath = '';

async function recordingThrough(converter: SimulatedConverter, name: string): Promise<Blob> {
  const out = tmp.path(name);
  await simulateRecording(signalPath, tmp.path, converter, out);
  return new Blob([new Uint8Array(readFileSync(out))], { type: 'audio/wav' });
}

async function uploadCheck(client: Client, id: number, file: Blob, name: string) {
  const form = new FormData();
  form.append('file', file, name);
  const response = await client.fetch(`/api/recorders/${id}/converter-checks`, { method: 'POST', body: form, headers: origin });
  return { status: response.status, body: await response.json() };
}

/** Polls a check until it leaves the queue (a bounded wait on a condition, never a fixed time). */
async function waitForCheck(client: Client, id: number, timeoutMs = 150_000): Promise<ConverterCheckDetail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const check = (await (await client.fetch(`/api/converter-checks/${id}`)).json()) as ConverterCheckDetail;
    if (check.status === 'measured' || check.status === 'unreadable') return check;
    if (Date.now() > until) throw new Error(`Converter check ${id} still ${check.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

async function fleetRow(id: number): Promise<FleetRow> {
  const body = (await (await as.manager.fetch('/api/fleet?days=30')).json()) as { recorders: FleetRow[] };
  return body.recorders.find((r) => r.id === id)!;
}

async function alertsOf(id: number): Promise<FleetAlert[]> {
  return (await fleetRow(id)).alerts;
}

beforeAll(async () => {
  db();
  as = await signedInAll();
  const created = await as.manager.fetch('/api/recorders', { method: 'POST', json: { label: `Converter test ${unique()}`, makeModel: `Test converter model ${unique()}` }, headers: origin });
  recorderId = (await created.json()).id;
});
afterAll(async () => {
  tmp.remove();
  await db().close();
});

describe('converter check signal download', () => {
  it('streams the engine’s check signal at the asked format; sox reads the header it promises', async () => {
    const response = await as.engineer.fetch(`/api/recorders/${recorderId}/converter-signal?rate=${RATE}&bits=24&channels=2`);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('audio/wav');
    expect(response.headers.get('content-disposition')).toMatch(/^attachment; filename="takeproof-converter-check-48000-24bit-2ch\.wav"$/);
    const bytes = Buffer.from(await response.arrayBuffer());
    expect(bytes.equals(checkSignalWav({ sampleRate: RATE, bitsPerSample: 24, channels: 2 }))).toBe(true);
    signalPath = tmp.write('signal.wav', bytes);
    // sox as the outside reader: 48 kHz, 24 bits, 2 channels, 28 s for stereo (dsp/converter/README.md layout).
    const info = soxInfo(signalPath);
    expect(info).toEqual({ rate: 48000, bits: 24, channels: 2, seconds: 28 });
  });

  it('defaults to 48 kHz, 24 bits, stereo for a recorder without measured takes', async () => {
    const response = await as.manager.fetch(`/api/recorders/${recorderId}/converter-signal`);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-disposition')).toContain('48000-24bit-2ch');
    await response.arrayBuffer();
  });

  it('refuses a format the signal cannot be written at, with the reason', async () => {
    const response = await as.engineer.fetch(`/api/recorders/${recorderId}/converter-signal?rate=8000`);
    expect(response.status).toBe(400);
    expect((await response.json()).fields.rate[0]).toMatch(/32 000 Hz or more/);
  });
});

describe('converter checks through the recorder’s page', () => {
  let first: ConverterCheckDetail;
  let second: ConverterCheckDetail;

  it('measures an uploaded check through the job queue, makes it the baseline and lists it in the history and the fleet', async () => {
    expect(signalPath).not.toBe('');
    const { status, body } = await uploadCheck(as.engineer, recorderId, await recordingThrough(steady, 'steady.wav'), 'booth-check-1.wav');
    expect(status).toBe(201);
    // A worker may claim it before the answer is written: anything but a refusal.
    expect(['queued', 'measuring', 'measured']).toContain(body.status);
    first = await waitForCheck(as.engineer, body.id);
    expect(first.status).toBe('measured');
    // The first acceptable check of a recorder is its baseline.
    expect(first.isBaseline).toBe(true);
    const report = first.report!;
    expect(report.levelReference).toMatch(/full-scale sine reads 0 dB FS/);
    // The planted gains come back within the feature's 0.1 dB (values computed from the converter's parameters alone).
    const planted = plantedValues(steady, RATE, 24);
    report.channels.forEach((c, i) => expect(Math.abs(c.gainDb! - planted.gainDb[i])).toBeLessThan(0.1));

    const history = (await (await as.engineer.fetch(`/api/recorders/${recorderId}/converter-checks`)).json()) as RecorderChecksView;
    expect(history.checks.map((c) => c.id)).toEqual([first.id]);
    expect(history.checks[0].isBaseline).toBe(true);

    const row = await fleetRow(recorderId);
    expect(row.converterCheck).toMatchObject({ checkId: first.id, drifted: false, overdue: false, state: first.state });
    // Checks stay out of the production takes' statistics.
    expect(row.takes).toBe(0);
    expect(row.alerts.filter((a) => a.kind.startsWith('converter-'))).toEqual([]);
  });

  it('flags a second check whose noise rose against the baseline, in the check and as a fleet alert', async () => {
    const { status, body } = await uploadCheck(as.engineer, recorderId, await recordingThrough(noisier, 'noisier.wav'), 'booth-check-2.wav');
    expect(status).toBe(201);
    second = await waitForCheck(as.engineer, body.id);
    expect(second.status).toBe('measured');
    expect(second.isBaseline).toBe(false);
    expect(second.baseline?.id).toBe(first.id);

    // The planted rise, from the two converters' parameters, is far beyond the 3 dB drift threshold (issue 13's example, [common practice]).
    const rise = plantedValues(noisier, RATE, 24).noiseFloorDbfs - plantedValues(steady, RATE, 24).noiseFloorDbfs;
    expect(rise).toBeGreaterThan(DEFAULT_CONVERTER_THRESHOLDS.noiseRiseDb + 3);
    const now = second.report as ConverterReport;
    const then = first.report as ConverterReport;
    now.channels.forEach((c, i) => expect(Math.abs(c.noiseFloorDbfs! - then.channels[i].noiseFloorDbfs! - rise)).toBeLessThan(1.5));
    const noiseDrift = now.findings.filter((f) => f.basis === 'baseline' && f.check === 'noise');
    expect(noiseDrift.map((f) => f.channel).sort()).toEqual([0, 1]);
    expect(second.drift.length).toBeGreaterThan(0);

    const history = (await (await as.manager.fetch(`/api/recorders/${recorderId}/converter-checks`)).json()) as RecorderChecksView;
    expect(history.checks.map((c) => c.id)).toEqual([second.id, first.id]);

    const row = await fleetRow(recorderId);
    expect(row.converterCheck).toMatchObject({ checkId: second.id, drifted: true });
    const drift = row.alerts.find((a) => a.kind === 'converter-drift');
    expect(drift?.message).toContain(noiseDrift[0].message);
  });

  it('lets a manager make the later check the baseline, which ends the drift alert', async () => {
    const refused = await as.engineer.fetch(`/api/converter-checks/${second.id}/baseline`, { method: 'POST', headers: origin });
    expect(refused.status).toBe(403);
    const made = await as.manager.fetch(`/api/converter-checks/${second.id}/baseline`, { method: 'POST', headers: origin });
    expect(made.status).toBe(200);
    expect((await made.json()).isBaseline).toBe(true);
    const history = (await (await as.manager.fetch(`/api/recorders/${recorderId}/converter-checks`)).json()) as RecorderChecksView;
    expect(history.checks.map((c) => [c.id, c.isBaseline])).toEqual([
      [second.id, true],
      [first.id, false],
    ]);
    expect(history.checks[0].drift).toEqual([]);
    expect((await alertsOf(recorderId)).filter((a) => a.kind === 'converter-drift')).toEqual([]);
  });

  it('re-judges the model’s checks when a manager tightens its thresholds', async () => {
    // An idle-noise limit 3 dB below what the current baseline measured: it now fails on its own limit.
    const noisiest = Math.max(...(second.report as ConverterReport).channels.map((c) => c.noiseFloorDbfs!));
    const thresholds = { ...DEFAULT_CONVERTER_THRESHOLDS, maxNoiseFloorDbfs: Math.floor(noisiest) - 3 };
    const engineer = await as.engineer.fetch(`/api/recorders/${recorderId}/converter-thresholds`, { method: 'PUT', json: { thresholds }, headers: origin });
    expect(engineer.status).toBe(403);
    const saved = await as.manager.fetch(`/api/recorders/${recorderId}/converter-thresholds`, { method: 'PUT', json: { thresholds }, headers: origin });
    expect(saved.status).toBe(200);
    expect((await saved.json()).thresholdsAreDefault).toBe(false);
    const check = (await (await as.manager.fetch(`/api/converter-checks/${second.id}`)).json()) as ConverterCheckDetail;
    expect(check.state).toBe('fail');
    expect(check.report!.findings.filter((f) => f.check === 'noise' && f.basis === 'threshold').map((f) => f.channel).sort()).toEqual([0, 1]);
  });

  it('ends a recording without the check signal as unreadable, with the engine’s reason', async () => {
    const noise = new Blob([new Uint8Array(makeWav({ seconds: 3, seed: 1313 }))], { type: 'audio/wav' });
    const { status, body } = await uploadCheck(as.manager, recorderId, noise, 'not-a-check.wav');
    expect(status).toBe(201);
    const check = await waitForCheck(as.manager, body.id);
    expect(check.status).toBe('unreadable');
    expect(check.error).toMatch(/check signal/i);
  });
});

describe('overdue converter checks', () => {
  it('raises an alert when a recorder’s latest check is older than the studio’s interval', async () => {
    const made = await as.manager.fetch('/api/recorders', { method: 'POST', json: { label: `Converter overdue ${unique()}`, makeModel: `Overdue model ${unique()}` }, headers: origin });
    const id = (await made.json()).id;
    const view = (await (await as.manager.fetch(`/api/recorders/${id}/converter-checks`)).json()) as RecorderChecksView;
    const manager = await User.findOne({ where: { email: 'manager@demo.test' } });
    const stored = await ConverterCheck.findOne({ where: { recorderId }, order: [['id', 'ASC']] });
    // A check measured longer ago than the interval: copied from a real measurement, moved back in time.
    const measuredAt = new Date(Date.now() - (view.intervalDays + 20) * 86_400_000);
    await ConverterCheck.create({
      studioId: manager!.studioId,
      recorderId: id,
      uploadedById: manager!.id,
      originalName: 'old-check.wav',
      storageKey: `converter-checks/test/${unique()}-${id}.wav`,
      bytes: 1,
      sha256: '0'.repeat(64),
      status: 'measured',
      report: stored!.report,
      state: stored!.state,
      isBaseline: true,
      measuredAt,
    });
    const alerts = await alertsOf(id);
    expect(alerts.map((a) => a.kind)).toContain('converter-overdue');
    expect((await fleetRow(id)).converterCheck).toMatchObject({ overdue: true });
  });
});
