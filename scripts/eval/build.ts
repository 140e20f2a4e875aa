import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { encodeSamples, wavFile, type Chunk } from '../../tests/support/wavWriter';
import type { EvalTake, TakeAudio } from './corpus';

/** Bump when the material generators change, so cached takes are made again. */
const GENERATOR_VERSION = 3;

/** An iXML chunk with a TRACK_LIST naming each channel (iXML specification, gallery.co.uk/ixml). */
export function ixmlChunk(names: string[]): Chunk {
  const escape = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
  const tracks = names
    .map((name, index) => `<TRACK><CHANNEL_INDEX>${index + 1}</CHANNEL_INDEX><INTERLEAVE_INDEX>${index + 1}</INTERLEAVE_INDEX><NAME>${escape(name)}</NAME></TRACK>`)
    .join('');
  const xml = `<?xml version="1.0" encoding="UTF-8"?><BWFXML><IXML_VERSION>2.10</IXML_VERSION><PROJECT>Harbour Walk</PROJECT><SCENE>12</SCENE><TAKE>3</TAKE><TRACK_LIST><TRACK_COUNT>${names.length}</TRACK_COUNT>${tracks}</TRACK_LIST></BWFXML>`;
  return { id: 'iXML', body: Buffer.from(xml, 'utf8') };
}

/** The WAV file of a take: iXML before the audio for 8 or more tracks, after it otherwise (recorders do both). */
export function wavOf(audio: TakeAudio): Buffer {
  const layout = { sampleRate: audio.sampleRate, channels: audio.channels.length, coding: audio.coding, extensibleMask: audio.extensibleMask };
  const ixml = audio.trackNames ? [ixmlChunk(audio.trackNames)] : [];
  const before = audio.channels.length >= 8;
  return wavFile(layout, encodeSamples(audio.channels, audio.coding), before ? { chunksBeforeData: ixml } : { chunksAfterData: ixml });
}

/**
 * Makes a take's file under `folder`, or reuses the one made before by the same generator version
 * and description (takes are deterministic, so a cached file is the same file).
 * @returns the file's path
 */
export function buildTake(take: EvalTake, folder: string): string {
  mkdirSync(folder, { recursive: true });
  const path = join(folder, `${take.id}.wav`);
  const stamp = join(folder, `${take.id}.made`);
  const key = createHash('sha256').update(`${GENERATOR_VERSION}\n${take.id}\n${take.description}`).digest('hex');
  if (existsSync(path) && existsSync(stamp) && readFileSync(stamp, 'utf8') === key) return path;
  const partial = `${path}.partial`;
  writeFileSync(partial, wavOf(take.make()));
  renameSync(partial, path);
  writeFileSync(stamp, key);
  return path;
}
