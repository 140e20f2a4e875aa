import 'server-only';
import busboy from 'busboy';
import { createHash } from 'node:crypto';
import { Readable, Transform, type TransformCallback } from 'node:stream';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import { Op, UniqueConstraintError } from 'sequelize';
import { AnalysisJob, Recorder, Take } from '@/models';
import { audit } from '@/lib/audit/record.server';
import { db } from '@/lib/db/connection.server';
import { env } from '@/lib/env.server';
import { cleanFileName, formatBytes } from '@/lib/format';
import { AppError } from '@/lib/errors';
import { findSession } from '@/lib/sessions/service.server';
import { newTakeKey, storage } from '@/lib/storage/storage.server';
import { type TakeSummary } from './views';
import type { Actor } from '@/lib/auth/views';
import { findTake, toTakeSummary } from './service.server';

const WAV_MAGIC = new Set(['RIFF', 'RF64', 'BW64']);
const MULTIPART_OVERHEAD = 1024 * 1024;
/** What one upload request may hold: files, form fields besides them, and bytes per field. */
const MAX_FILES = 50;
const MAX_FIELDS = 20;
const MAX_FIELD_BYTES = 1024;

const cutOff = () => new AppError('invalid:upload_aborted', 'The upload was cut off before it finished. Nothing was kept.');
const truncated = () =>
  new AppError('invalid:upload_truncated', 'The upload ended before its last part was complete (the request body is shorter than its own multipart framing says). Nothing was kept; send it again.');
const unreadablePart = () =>
  new AppError('invalid:upload', 'The upload could not be read. A file name may hold characters that are not allowed (control characters); rename the file and try again.');

/** Counts, hashes and checks the bytes of one uploaded file as they stream past. */
export class UploadCheck extends Transform {
  readonly hash = createHash('sha256');
  bytes = 0;
  private head = Buffer.alloc(0);
  private headChecked = false;

  constructor(private readonly maxBytes: number, private readonly fileName: string) {
    super();
  }

  _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback) {
    this.bytes += chunk.length;
    if (this.bytes > this.maxBytes) {
      done(new AppError('too_large:upload', `“${this.fileName}” is larger than the ${formatBytes(this.maxBytes)} this studio accepts.`));
      return;
    }
    if (!this.headChecked) {
      this.head = Buffer.concat([this.head, chunk]);
      if (this.head.length >= 12) {
        this.headChecked = true;
        if (!isWavHead(this.head)) {
          done(new AppError('unsupported:upload', `“${this.fileName}” is not a WAV file (it does not start with a RIFF/RF64 WAVE header).`));
          return;
        }
      }
    }
    this.hash.update(chunk);
    done(null, chunk);
  }

  _flush(done: TransformCallback) {
    if (!this.headChecked) {
      done(new AppError('unsupported:upload', `“${this.fileName}” is too short to be a WAV file.`));
      return;
    }
    done();
  }
}

function isWavHead(head: Buffer): boolean {
  return WAV_MAGIC.has(head.toString('latin1', 0, 4)) && head.toString('latin1', 8, 12) === 'WAVE';
}

/** Most of a refused upload that is still read (and thrown away) so the client receives the answer. */
const MAX_DRAIN_BYTES = 256 * 1024 * 1024;

/**
 * Keeps reading a refused request body into nothing, so the client gets the error answer instead
 * of a reset connection; a body larger than MAX_DRAIN_BYTES is cut off.
 */
function drainThenDrop(source: Readable): void {
  let drained = 0;
  source.on('data', (chunk: Buffer) => {
    drained += chunk.length;
    if (drained > MAX_DRAIN_BYTES) source.destroy();
  });
  source.resume();
}

export interface StoredFile {
  key: string;
  originalName: string;
  bytes: number;
  sha256: string;
}

/**
 * Streams the WAV files of a multipart upload (field `file`, at most `maxFiles`) straight into
 * storage under fresh keys while hashing them, and returns them with the text fields sent before
 * them. All or nothing: if any part is refused or the upload is cut off, every file already
 * stored is removed again.
 */
export async function storeWavParts(request: Request, options: { newKey: () => string; maxFiles: number }): Promise<{ files: StoredFile[]; fields: Record<string, string> }> {
  const contentType = request.headers.get('content-type') ?? '';
  if (!contentType.startsWith('multipart/form-data') || !request.body) {
    throw new AppError('invalid:upload', 'Send the files as multipart/form-data with `file` fields.');
  }
  const maxBytes = env().UPLOAD_MAX_BYTES;
  const declaredLength = Number(request.headers.get('content-length') ?? NaN);
  if (Number.isFinite(declaredLength) && declaredLength > maxBytes * options.maxFiles + MULTIPART_OVERHEAD) {
    throw new AppError('too_large:upload', `This upload is larger than the ${formatBytes(maxBytes)} per file this studio accepts.`);
  }

  const stored: StoredFile[] = [];
  const fields: Record<string, string> = {};
  // Each file's write, in order; files still being written when the request fails are stopped.
  let chain = Promise.resolve();
  const writing = new Set<UploadCheck>();
  try {
    await new Promise<void>((resolve, reject) => {
      let settled = false;
      // Refuses the whole request: stops reading it, stops the files being written (a cut-off source
      // would otherwise leave them waiting for bytes forever) and answers with `error`.
      const fail = (error: unknown) => {
        if (settled) return;
        settled = true;
        source.unpipe(parser);
        drainThenDrop(source);
        for (const check of writing) check.destroy(error as Error);
        reject(error);
      };
      let parser: busboy.Busboy;
      try {
        // preservePath: keep the name as sent (it is only shown); busboy would otherwise cut it at the last slash.
        // defParamCharset: browsers send file names as UTF-8.
        parser = busboy({ headers: { 'content-type': contentType }, preservePath: true, defParamCharset: 'utf8', limits: { files: options.maxFiles, fields: MAX_FIELDS, fieldSize: MAX_FIELD_BYTES } });
      } catch {
        throw new AppError('invalid:upload', 'The multipart body could not be read.');
      }
      const source = Readable.fromWeb(request.body as WebReadableStream);
      source.on('error', () => fail(cutOff()));
      parser.on('filesLimit', () => fail(new AppError('invalid:upload_files', `This upload holds more than ${options.maxFiles} files; Takeproof takes at most ${options.maxFiles} in one request. Nothing was kept: send the files in several uploads.`)));
      parser.on('fieldsLimit', () => fail(new AppError('invalid:upload_fields', `This upload has more than ${MAX_FIELDS} form fields besides its files, so some (the recorder among them) would be lost. Nothing was kept: send only \`recorderId\` and the files.`)));
      parser.on('field', (name, value, info) => {
        if (info.nameTruncated || info.valueTruncated) {
          fail(new AppError('invalid:upload_fields', `The form field “${cleanFileName(name)}” is longer than the ${MAX_FIELD_BYTES} bytes Takeproof reads. Nothing was kept.`));
        } else fields[name] = value;
      });
      parser.on('file', (field, file, info) => {
        if (settled) return void file.resume();
        const originalName = cleanFileName(info.filename ?? '');
        if (field !== 'file') {
          file.resume();
          fail(new AppError('invalid:upload', `“${originalName}” was sent in the field \`${cleanFileName(field)}\`; send takes in fields named \`file\`. Nothing was kept.`));
          return;
        }
        const key = options.newKey();
        const check = new UploadCheck(maxBytes, originalName);
        // The check's own refusal (not WAV, too large, cut off) is the one to report, not what storage makes of
        // the ended stream; a storage fault comes back from put(). Listening also keeps the error handled.
        let refusal: AppError | undefined;
        check.on('error', (error) => {
          if (error instanceof AppError) refusal ??= error;
        });
        // A body that ends inside this file: busboy ends the file stream with an error of its own.
        file.on('error', () => check.destroy(truncated()));
        file.pipe(check);
        writing.add(check);
        const put = storage()
          .put(key, check)
          .then(
            () => null,
            (error: unknown) => refusal ?? error,
          )
          .finally(() => writing.delete(check));
        chain = chain.then(async () => {
          const error = await put;
          if (error) throw error;
          stored.push({ key, originalName, bytes: check.bytes, sha256: check.hash.digest('hex') });
        });
        chain.catch(fail);
      });
      parser.on('error', (error: Error) => fail(error.message === 'Unexpected end of form' ? truncated() : unreadablePart()));
      parser.on('close', () => {
        chain.then(() => {
          if (!settled) {
            settled = true;
            resolve();
          }
        }, fail);
      });
      source.pipe(parser);
    });
    if (stored.length === 0) throw new AppError('invalid:upload', 'No WAV file was found in the upload (use the field name `file`).');
    return { files: stored, fields };
  } catch (error) {
    await chain.catch(() => undefined); // a write that was stopped has settled, and a finished one is listed in `stored`
    await Promise.all(stored.map((f) => storage().delete(f.key)));
    throw error;
  }
}

/**
 * Receives the WAV files of a multipart upload (field `file`, any number; optional field
 * `recorderId` before the files) into storage, then records one take and one analysis job per
 * file. All or nothing: if any part is refused, every file of this request is removed again and
 * no take is recorded.
 */
export async function receiveTakes(actor: Actor, sessionId: number, request: Request): Promise<TakeSummary[]> {
  const session = await findSession(actor, sessionId);
  if (session.status === 'closed') throw new AppError('conflict:session_closed', 'This session is closed. Reopen it to add takes.');
  return storeThen(request, MAX_FILES, (files, fields) => recordTakes(actor, sessionId, files, fields.recorderId ? Number(fields.recorderId) : null));
}

/** Stores the request's WAV parts, then hands them to `record`; if `record` throws, the stored files are removed again. */
async function storeThen<T>(request: Request, maxFiles: number, record: (files: StoredFile[], fields: Record<string, string>) => Promise<T>): Promise<T> {
  const { files, fields } = await storeWavParts(request, { newKey: () => newTakeKey(), maxFiles });
  try {
    return await record(files, fields);
  } catch (error) {
    await Promise.all(files.map((f) => storage().delete(f.key)));
    throw error;
  }
}

export async function recordTakes(actor: Actor, sessionId: number, files: StoredFile[], recorderId: number | null): Promise<TakeSummary[]> {
  if (recorderId !== null && !(Number.isInteger(recorderId) && (await Recorder.findOne({ where: { id: recorderId, studioId: actor.studioId } })))) {
    throw new AppError('invalid:recorder', 'That recorder does not belong to this studio.', { fields: { recorderId: ['Pick one of the studio’s recorders'] } });
  }
  const seen = new Map<string, string>();
  for (const f of files) {
    const earlier = seen.get(f.sha256);
    if (earlier) throw new AppError('conflict:duplicate_take', `“${f.originalName}” is the same file as “${earlier}” in this upload.`);
    seen.set(f.sha256, f.originalName);
    const existing = await Take.findOne({ where: { sessionId, sha256: f.sha256 }, attributes: ['id', 'originalName'] });
    if (existing) {
      throw new AppError('conflict:duplicate_take', `“${f.originalName}” is already in this session as “${existing.originalName}”.`, {
        extra: { existingTakeId: existing.id },
      });
    }
  }
  try {
    const takes = await db().transaction(async (transaction) => {
      const created: Take[] = [];
      for (const f of files) {
        const take = await Take.create(
          {
            studioId: actor.studioId,
            sessionId,
            recorderId,
            uploadedById: actor.id,
            originalName: f.originalName,
            storageKey: f.key,
            bytes: f.bytes,
            sha256: f.sha256,
            sampleRate: null, bitsPerSample: null, channels: null, encoding: null, durationSec: null,
            error: null, report: null, peaksKey: null,
            effectiveBits: null, truePeakDbtp: null, integratedLufs: null, noiseFloorDbfs: null, clipEvents: null,
            verdict: null, decidedById: null, decidedAt: null, decisionNote: null, measuredAt: null,
          },
          { transaction },
        );
        await AnalysisJob.create({ takeId: take.id, workerId: null, heartbeatAt: null, lastError: null }, { transaction });
        await audit(actor, 'take.upload', { type: 'take', id: take.id }, { sessionId, name: f.originalName, bytes: f.bytes, sha256: f.sha256 }, transaction);
        created.push(take);
      }
      return created;
    });
    return takes.map(toTakeSummary);
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw new AppError('conflict:duplicate_take', 'One of these files is already in this session.');
    throw error;
  }
}

/**
 * Puts a new file under an existing take (multipart, one `file` part): the take keeps its id, its
 * comments and its audit history, loses the old measurement and decision, and is measured again.
 * The old file and its waveform file are deleted once the new one is recorded.
 */
export async function replaceTakeFile(actor: Actor, takeId: number, request: Request): Promise<TakeSummary> {
  const take = await findTake(actor, takeId);
  if (take.status === 'measuring') throw new AppError('conflict:take_busy', `“${take.originalName}” is being measured right now; replace its file once it is done.`);
  const oldKeys = [take.storageKey, take.peaksKey].filter((key): key is string => !!key);
  await storeThen(request, 1, async ([file]) => {
    if (!file) throw new AppError('invalid:upload', 'No WAV file was found in the upload (use the field name `file`).');
    const existing = await Take.findOne({ where: { sessionId: take.sessionId, sha256: file.sha256, id: { [Op.ne]: takeId } }, attributes: ['originalName'] });
    if (existing) throw new AppError('conflict:duplicate_take', `“${file.originalName}” is already in this session as “${existing.originalName}”.`);
    await db().transaction(async (transaction) => {
      const locked = await Take.findByPk(takeId, { attributes: ['id', 'status'], lock: transaction.LOCK.UPDATE, transaction });
      if (!locked) throw new AppError('not_found:take', 'This take was removed meanwhile.');
      if (locked.status === 'measuring') throw new AppError('conflict:take_busy', `“${take.originalName}” is being measured right now; replace its file once it is done.`);
      await take.update(
        {
          originalName: file.originalName, storageKey: file.key, bytes: file.bytes, sha256: file.sha256,
          status: 'queued', progress: 0, error: null, report: null, peaksKey: null,
          sampleRate: null, bitsPerSample: null, channels: null, encoding: null, durationSec: null,
          effectiveBits: null, truePeakDbtp: null, integratedLufs: null, noiseFloorDbfs: null, clipEvents: null, belowFullScaleClipEvents: null,
          rateMismatch: null, aliasingRisk: null, verdict: null, reason: null,
          decision: 'pending', decidedById: null, decidedAt: null, decisionNote: null, measuredAt: null,
        },
        { transaction },
      );
      const [job] = await AnalysisJob.findOrCreate({ where: { takeId }, defaults: { takeId, workerId: null, heartbeatAt: null, lastError: null }, transaction });
      await job.update({ state: 'queued', attempts: 0, workerId: null, heartbeatAt: null, lastError: null }, { transaction });
      await audit(actor, 'take.replace', { type: 'take', id: takeId }, { sessionId: take.sessionId, previousName: take.originalName, name: file.originalName, previousSha256: take.sha256, sha256: file.sha256, bytes: file.bytes }, transaction);
    });
  });
  // After the commit: a file left behind by a crash here shows up in `npm run check:storage`.
  await Promise.all(oldKeys.map((key) => storage().delete(key)));
  return toTakeSummary(await findTake(actor, takeId));
}
