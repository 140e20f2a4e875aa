import { parentPort } from 'node:worker_threads';
import { ClippingAnalyzer } from '../analyzers/clipping';
import { LoudnessAnalyzer, MIN_LOUDNESS_RATE_HZ, UNMEASURED_LOUDNESS } from '../analyzers/loudness';
import { TruePeakAnalyzer } from '../analyzers/truePeak';
import { TrackLoudnessAnalyzer } from '../trackLoudness';
import type { FromWorker, ToWorker } from './workerProtocol';

/** Worker side: runs the true-peak, loudness and clipping analyzers on blocks sent by the pipeline. */
const port = parentPort!;
let analyzers: { truePeak: TruePeakAnalyzer; loudness: LoudnessAnalyzer | null; trackLoudness: TrackLoudnessAnalyzer | null; clipping: ClippingAnalyzer } | null = null;

const send = (message: FromWorker, transfer: ArrayBuffer[] = []) => port.postMessage(message, transfer);

port.on('message', (message: ToWorker) => {
  try {
    if (message.kind === 'start') {
      const measurable = message.format.sampleRate >= MIN_LOUDNESS_RATE_HZ;
      analyzers = {
        truePeak: new TruePeakAnalyzer(message.format),
        loudness: measurable ? new LoudnessAnalyzer(message.format) : null,
        trackLoudness: measurable && message.perTrack ? new TrackLoudnessAnalyzer(message.format) : null,
        clipping: new ClippingAnalyzer(message.format),
      };
      send({ kind: 'ready' });
    } else if (message.kind === 'block') {
      const block = { channels: message.channels, frames: message.frames, startFrame: message.startFrame };
      analyzers!.truePeak.push(block);
      analyzers!.loudness?.push(block);
      analyzers!.trackLoudness?.push(block);
      analyzers!.clipping.push(block);
      send({ kind: 'done', channels: message.channels }, message.channels.map((channel) => channel.buffer as ArrayBuffer));
    } else {
      send({
        kind: 'results',
        truePeak: analyzers!.truePeak.finish(),
        loudness: analyzers!.loudness?.finish(message.leaveOut) ?? UNMEASURED_LOUDNESS,
        trackLoudness: analyzers!.trackLoudness?.finish(message.leaveOut) ?? null,
        clipping: analyzers!.clipping.finish(),
      });
    }
  } catch (error) {
    send({ kind: 'failed', message: error instanceof Error ? error.message : String(error) });
  }
});
