import { channelName, formatKhz } from '../format';
import type { ConverterChannelReport, ConverterFinding, ConverterReport, ConverterSeverity } from './report';
import type { ConverterThresholds } from './thresholds';

/** Dynamic range a check signal written at 16 bits can show at most, dB (TPDF dither, 20 Hz–20 kHz at 48 kHz: 94.1 dB). */
const SIXTEEN_BIT_SIGNAL_DR_DB = 94;

const db = (value: number, decimals = 1) => `${value > 0 ? '+' : value < 0 ? '−' : ''}${Math.abs(value).toFixed(decimals)}`;
const level = (value: number, decimals = 1) => `${db(value, decimals)} dB`;
const hz = (value: number) => (value >= 1000 ? formatKhz(Math.round(value / 10) * 10) : `${Math.round(value)} Hz`);

/**
 * Judges a converter report against thresholds and, when given, the recorder's baseline (its
 * first accepted check). Pure: reads only the two reports, so stored checks can be re-judged when
 * a manager edits the thresholds or accepts a new baseline.
 * @returns findings: how the check was made first, then limits per channel, then drift
 */
export function judgeConverterCheck(report: ConverterReport, baseline: ConverterReport | null, thresholds: ConverterThresholds): ConverterFinding[] {
  const findings: ConverterFinding[] = [];
  const count = report.channels.length;
  const name = (channel: number) => channelName(channel, count);
  const Name = (channel: number) => capitalise(name(channel));
  const add = (finding: ConverterFinding) => findings.push(finding);
  const limit = (check: ConverterFinding['check'], severity: ConverterSeverity, message: string, value: number | null, reference: number | null, channel?: number) =>
    add({ check, severity, basis: 'threshold', message, value, reference, ...(channel === undefined ? {} : { channel }) });

  // How the check was made.
  const { writtenSampleRate, writtenBits } = report.signal;
  if (writtenSampleRate !== null && writtenSampleRate !== report.file.sampleRate) {
    add({ check: 'signal', severity: 'info', basis: 'check', message: `The check signal was written at ${formatKhz(writtenSampleRate)} and recorded at ${formatKhz(report.file.sampleRate)}; the response is measured up to ${hz(report.bands.responseHz[1])}.` });
  }
  const bestRange = Math.max(...report.channels.map((channel) => channel.dynamicRangeDb ?? 0));
  if (writtenBits === 16 && report.file.bitsPerSample > 16 && bestRange > SIXTEEN_BIT_SIGNAL_DR_DB - 6) {
    add({ check: 'signal', severity: 'info', basis: 'check', message: `The check signal was written at 16 bits: its own dither limits the dynamic range it can show to about ${SIXTEEN_BIT_SIGNAL_DR_DB} dB. Write it at 24 bits to measure this recorder fully.` });
  }

  report.channels.forEach((channel, c) => {
    if (channel.clippedSamples > 0) {
      add({ check: 'overload', severity: 'fail', basis: 'check', channel: c, value: channel.clippedSamples, reference: 0, message: `The check signal reached full scale on the ${name(c)} (${channel.clippedSamples} samples): lower the playback level or the input gain by a few dB and record the check again.` });
    }
    if (channel.dead) {
      add({ check: 'dead-channel', severity: 'fail', basis: 'check', channel: c, message: `${Name(c)} carries no trace of the check signal: check the cable and the input.` });
    }
  });
  const live = report.channels.map((channel, c) => ({ channel, c })).filter(({ channel }) => !channel.dead);

  for (const { channel, c } of live) {
    if (channel.polarityInverted) limit('polarity', 'fail', `${Name(c)} is polarity-inverted: the recorded waveform is upside down.`, null, null, c);
  }
  if (report.clockErrorPpm !== null && Math.abs(report.clockErrorPpm) > thresholds.maxClockErrorPpm) {
    limit('clock', 'warn', `The recorder's clock is ${Math.abs(report.clockErrorPpm).toFixed(1)} ppm ${report.clockErrorPpm > 0 ? 'slow' : 'fast'} against the player's (limit ${thresholds.maxClockErrorPpm} ppm). If another player gives the same figure, the recorder's clock is off.`, report.clockErrorPpm, thresholds.maxClockErrorPpm);
  }
  for (const { channel, c } of live) {
    if (channel.gainDb !== null && Math.abs(channel.gainDb) > thresholds.maxGainErrorDb) {
      limit('gain', 'fail', `${Name(c)} records the −1 dB FS tone ${level(channel.gainDb, 2)} off its level (limit ±${thresholds.maxGainErrorDb} dB).`, channel.gainDb, thresholds.maxGainErrorDb, c);
    }
  }
  if (report.channelGainMismatchDb !== null && report.channelGainMismatchDb > thresholds.maxChannelGainMismatchDb) {
    limit('channel-balance', 'fail', `The channels' gains differ by ${report.channelGainMismatchDb.toFixed(2)} dB (limit ${thresholds.maxChannelGainMismatchDb} dB).`, report.channelGainMismatchDb, thresholds.maxChannelGainMismatchDb);
  }
  for (const { channel, c } of live) {
    if (c > 0 && channel.delaySamples !== null && Math.abs(channel.delaySamples) > thresholds.maxInterChannelDelaySamples) {
      const samples = Math.abs(channel.delaySamples);
      limit('delay', 'warn', `${Name(c)} is ${samples} sample${samples === 1 ? '' : 's'} ${channel.delaySamples > 0 ? 'later' : 'earlier'} than ${name(0)}.`, channel.delaySamples, thresholds.maxInterChannelDelaySamples, c);
    }
  }
  for (const { channel, c } of live) {
    judgeChannelLimits(channel, c, Name(c), thresholds, report.file.sampleRate, limit);
  }
  if (report.crosstalkDb !== null && report.crosstalkDb > thresholds.maxCrosstalkDb) {
    limit('crosstalk', 'fail', `Crosstalk reaches ${level(report.crosstalkDb)} between channels (limit ${level(thresholds.maxCrosstalkDb, 0)}).`, report.crosstalkDb, thresholds.maxCrosstalkDb);
  }

  if (!baseline) {
    add({ check: 'baseline', severity: 'info', basis: 'baseline', message: 'No baseline yet: once accepted, this check becomes the one later checks of this recorder are compared with.' });
    return findings;
  }
  if (baseline.file.sampleRate !== report.file.sampleRate || baseline.channels.length !== count) {
    add({ check: 'baseline', severity: 'info', basis: 'baseline', message: `The baseline was recorded at ${formatKhz(baseline.file.sampleRate)} with ${baseline.channels.length} channel(s); this check is at ${formatKhz(report.file.sampleRate)} with ${count}, so they were not compared.` });
    return findings;
  }
  judgeDrift(report, baseline, thresholds, Name, add);
  return findings;
}

type LimitFinding = (check: ConverterFinding['check'], severity: ConverterSeverity, message: string, value: number | null, reference: number | null, channel?: number) => void;

function judgeChannelLimits(channel: ConverterChannelReport, c: number, Name: string, thresholds: ConverterThresholds, sampleRate: number, limit: LimitFinding): void {
  const thdn = channel.thdnDb.minus1;
  if (thdn !== null && thdn > thresholds.maxThdnDb) {
    limit('distortion', 'fail', `${Name} has ${level(thdn)} THD+N at −1 dB FS (limit ${level(thresholds.maxThdnDb, 0)}).`, thdn, thresholds.maxThdnDb, c);
  }
  if (channel.enobBits !== null && channel.enobBits < thresholds.minEnobBits) {
    limit('resolution', 'fail', `${Name} resolves ${channel.enobBits.toFixed(1)} effective bits (fewest allowed ${thresholds.minEnobBits}).`, channel.enobBits, thresholds.minEnobBits, c);
  }
  if (channel.dynamicRangeDb !== null && channel.dynamicRangeDb < thresholds.minDynamicRangeDb) {
    limit('dynamic-range', 'fail', `${Name} has ${channel.dynamicRangeDb.toFixed(1)} dB dynamic range (at least ${thresholds.minDynamicRangeDb} dB expected).`, channel.dynamicRangeDb, thresholds.minDynamicRangeDb, c);
  }
  if (channel.noiseFloorDbfs !== null && channel.noiseFloorDbfs > thresholds.maxNoiseFloorDbfs) {
    limit('noise', 'fail', `${Name} idles at ${level(channel.noiseFloorDbfs)} FS of noise (limit ${level(thresholds.maxNoiseFloorDbfs, 0)} FS).`, channel.noiseFloorDbfs, thresholds.maxNoiseFloorDbfs, c);
  }
  if (channel.passbandDeviationDb !== null && channel.passbandDeviationDb > thresholds.maxPassbandDeviationDb) {
    limit('response', 'fail', `${Name}'s frequency response strays ${channel.passbandDeviationDb.toFixed(2)} dB from flat in the audio band (limit ±${thresholds.maxPassbandDeviationDb} dB).`, channel.passbandDeviationDb, thresholds.maxPassbandDeviationDb, c);
  }
  const minEdge = Math.min(thresholds.minBandEdgeHz, 0.45 * sampleRate);
  if (channel.bandEdgeHz !== null && channel.bandEdgeHz < minEdge) {
    limit('band-edge', 'fail', `${Name}'s response is 3 dB down at ${hz(channel.bandEdgeHz)} (at least ${hz(minEdge)} expected).`, channel.bandEdgeHz, minEdge, c);
  }
}

function judgeDrift(report: ConverterReport, baseline: ConverterReport, thresholds: ConverterThresholds, Name: (channel: number) => string, add: (finding: ConverterFinding) => void): void {
  const drift = (check: ConverterFinding['check'], message: string, value: number | null, reference: number | null, channel?: number) =>
    add({ check, severity: 'warn', basis: 'baseline', message, value, reference, ...(channel === undefined ? {} : { channel }) });
  if (report.clockErrorPpm !== null && baseline.clockErrorPpm !== null && Math.abs(report.clockErrorPpm - baseline.clockErrorPpm) >= thresholds.clockDriftPpm) {
    drift('clock', `The clock error moved from ${db(baseline.clockErrorPpm)} to ${db(report.clockErrorPpm)} ppm since the baseline (same player assumed).`, report.clockErrorPpm, baseline.clockErrorPpm);
  }
  report.channels.forEach((now, c) => {
    const then = baseline.channels[c];
    if (now.dead || then.dead) return;
    const rise = (a: number | null, b: number | null) => (a !== null && b !== null ? a - b : null);
    const noiseRise = rise(now.noiseFloorDbfs, then.noiseFloorDbfs);
    if (noiseRise !== null && noiseRise >= thresholds.noiseRiseDb) {
      drift('noise', `${Name(c)}'s idle noise rose ${noiseRise.toFixed(1)} dB since the baseline (${level(then.noiseFloorDbfs!)} → ${level(now.noiseFloorDbfs!)} FS).`, now.noiseFloorDbfs, then.noiseFloorDbfs, c);
    }
    const enobDrop = rise(then.enobBits, now.enobBits);
    if (enobDrop !== null && enobDrop >= thresholds.enobDropBits) {
      drift('resolution', `${Name(c)} lost ${enobDrop.toFixed(2)} effective bits since the baseline (${then.enobBits!.toFixed(2)} → ${now.enobBits!.toFixed(2)}).`, now.enobBits, then.enobBits, c);
    }
    const rangeDrop = rise(then.dynamicRangeDb, now.dynamicRangeDb);
    if (rangeDrop !== null && rangeDrop >= thresholds.dynamicRangeDropDb) {
      drift('dynamic-range', `${Name(c)}'s dynamic range fell ${rangeDrop.toFixed(1)} dB since the baseline (${then.dynamicRangeDb!.toFixed(1)} → ${now.dynamicRangeDb!.toFixed(1)} dB).`, now.dynamicRangeDb, then.dynamicRangeDb, c);
    }
    const thdnRise = rise(now.thdnDb.minus1, then.thdnDb.minus1);
    if (thdnRise !== null && thdnRise >= thresholds.thdnRiseDb) {
      drift('distortion', `${Name(c)}'s THD+N at −1 dB FS rose ${thdnRise.toFixed(1)} dB since the baseline (${level(then.thdnDb.minus1!)} → ${level(now.thdnDb.minus1!)}).`, now.thdnDb.minus1, then.thdnDb.minus1, c);
    }
    const gainChange = rise(now.gainDb, then.gainDb);
    if (gainChange !== null && Math.abs(gainChange) >= thresholds.gainDriftDb) {
      drift('gain', `${Name(c)}'s gain moved ${level(gainChange, 2)} since the baseline.`, now.gainDb, then.gainDb, c);
    }
    judgeEdgeDrift(now.bandEdgeHz, then.bandEdgeHz, thresholds.bandEdgeShiftPercent, (message) => drift('band-edge', message, now.bandEdgeHz, then.bandEdgeHz, c), Name(c));
    if (now.polarityInverted !== null && then.polarityInverted !== null && now.polarityInverted !== then.polarityInverted) {
      drift('polarity', `${Name(c)}'s polarity changed since the baseline.`, null, null, c);
    }
    if (c > 0 && now.delaySamples !== null && then.delaySamples !== null && now.delaySamples !== then.delaySamples) {
      drift('delay', `${Name(c)}'s delay against ${Name(0).toLowerCase()} changed from ${then.delaySamples} to ${now.delaySamples} samples since the baseline.`, now.delaySamples, then.delaySamples, c);
    }
  });
  if (report.crosstalkDb !== null && baseline.crosstalkDb !== null && report.crosstalkDb - baseline.crosstalkDb >= thresholds.crosstalkRiseDb) {
    drift('crosstalk', `Crosstalk rose ${(report.crosstalkDb - baseline.crosstalkDb).toFixed(1)} dB since the baseline (${level(baseline.crosstalkDb)} → ${level(report.crosstalkDb)}).`, report.crosstalkDb, baseline.crosstalkDb);
  }
}

function judgeEdgeDrift(now: number | null, then: number | null, percent: number, report: (message: string) => void, Name: string): void {
  if (now !== null && then !== null) {
    const shift = (100 * (now - then)) / then;
    if (Math.abs(shift) >= percent) report(`${Name}'s upper −3 dB point moved from ${hz(then)} to ${hz(now)} (${db(shift)} %) since the baseline.`);
  } else if (now !== null && then === null) {
    report(`${Name}'s response now falls 3 dB at ${hz(now)}; at the baseline it stayed flat to the top of the measured band.`);
  } else if (now === null && then !== null) {
    report(`${Name}'s response now stays flat to the top of the measured band; at the baseline it fell 3 dB at ${hz(then)}.`);
  }
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
