import { createHash } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import busboy from 'busboy';
import type { Request } from 'express';
import { ATTACHMENT_LIMITS, type AttachmentType } from '@shared/api/attachments.ts';
import { PayloadTooLargeError, ValidationError } from '@server/errors/index.ts';
import { SNIFF_BYTES, TextChecker, claimedTypeOf, decideType } from './sniff-content-type.ts';
import { UnsupportedFileError } from './upload-errors.ts';

/** A received upload, spooled to a private temporary file (never held whole in memory). */
export interface ReceivedFile {
  /** Original name, cleaned for storage as metadata. */
  name: string;
  contentType: AttachmentType;
  byteSize: number;
  sha256: string;
  /** Where the bytes wait until they are stored; `discard()` removes it. */
  tempPath: string;
  discard(): Promise<void>;
}

/** A file name fit to keep: no folders, no control characters, bounded length, never empty. */
export function cleanFileName(raw: string | undefined): string {
  const base = (raw ?? '').split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const cleaned = base.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(0, ATTACHMENT_LIMITS.nameMax);
  return cleaned || 'file';
}

/**
 * Reads a multipart/form-data request with one part named "file": the bytes go through a
 * SHA-256 hash, a byte counter (stopping at `maxBytes` with 413) and a content check into a
 * temporary file. The stored type comes from the bytes; a mismatch with the name is a 415.
 */
export async function receiveUpload(req: Request, maxBytes: number = ATTACHMENT_LIMITS.maxBytes): Promise<ReceivedFile> {
  if (!req.is('multipart/form-data')) {
    throw new ValidationError('Send the file as multipart/form-data', [{ path: 'file', message: 'Expected a multipart/form-data body with a "file" part' }]);
  }
  const dir = await mkdtemp(path.join(os.tmpdir(), 'bifolio-upload-'));
  const tempPath = path.join(dir, 'upload');
  const discard = () => rm(dir, { recursive: true, force: true });
  try {
    const received = await new Promise<Omit<ReceivedFile, 'tempPath' | 'discard'>>((resolve, reject) => {
      let bb: busboy.Busboy;
      try {
        bb = busboy({ headers: req.headers, limits: { files: 1, fileSize: maxBytes, fields: 10, parts: 12 }, defParamCharset: 'utf8' });
      } catch (error) {
        reject(new ValidationError('The upload could not be read', [{ path: 'file', message: (error as Error).message }]));
        return;
      }
      let sawFile = false;
      let work: Promise<Omit<ReceivedFile, 'tempPath' | 'discard'>> | null = null;
      bb.on('file', (field, stream, info) => {
        if (field !== 'file' || sawFile) {
          stream.resume();
          return;
        }
        sawFile = true;
        const hash = createHash('sha256');
        const text = new TextChecker();
        let head = Buffer.alloc(0);
        let size = 0;
        let truncated = false;
        stream.on('limit', () => {
          truncated = true;
        });
        const inspect = new Transform({
          transform(chunk: Buffer, _enc, done) {
            size += chunk.length;
            hash.update(chunk);
            text.push(chunk);
            if (head.length < SNIFF_BYTES) head = Buffer.concat([head, chunk.subarray(0, SNIFF_BYTES - head.length)]);
            done(null, chunk);
          },
        });
        work = pipeline(stream, inspect, createWriteStream(tempPath, { mode: 0o600 })).then(() => {
          if (truncated) {
            throw new PayloadTooLargeError(`A file may have at most ${formatBytes(maxBytes)}`, [
              { path: 'file', message: `Larger than ${formatBytes(maxBytes)}` },
            ]);
          }
          if (size === 0) throw new ValidationError('The file is empty', [{ path: 'file', message: 'The file has no bytes' }]);
          const name = cleanFileName(info.filename);
          const decided = decideType(head, text.finish(), claimedTypeOf(name, info.mimeType));
          if ('error' in decided) throw new UnsupportedFileError(decided.error, decided.mismatch);
          return { name, contentType: decided.type, byteSize: size, sha256: hash.digest('hex') };
        });
        work.catch(() => undefined);
      });
      bb.on('error', (error: Error) =>
        reject(new ValidationError('The upload could not be read', [{ path: 'file', message: error.message }])),
      );
      bb.on('close', () => {
        if (!work) {
          reject(new ValidationError('No file was sent', [{ path: 'file', message: 'Attach one file in a part named "file"' }]));
          return;
        }
        work.then(resolve, reject);
      });
      req.on('aborted', () => reject(new ValidationError('The upload was interrupted', [{ path: 'file', message: 'The connection closed before the file arrived' }])));
      req.pipe(bb);
    });
    return { ...received, tempPath, discard };
  } catch (error) {
    await discard();
    throw error;
  }
}

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${Math.round((n / (1024 * 1024)) * 10) / 10} MB`;
  if (n >= 1024) return `${Math.round((n / 1024) * 10) / 10} KB`;
  return `${n} bytes`;
}
