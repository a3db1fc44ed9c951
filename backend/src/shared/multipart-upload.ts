import { BadRequestException, PayloadTooLargeException } from '@nestjs/common';
import type { Request, Response } from 'express';
import multer, { MulterError } from 'multer';
import { randomBytes } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { open, readdir, stat, unlink } from 'node:fs/promises';
import { SNIFF_BYTES } from './content-sniffer.js';

/** A file received to disk, with the multipart text fields that came with it. */
export type ReceivedUpload = { path: string; originalName: string; size: number; fields: Record<string, string> };

export type UploadOptions = {
  /** Where the file is written while it is checked (var/tmp); the caller moves or deletes it. */
  dir: string;
  maxBytes: number;
  /** The multipart field that carries the file. */
  field: string;
  /** Called as the request body arrives: bytes so far and the Content-Length (null when not sent). */
  onBytes?: (received: number, total: number | null) => void;
};

/** A size limit in bytes from an environment variable in megabytes (KC_IMPORT_MAX_MB…), else the default. */
export function megabytesFromEnv(key: string, fallbackMb: number, env: NodeJS.ProcessEnv = process.env): number {
  const raw = env[key];
  const value = raw === undefined || raw === '' ? fallbackMb : Number(raw);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`${key} must be a number of megabytes greater than zero (got "${raw}")`);
  return Math.round(value * 1024 * 1024);
}

/**
 * Streams a multipart upload to a file with a random name under `dir` (multer's disk storage): the
 * body is never held in memory. Refuses a missing file (400), a second file or an unknown file field
 * (400) and a file over the limit (413, the partial file removed).
 */
export function receiveUpload(req: Request, res: Response, options: UploadOptions): Promise<ReceivedUpload> {
  mkdirSync(options.dir, { recursive: true, mode: 0o700 });
  const upload = multer({
    storage: multer.diskStorage({
      destination: options.dir,
      filename: (_req, _file, callback) => callback(null, `${randomBytes(16).toString('hex')}.upload`),
    }),
    limits: { fileSize: options.maxBytes, files: 1, fields: 10, fieldSize: 64 * 1024, parts: 12 },
    defParamCharset: 'utf8',
  }).single(options.field);
  const megabytes = Math.round((options.maxBytes / (1024 * 1024)) * 10) / 10;
  return new Promise<ReceivedUpload>((resolve, reject) => {
    upload(req, res, (error: unknown) => {
      if (error instanceof MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return reject(new PayloadTooLargeException(`the file is larger than the ${megabytes} MB limit`));
        if (error.code === 'LIMIT_UNEXPECTED_FILE') return reject(new BadRequestException(`send one file, in the multipart field "${options.field}"`));
        return reject(new BadRequestException(`the upload was refused: ${error.message}`));
      }
      if (error) return reject(error instanceof Error ? new BadRequestException(`the upload failed: ${error.message}`) : error);
      const file = req.file;
      if (!file) return reject(new BadRequestException(`send the file as multipart/form-data, in the field "${options.field}"`));
      const fields: Record<string, string> = {};
      const body = (req.body ?? {}) as Record<string, unknown>;
      for (const [key, value] of Object.entries(body)) if (typeof value === 'string') fields[key] = value;
      resolve({ path: file.path, originalName: file.originalname, size: file.size, fields });
    });
    if (options.onBytes) {
      // Multer has piped the request into busboy synchronously above; this only watches the bytes go by.
      const header = Number(req.headers['content-length']);
      const total = Number.isFinite(header) && header > 0 ? header : null;
      let received = 0;
      const onBytes = options.onBytes;
      req.on('data', (chunk: Buffer) => {
        received += chunk.length;
        onBytes(received, total);
      });
    }
  });
}

/** The first bytes of a file, for sniffing its type. */
export async function readHead(path: string, length = SNIFF_BYTES): Promise<Uint8Array> {
  const handle = await open(path, 'r');
  try {
    const buffer = Buffer.alloc(length);
    const { bytesRead } = await handle.read(buffer, 0, length, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/** Removes a temporary file, ignoring one that is already gone. */
export async function removeQuietly(path: string): Promise<void> {
  await unlink(path).catch((error: NodeJS.ErrnoException) => {
    if (error.code !== 'ENOENT') throw error;
  });
}

/** Removes uploads left in `dir` by a server that stopped half-way (older than `olderThanMs`); answers how many. */
export async function removeStaleUploads(dir: string, olderThanMs: number, now = Date.now()): Promise<number> {
  const names = await readdir(dir).catch(() => [] as string[]);
  let removed = 0;
  for (const name of names) {
    if (!/^[0-9a-f]{32}\.upload$/.test(name)) continue;
    const path = join(dir, name);
    const info = await stat(path).catch(() => null);
    if (info && now - info.mtimeMs > olderThanMs) {
      await removeQuietly(path);
      removed += 1;
    }
  }
  return removed;
}
