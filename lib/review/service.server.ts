import 'server-only';
import type { Readable } from 'node:stream';
import { PEAKS_HEADER_BYTES, PEAKS_LEVEL_ENTRY_BYTES, PEAKS_MAGIC, PEAKS_SCALE, pickPeaksLevel, readPeaksHeader, toWaveformPeaks, type PeaksLevel } from '@/dsp/peaksFile';
import { Take, TakeComment, User } from '@/models';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import type { CommentInput, DecisionInput } from './schema';
import { storage } from '@/lib/storage/storage.server';
import { findTake, getTake } from '@/lib/takes/service.server';
import { worstFirst } from '@/lib/takes/order';
import type { TakeDetail } from '@/lib/takes/views';
import type { Actor } from '@/lib/auth/views';
import type { TakeCommentView, TakePeaks } from './views';

async function readAll(stream: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const part of stream) parts.push(part as Buffer);
  return Buffer.concat(parts);
}

/** Bytes [start, start + length) of a stored object. */
async function readBytes(key: string, start: number, length: number): Promise<Buffer> {
  if (length <= 0) return Buffer.alloc(0);
  return readAll(storage().getRange(key, { start, end: start + length - 1 }));
}

/**
 * The waveform envelope of a take at the stored zoom level nearest `buckets`
 * (the finest with at most that many buckets). Reads only the header and that level.
 */
export async function takePeaks(actor: Actor, id: number, buckets: number): Promise<TakePeaks> {
  const take = await findTake(actor, id);
  if (!take.peaksKey && take.waveformMissing) {
    throw new AppError('not_found:peaks', 'The waveform of this take is missing: it could not be stored. The measurement is complete; Takeproof stores the waveform again by itself once storage has room.');
  }
  if (!take.peaksKey) {
    const why = take.status === 'measured' ? 'this take was measured without them' : take.status === 'unreadable' ? 'the file could not be read' : 'the take is still being measured';
    throw new AppError('not_found:peaks', `There is no waveform for this take yet: ${why}.`);
  }
  const key = take.peaksKey;
  const fixed = await readBytes(key, 0, PEAKS_HEADER_BYTES);
  if (fixed.length < PEAKS_HEADER_BYTES || fixed.toString('latin1', 0, 4) !== PEAKS_MAGIC) {
    throw new AppError('not_found:peaks', 'The waveform file of this take is missing or damaged; measure the take again.');
  }
  const tableBytes = PEAKS_HEADER_BYTES + PEAKS_LEVEL_ENTRY_BYTES * fixed.readUInt16LE(24);
  let header;
  try {
    header = readPeaksHeader(await readBytes(key, 0, tableBytes));
  } catch (error) {
    throw new AppError('not_found:peaks', `The waveform file of this take cannot be read (${(error as Error).message}); measure the take again.`);
  }
  if (header.levels.length === 0) throw new AppError('not_found:peaks', 'The waveform file of this take holds no zoom levels.');
  const info = pickPeaksLevel(header, buckets);
  const bytes = info.bucketCount * header.channels * 4;
  const data = await readBytes(key, info.dataOffset, bytes);
  if (data.length < bytes) throw new AppError('not_found:peaks', 'The waveform file of this take is cut short; measure the take again.');
  const min = Array.from({ length: header.channels }, () => new Float32Array(info.bucketCount));
  const max = Array.from({ length: header.channels }, () => new Float32Array(info.bucketCount));
  for (let b = 0; b < info.bucketCount; b++) {
    for (let c = 0; c < header.channels; c++) {
      const o = (b * header.channels + c) * 4;
      min[c][b] = data.readInt16LE(o) / PEAKS_SCALE;
      max[c][b] = data.readInt16LE(o + 2) / PEAKS_SCALE;
    }
  }
  const level: PeaksLevel = {
    channels: header.channels, sampleRate: header.sampleRate, totalFrames: header.totalFrames, durationSec: header.durationSec,
    framesPerBucket: info.framesPerBucket, min, max,
  };
  return { ...toWaveformPeaks(level), channels: header.channels, sampleRate: header.sampleRate };
}

/** Records a producer's decision (or reopens the take with `pending`); audited as `take.decide`. */
export async function decideTake(actor: Actor, id: number, input: DecisionInput): Promise<TakeDetail> {
  const take = await findTake(actor, id);
  if (input.decision === 'approved' && take.status !== 'measured') {
    throw new AppError('conflict:take_unmeasured', 'A take can be approved only once it has been measured.');
  }
  const previous = take.decision;
  await db().transaction(async (transaction) => {
    const decided = input.decision !== 'pending';
    await take.update(
      { decision: input.decision, decidedById: decided ? actor.id : null, decidedAt: decided ? new Date() : null, decisionNote: decided ? input.note : null },
      { transaction },
    );
    await audit(actor, 'take.decide', { type: 'take', id }, { decision: input.decision, previous, note: input.note }, transaction);
  });
  return getTake(actor, id);
}

type WithAuthor = TakeComment & { author?: User | null };

function toCommentView(c: WithAuthor): TakeCommentView {
  return {
    id: c.id,
    takeId: c.takeId,
    atSec: c.atSec,
    body: c.body,
    author: c.author ? { id: c.author.id, name: c.author.name } : null,
    createdAt: c.createdAt.toISOString(),
  };
}

/** A take's comments in time order. */
export async function listComments(actor: Actor, takeId: number): Promise<TakeCommentView[]> {
  await findTake(actor, takeId);
  const rows = (await TakeComment.findAll({
    where: { takeId, studioId: actor.studioId },
    include: [{ model: User, as: 'author', attributes: ['id', 'name'] }],
    order: [['atSec', 'ASC'], ['id', 'ASC']],
  })) as WithAuthor[];
  return rows.map(toCommentView);
}

/** Adds a time-stamped comment; a time past the end of a measured take is a field error. */
export async function addComment(actor: Actor, takeId: number, input: CommentInput): Promise<TakeCommentView> {
  const take = await findTake(actor, takeId);
  if (take.durationSec != null && input.atSec > take.durationSec + 0.05) {
    throw new AppError('invalid:comment', 'Some fields need attention.', { fields: { atSec: ['That time is past the end of the take'] } });
  }
  const created = await db().transaction(async (transaction) => {
    const comment = await TakeComment.create({ studioId: actor.studioId, takeId, authorId: actor.id, atSec: input.atSec, body: input.body }, { transaction });
    await audit(actor, 'take.comment', { type: 'take', id: takeId }, { commentId: comment.id, atSec: input.atSec }, transaction);
    return comment;
  });
  const row = (await TakeComment.findByPk(created.id, { include: [{ model: User, as: 'author', attributes: ['id', 'name'] }] })) as WithAuthor;
  return toCommentView(row);
}

/** The takes before and after this one in the order of the session's take table (worst first). */
export async function sessionNeighbours(actor: Actor, take: { id: number; sessionId: number }) {
  const takes = await Take.findAll({ where: { sessionId: take.sessionId, studioId: actor.studioId }, attributes: ['id', 'originalName', 'verdict'] });
  const ordered = takes.map((t) => ({ id: t.id, originalName: t.originalName, verdict: t.verdict })).sort(worstFirst);
  const index = ordered.findIndex((t) => t.id === take.id);
  const ref = (t: (typeof ordered)[number] | undefined) => (t ? { id: t.id, name: t.originalName } : null);
  return { previous: ref(ordered[index - 1]), next: ref(ordered[index + 1]), position: index + 1, count: ordered.length };
}
