import type { TestApp } from './test-app.js';

/** A download's body as one Buffer, whatever its content type (supertest parses only text and JSON by itself). */
export function binary(req: ReturnType<TestApp['http']['get']>) {
  return req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}
