import type { DeliverySpec } from './spec';
import { channelName as positionName, formatClock, formatKhz, plural } from './format';
import type { AnalysisReport, Finding, Severity } from './types';

/** A DC offset this many times the spec's limit fails instead of warning [common practice]. */
const DC_FAIL_FACTOR = 10;
/** Shortest take whose channels can be compared for polarity (one 5 s segment), seconds. */
const POLARITY_MIN_SEC = 5;
/**
 * Signal-to-noise ratio (programme over the floor of its quiet passages) under which a take warns or fails, dB.
 * Defaults of the engine [common practice: speech for broadcast wants 40 dB or more; under 15 dB the noise is
 * heard under every word]; a delivery's own spec takes precedence where it says otherwise.
 */
const SNR_WARN_DB = 25;
const SNR_FAIL_DB = 15;
/** Dropouts and clip events spelled out one by one before the rest are summed up. */
const LISTED_EVENTS = 5;

const db = (value: number, decimals = 1) => value.toFixed(decimals);

/**
 * Judges a stored report against a delivery spec. Pure: reads only the report
 * (never the audio), so stored reports can be re-judged when the spec changes.
 * @returns findings in a stable order (container and format first, then level, then content)
 */
export function judgeReport(report: AnalysisReport, spec: DeliverySpec): Finding[] {
  const findings: Finding[] = [];
  const add = (finding: Finding) => findings.push(finding);
  const channelCount = report.file.channels;
  const strict: Severity = spec.loudnessIsStrict ? 'fail' : 'warn';
  const poly = report.file.layout === 'poly';
  const channelName = (channel: number) => positionName(channel, channelCount, { name: report.channels[channel]?.name ?? null, isTrack: poly });

  // container
  for (const issue of report.file.headerIssues ?? []) add({ check: 'container', severity: 'warn', message: issue });

  // format and sample rate
  const { bitsPerSample, encoding, sampleRate } = report.file;
  const formatName = encoding === 'float' ? `${bitsPerSample}-bit float` : `${bitsPerSample}-bit`;
  if (spec.requiredBitDepth !== null && (bitsPerSample !== spec.requiredBitDepth || (encoding === 'float' && spec.requiredBitDepth !== 32))) {
    add({ check: 'format', severity: 'fail', message: `The file is ${formatName}; the delivery asks for ${spec.requiredBitDepth}-bit.` });
  }
  if (encoding === 'pcm' && bitsPerSample === 8) {
    add({ check: 'format', severity: 'warn', message: 'The file is 8-bit: far too coarse for studio work.' });
  }
  if (spec.requiredSampleRate !== null && sampleRate !== spec.requiredSampleRate) {
    add({ check: 'sample-rate', severity: 'fail', message: `The take is ${formatKhz(sampleRate)}; the delivery asks for ${formatKhz(spec.requiredSampleRate)}.` });
  }
  if (report.bandwidth.impliedSourceRate !== null && report.bandwidth.effectiveHz !== null) {
    add({
      check: 'sample-rate',
      severity: 'warn',
      message: `The audio stops at ${formatKhz(report.bandwidth.effectiveHz)}: it was probably made at ${formatKhz(report.bandwidth.impliedSourceRate)} and converted up to ${formatKhz(sampleRate)}.`,
    });
  }
  if (report.tone?.likelyRecordedRate) {
    // The take plays at the wrong speed and pitch until its header is corrected.
    add({
      check: 'sample-rate',
      severity: 'fail',
      message: `The line-up tone reads ${db(report.tone.frequencyHz, 1)} Hz; the take was probably recorded at ${formatKhz(report.tone.likelyRecordedRate)} and is labelled ${formatKhz(sampleRate)}.`,
      startSec: report.tone.startSec,
      endSec: report.tone.endSec,
    });
  }

  // resolution
  const { effectiveBits, noiseLimitedBits } = report.resolution;
  const anySignal = report.channels.some((channel) => !channel.silent);
  if (anySignal && encoding === 'pcm' && effectiveBits > 0 && effectiveBits < bitsPerSample) {
    add({
      check: 'resolution',
      severity: effectiveBits < spec.minEffectiveBits ? 'fail' : 'info',
      message: `Only ${effectiveBits} of ${bitsPerSample} bits carry audio: the recorder was likely set to ${effectiveBits}-bit.`,
    });
  } else if (anySignal && encoding === 'float' && effectiveBits > 0 && effectiveBits <= 24) {
    add({
      check: 'resolution',
      severity: effectiveBits < spec.minEffectiveBits ? 'fail' : 'info',
      message: `The float file holds ${effectiveBits}-bit audio (every sample sits on the ${effectiveBits}-bit grid).`,
    });
  } else if (anySignal && effectiveBits > 0 && effectiveBits < spec.minEffectiveBits) {
    add({ check: 'resolution', severity: 'fail', message: `The take uses ${effectiveBits} bits; the delivery asks for at least ${spec.minEffectiveBits}.` });
  }
  if (noiseLimitedBits !== null && anySignal && noiseLimitedBits < spec.minEffectiveBits && noiseLimitedBits < Math.min(effectiveBits, 24)) {
    add({ check: 'resolution', severity: 'info', message: `The noise floor limits the real resolution to about ${db(noiseLimitedBits)} bits.` });
  }

  // clipping, by channel and kind
  const clipEvents = report.clipping.events;
  if (clipEvents.length > 0) {
    const severity: Severity = clipEvents.length > spec.maxClipEvents ? 'fail' : 'warn';
    for (let channel = 0; channel < channelCount; channel++) {
      for (const kind of ['fullScale', 'belowFullScale'] as const) {
        const events = clipEvents.filter((event) => event.channel === channel && event.level === kind);
        if (events.length === 0) continue;
        const first = events[0];
        const where = events.slice(0, LISTED_EVENTS).map((event) => formatClock(event.startSec)).join(', ') + (events.length > LISTED_EVENTS ? ', ...' : '');
        const what =
          kind === 'fullScale'
            ? `${plural(events.length, 'clipping event')} on ${channelName(channel)} at full scale (at ${where})`
            : `${plural(events.length, 'clipping event')} on ${channelName(channel)}, flat-topped at ${db(first.levelDbfs)} dBFS (at ${where}): something before the converter clipped and the level was lowered afterwards`;
        const summary =
          kind === 'fullScale'
            ? `Clipped at full scale: ${plural(events.length, 'event')} on ${channelName(channel)}, first at ${formatClock(first.startSec)}`
            : `Clipped before the converter: ${plural(events.length, 'flat top')} at ${db(first.levelDbfs)} dBFS on ${channelName(channel)}`;
        add({ check: 'clipping', severity, message: `${what[0].toUpperCase()}${what.slice(1)}.`, summary, channel, startSec: first.startSec, endSec: first.endSec });
      }
    }
  }
  // float sample values
  const samples = report.samples;
  if (samples && samples.nonFinite > 0) {
    const channels = report.channels.map((channel, index) => ((channel.nonFiniteSamples ?? 0) > 0 ? index : -1)).filter((index) => index >= 0);
    add({
      check: 'non-finite',
      severity: 'fail',
      summary: `Damaged file: ${plural(samples.nonFinite, 'sample')} not a number, first at ${formatClock(samples.firstNonFiniteSec ?? 0)}`,
      message: `${plural(samples.nonFinite, 'sample')} ${samples.nonFinite === 1 ? 'is' : 'are'} not a number (NaN or infinity), the first at ${formatClock(samples.firstNonFiniteSec ?? 0)} on ${channels.length === 1 ? channelName(channels[0]) : plural(channels.length, 'channel')}: the file is damaged; they were measured as silence.`,
      ...(channels.length === 1 ? { channel: channels[0] } : {}),
      ...(samples.firstNonFiniteSec !== null ? { startSec: samples.firstNonFiniteSec, endSec: samples.firstNonFiniteSec } : {}),
    });
  }
  if (encoding === 'float' && samples && samples.overFullScale > 0 && report.peak.samplePeakDbfs !== null) {
    add({
      check: 'over-full-scale',
      severity: 'warn',
      summary: `Float samples over full scale (${db(report.peak.samplePeakDbfs, 1)} dBFS): will clip in fixed point`,
      message: `${plural(samples.overFullScale, 'float sample')} ${samples.overFullScale === 1 ? 'goes' : 'go'} over full scale (up to ${db(report.peak.samplePeakDbfs, 2)} dBFS, first at ${formatClock(samples.firstOverFullScaleSec ?? 0)}): not clipped yet, but ${samples.overFullScale === 1 ? 'it' : 'they'} will clip when converted to fixed point.`,
      ...(samples.firstOverFullScaleSec !== null ? { startSec: samples.firstOverFullScaleSec, endSec: samples.firstOverFullScaleSec } : {}),
    });
  } else if (encoding === 'float' && !samples && report.peak.samplePeakDbfs !== null && report.peak.samplePeakDbfs > 0) {
    // Reports made before over-full-scale samples were counted.
    add({ check: 'over-full-scale', severity: 'warn', message: `Float samples reach ${db(report.peak.samplePeakDbfs, 2)} dBFS, over full scale: not clipped yet, but they will clip when converted to fixed point.` });
  }

  // true peak
  report.channels.forEach((channel, index) => {
    if (channel.truePeakDbtp !== null && channel.truePeakDbtp > spec.maxTruePeakDbtp) {
      add({
        check: 'true-peak',
        severity: channel.truePeakDbtp > 0 ? 'fail' : strict,
        summary: `True peak ${db(channel.truePeakDbtp)} dBTP on ${channelName(index)}, above the ${db(spec.maxTruePeakDbtp)} dBTP limit`,
        message: `True peak on ${channelName(index)} reaches ${db(channel.truePeakDbtp)} dBTP${channel.truePeakAtSec !== undefined ? ` at ${formatClock(channel.truePeakAtSec)}` : ''}, above the ${db(spec.maxTruePeakDbtp)} dBTP limit.`,
        channel: index,
        ...(channel.truePeakAtSec !== undefined ? { startSec: channel.truePeakAtSec, endSec: channel.truePeakAtSec } : {}),
      });
    }
  });

  // loudness
  const integrated = report.loudness.integratedLufs;
  const leftOut = report.loudness.leftOut ?? null;
  if (poly) {
    // Iso tracks are raw material, not a programme: their loudness is reported per track, not judged.
  } else if (integrated === null) {
    if (anySignal) {
      const toneOnly = leftOut !== null && leftOut.endSec - leftOut.startSec >= report.file.durationSec - 3;
      add({ check: 'loudness', severity: 'info', message: toneOnly ? 'The take holds only its line-up tone: there is no programme to measure the loudness of.' : 'The take is too short or too quiet for an integrated loudness reading.' });
    }
  } else if (Math.abs(integrated - spec.loudnessTargetLufs) > spec.loudnessToleranceLu) {
    const direction = integrated > spec.loudnessTargetLufs ? 'louder' : 'quieter';
    add({
      check: 'loudness',
      severity: strict,
      summary: `Loudness ${db(integrated)} LUFS, ${db(Math.abs(integrated - spec.loudnessTargetLufs))} LU ${direction} than the ${db(spec.loudnessTargetLufs)} LUFS target`,
      message: `Integrated loudness is ${db(integrated)} LUFS, ${db(Math.abs(integrated - spec.loudnessTargetLufs))} LU ${direction} than the ${db(spec.loudnessTargetLufs)} LUFS target (±${spec.loudnessToleranceLu} LU)${leftOut ? `, line-up tone from ${formatClock(leftOut.startSec)} to ${formatClock(leftOut.endSec)} left out` : ''}.`,
    });
  }

  // noise floor and hum
  const floor = report.noise.floorDbfs;
  if (floor !== null && floor > spec.maxNoiseFloorDbfs) {
    const where = poly ? 'of the quietest track' : 'in the quiet passages';
    add({ check: 'noise-floor', severity: 'warn', message: `The noise floor ${where} is ${db(floor)} dBFS, above the ${db(spec.maxNoiseFloorDbfs)} dBFS limit.` });
  }
  const snr = report.noise.snrDb ?? null;
  if (snr !== null && snr < SNR_WARN_DB) {
    add({
      check: 'noise-floor',
      severity: snr < SNR_FAIL_DB ? 'fail' : 'warn',
      summary: `Noisy: the programme stands only ${db(snr)} dB over the noise floor`,
      message: `The programme stands only ${db(snr)} dB over the noise floor of its quiet passages (signal-to-noise ratio; under ${SNR_WARN_DB} dB the noise is heard, under ${SNR_FAIL_DB} dB it is under every word).`,
    });
  }
  if (report.noise.basis === 'none' && anySignal) {
    add({ check: 'noise-floor', severity: 'info', message: 'The take has no quiet passage (it never falls well below its programme), so its noise floor and hum cannot be measured.' });
  }
  if (report.noise.humHz !== null) {
    add({ check: 'hum', severity: 'warn', message: `Mains hum at ${report.noise.humHz} Hz and its harmonics stands out of the noise floor.` });
  }

  // bandwidth and aliasing
  const nyquist = sampleRate / 2;
  if (report.bandwidth.effectiveHz !== null && anySignal && report.bandwidth.effectiveHz < spec.minBandwidthRatio * nyquist && report.bandwidth.impliedSourceRate === null) {
    add({ check: 'bandwidth', severity: 'warn', message: `The audio reaches only ${formatKhz(report.bandwidth.effectiveHz)}, less than ${Math.round(spec.minBandwidthRatio * 100)}% of the ${formatKhz(nyquist)} a ${formatKhz(sampleRate)} take can carry.` });
  }
  if (report.bandwidth.aliasingRisk) {
    add({ check: 'aliasing', severity: 'warn', message: 'There is strong energy right up to the Nyquist frequency with no filter roll-off: the take may contain aliasing.' });
  }

  // DC offset
  report.channels.forEach((channel, index) => {
    // The steady offset (the quiet windows' mean), so an asymmetric waveform's mean is not taken for a converter's offset.
    const offset = Math.abs(channel.steadyDcOffset ?? channel.dcOffset);
    if (!channel.silent && offset > spec.maxDcOffset) {
      add({
        check: 'dc-offset',
        severity: offset > DC_FAIL_FACTOR * spec.maxDcOffset ? 'fail' : 'warn',
        summary: `DC offset of ${(offset * 100).toPrecision(2)}% of full scale on ${channelName(index)}`,
        message: `${capitalise(channelName(index))} has a DC offset of ${(offset * 100).toPrecision(2)}% of full scale (${db(20 * Math.log10(offset))} dBFS).`,
        channel: index,
      });
    }
  });

  // dropouts
  const dropoutCount = report.dropoutCount ?? report.dropouts.length;
  if (dropoutCount > 0 && report.silentPauses) {
    add({ check: 'dropout', severity: 'info', message: `The take falls to digital silence in its own pauses (${plural(dropoutCount, 'gap')}), as gated, edited or synthesised material does: dropouts cannot be told apart from them, so none is reported.` });
  } else if (dropoutCount > 0) {
    const severity: Severity = dropoutCount > spec.maxDropouts ? 'fail' : 'warn';
    const where = report.dropouts.slice(0, LISTED_EVENTS).map((gap) => `${formatClock(gap.startSec)} (${Math.round((gap.endSec - gap.startSec) * 1000)} ms)`).join(', ');
    const more = dropoutCount > LISTED_EVENTS ? ', ...' : '';
    const first = report.dropouts[0];
    add({
      check: 'dropout',
      severity,
      message: `${plural(dropoutCount, 'dropout')} (digital silence inside the take) at ${where}${more}.`,
      summary: `${plural(dropoutCount, 'dropout')} (digital silence), first at ${formatClock(first?.startSec ?? 0)}`,
      startSec: first?.startSec,
      endSec: first?.endSec,
    });
  }

  // silent channels
  const silentChannels = report.channels.map((channel, index) => (channel.silent ? index : -1)).filter((index) => index >= 0);
  if (report.file.frames === 0) {
    add({ check: 'container', severity: 'fail', message: 'The file holds no audio at all.' });
  } else if (silentChannels.length === channelCount) {
    const noiseOnly = report.channels.every((channel) => channel.silentKind === 'noise-only');
    add({ check: 'silent-channel', severity: 'fail', message: noiseOnly ? 'The whole take carries no programme, only a steady noise: check the inputs, cables and routing.' : 'The whole take is silent: no channel carries a signal.' });
  } else {
    for (const index of silentChannels) {
      const noiseOnly = report.channels[index].silentKind === 'noise-only';
      const what = noiseOnly ? 'carries only a steady noise, no programme' : 'carries no signal';
      if (poly) {
        // An iso track left unused is normal on a location recorder.
        add({ check: 'silent-channel', severity: 'info', message: `${capitalise(channelName(index))} ${what}: an unused track.`, channel: index });
      } else if (report.file.layout === 'surround' && report.channels[index].name === 'LFE') {
        add({ check: 'silent-channel', severity: 'info', message: `The LFE channel ${what}: normal when the programme has no low-frequency effects.`, channel: index });
      } else {
        add({
          check: 'silent-channel',
          severity: 'fail',
          message: `${capitalise(channelName(index))} ${what}: check the input, cable or routing.`,
          summary: `Dead ${channelName(index)}: ${noiseOnly ? 'only steady noise' : 'no signal'}`,
          channel: index,
        });
      }
    }
  }

  // stereo
  const stereo = report.stereo;
  if (stereo && silentChannels.length === 0) {
    if (stereo.identicalChannels) {
      add({ check: 'stereo', severity: 'info', message: 'Both channels are identical: this is a mono take in a stereo file.' });
    } else if (stereo.inPolaritySegments === 0 && stereo.invertedSegments === 0 && !stereo.polarityInverted && report.file.durationSec >= POLARITY_MIN_SEC) {
      add({ check: 'stereo', severity: 'info', message: 'The two channels share no common sound (separate sources, no bleed between them), so their relative polarity cannot be checked.' });
    } else if (stereo.polarityInverted) {
      const from = stereo.invertedFromSec ?? null;
      const to = stereo.invertedToSec ?? null;
      // Some stretches were found in polarity, others not: a cable or a patch changed during the take.
      const partial = from !== null && to !== null && (stereo.inPolaritySegments ?? 0) > 0;
      add({
        check: 'stereo',
        severity: 'warn',
        summary: partial ? `Channels in opposite polarity from ${formatClock(from)} to ${formatClock(to)}` : 'Channels in opposite polarity: one is wired inverted',
        message: partial
          ? `The channels are in opposite polarity from ${formatClock(from)} to ${formatClock(to)}: one of them was probably wired inverted there; that part will cancel when summed to mono.`
          : 'The channels are in opposite polarity: one of them is probably wired inverted; the take will cancel when summed to mono.',
        ...(from !== null && to !== null ? { startSec: from, endSec: to } : {}),
      });
    }
  }

  // tone
  const tone = report.tone;
  if (tone) {
    add({
      check: 'tone',
      severity: 'info',
      message: `Line-up tone of ${db(tone.frequencyHz, 1)} Hz at ${db(tone.levelDbfs)} dBFS from ${formatClock(tone.startSec)} to ${formatClock(tone.endSec)} (${
        tone.limitedByContainer
          ? `SINAD at least ${db(tone.sinadDb)} dB and ${db(tone.enobBits)} effective bits: the most the file's ${formatName} samples can show, as the tone lands on too few codes to measure its noise`
          : `SINAD ${db(tone.sinadDb)} dB, about ${db(tone.enobBits)} effective bits`
      }).`,
      startSec: tone.startSec,
      endSec: tone.endSec,
    });
  }
  return findings;
}

const capitalise = (text: string) => text[0].toUpperCase() + text.slice(1);

/** Importance of each check when several findings share the worst severity, most important first. */
const CHECK_IMPORTANCE: Finding['check'][] = [
  'non-finite', 'container', 'silent-channel', 'clipping', 'dropout', 'true-peak', 'over-full-scale', 'stereo', 'format', 'sample-rate',
  'resolution', 'loudness', 'dc-offset', 'noise-floor', 'hum', 'bandwidth', 'aliasing', 'tone',
];
const SEVERITY_RANK: Record<Severity, number> = { fail: 0, warn: 1, info: 2 };
/** Longest one-line reason, characters. */
export const REASON_MAX_LENGTH = 90;

/** A finding's short form: its summary, or its message cut at the first clause or word that fits. */
function shortForm(finding: Finding): string {
  const text = finding.summary ?? finding.message.replace(/\.$/, '');
  if (text.length <= REASON_MAX_LENGTH) return text;
  const clause = text.split(/: | \(|; /)[0];
  if (clause.length <= REASON_MAX_LENGTH) return clause;
  return `${text.slice(0, text.lastIndexOf(' ', REASON_MAX_LENGTH - 1))}…`;
}

/**
 * The one-line reason for a take's verdict: the most important warning or failure, in at most
 * REASON_MAX_LENGTH characters; null when the take passes (information only).
 */
export function reasonOf(findings: readonly Finding[]): string | null {
  const ranked = findings
    .filter((finding) => finding.severity !== 'info')
    .map((finding, order) => ({ finding, order }))
    .sort(
      (a, b) =>
        SEVERITY_RANK[a.finding.severity] - SEVERITY_RANK[b.finding.severity] ||
        CHECK_IMPORTANCE.indexOf(a.finding.check) - CHECK_IMPORTANCE.indexOf(b.finding.check) ||
        a.order - b.order,
    );
  return ranked.length > 0 ? shortForm(ranked[0].finding) : null;
}

/** The take's overall verdict: 'fail' if any finding fails, else 'warn' if any warns, else 'pass'. */
export function verdictOf(findings: readonly Finding[]): 'pass' | 'warn' | 'fail' {
  if (findings.some((finding) => finding.severity === 'fail')) return 'fail';
  if (findings.some((finding) => finding.severity === 'warn')) return 'warn';
  return 'pass';
}
