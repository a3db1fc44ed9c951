import { Injectable, type NestMiddleware } from '@nestjs/common';
import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';

/** Largest file the public check accepts. */
export const MAX_CHECK_BYTES = 20 * 1024 * 1024;

const TOO_LARGE = {
  statusCode: 413,
  message: `The file is larger than ${MAX_CHECK_BYTES / 1024 / 1024} MB; a certificate PDF is far smaller, so this cannot be one of ours`,
  error: 'Payload Too Large',
};

const UNSUPPORTED = {
  statusCode: 415,
  message: 'Send the PDF as the request body (Content-Type: application/pdf) or as the multipart/form-data field "file"',
  error: 'Unsupported Media Type',
};

/** Reads the raw body into memory, refusing more than MAX_CHECK_BYTES. */
function raw(req: Request, _res: Response, done: (error?: unknown) => void): void {
  const chunks: Buffer[] = [];
  let size = 0;
  let failed = false;
  req.on('data', (chunk: Buffer) => {
    if (failed) return;
    size += chunk.length;
    if (size > MAX_CHECK_BYTES) {
      failed = true;
      req.resume();
      done({ status: 413 });
      return;
    }
    chunks.push(chunk);
  });
  req.on('end', () => {
    if (failed) return;
    req.body = Buffer.concat(chunks);
    done();
  });
  req.on('error', (error) => {
    if (!failed) done(error);
    failed = true;
  });
}

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_CHECK_BYTES, files: 1 } }).single('file');

/**
 * Reads the file of a public certificate check: the raw request body (application/pdf or
 * application/octet-stream) or the multipart field `file`, into memory, at most MAX_CHECK_BYTES.
 */
@Injectable()
export class CheckUploadMiddleware implements NestMiddleware {
  use(req: Request, res: Response, next: NextFunction): void {
    const declared = Number(req.headers['content-length'] ?? 0);
    if (declared > MAX_CHECK_BYTES + 64 * 1024) {
      res.status(413).json(TOO_LARGE);
      return;
    }
    const done = (error?: unknown) => {
      if (!error) return next();
      const e = error as { code?: string; type?: string; status?: number; message?: string };
      if (e.code === 'LIMIT_FILE_SIZE' || e.type === 'entity.too.large' || e.status === 413) {
        res.set('Connection', 'close').status(413).json(TOO_LARGE);
        return;
      }
      res.status(400).json({ statusCode: 400, message: `The upload could not be read: ${e.message ?? String(error)}`, error: 'Bad Request' });
    };
    if (req.is('multipart/form-data')) upload(req, res, done);
    else if (req.is(['application/pdf', 'application/octet-stream'])) raw(req, res, done);
    // Anything else (JSON and forms are read by the body parsers before this runs) has nothing left to read.
    else res.status(415).json(UNSUPPORTED);
  }
}
