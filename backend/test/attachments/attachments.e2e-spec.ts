// Before the app loads: a private var directory (uploads wait in its tmp/), with a 20 kB limit for the size test.
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { REPO_ROOT } from '../../src/config/app-config.js';
process.env.KC_DB_PASSWORD ??= readFileSync(join(REPO_ROOT, 'var', 'db-password'), 'utf8').trim();
const varDir = mkdtempSync(join(tmpdir(), 'kc-attachments-'));
process.env.KC_VAR_DIR = varDir;
process.env.KC_ATTACHMENT_MAX_MB = String(20 / 1024);

import type { Attachment } from '@kilocycle/common/types';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createRun, organizationId } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(200, 7)]);
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
const ZIP = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(60, 0)]);

describe('attachments (e2e, MariaDB)', () => {
  let t: TestApp;
  let saltmarshRun: { jobId: number; instrumentId: number };
  const tokens: Partial<Record<keyof typeof DEMO, string>> = {};
  const auth = (who: keyof typeof DEMO) => ({ Authorization: `Bearer ${tokens[who]}` });
  const attach = (who: keyof typeof DEMO, path: string, file: Buffer, name: string, declared = 'application/octet-stream', caption?: string) => {
    const req = t.http.post(path).set(auth(who));
    if (caption !== undefined) req.field('caption', caption);
    return req.attach('file', file, { filename: name, contentType: declared });
  };
  // The attachments' files, as the file store keeps them (head rows of stored_files).
  const storedFiles = async (): Promise<number[]> =>
    (await t.dataSource.query("SELECT id FROM stored_files WHERE kind = 'attachment' AND file_id IS NULL ORDER BY id")).map((r: { id: number }) =>
      Number(r.id),
    );
  const binary = (req: ReturnType<TestApp['http']['get']>) =>
    req.buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });

  beforeAll(async () => {
    t = await createTestApp();
    const run = await createRun(t.dataSource, { organizationId: await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh), benchId: null });
    const [job] = await t.dataSource.query('SELECT instrument_id FROM jobs WHERE id = ?', [run.jobId]);
    saltmarshRun = { jobId: run.jobId, instrumentId: Number(job.instrument_id) };
    for (const who of ['tech', 'lead', 'engineer', 'saltmarsh', 'northgate'] as const) tokens[who] = await tokenFor(t.http, DEMO[who]);
  });
  afterAll(async () => {
    await t.close();
    rmSync(varDir, { recursive: true, force: true });
  });

  it('stores a photo in the file store with the type found in its bytes, and serves it back to the owner’s organisation', async () => {
    const res = await attach(
      'tech',
      `/api/instruments/${saltmarshRun.instrumentId}/attachments`,
      PNG,
      'as found – front panel.jpg',
      'image/jpeg',
      'As found: dial glass cracked',
    );
    expect(res.status).toBe(201);
    const view = res.body as Attachment;
    expect(view).toMatchObject({
      owner: 'instrument',
      instrumentId: saltmarshRun.instrumentId,
      jobId: null,
      originalName: 'as found – front panel.jpg',
      caption: 'As found: dial glass cracked',
      contentType: 'image/png',
      sizeBytes: PNG.length,
      sha256: createHash('sha256').update(PNG).digest('hex'),
      uploadedByName: 'Tomas Reyes',
      url: `/api/attachments/${view.id}`,
    });
    const [row] = await t.dataSource.query('SELECT file_id FROM attachments WHERE id = ?', [view.id]);
    expect(await storedFiles()).toEqual([Number(row.file_id)]);
    const [stored] = await t.dataSource.query('SELECT sha256, size_bytes, content FROM stored_files WHERE id = ?', [row.file_id]);
    expect({ sha256: stored.sha256, size: Number(stored.size_bytes) }).toEqual({ sha256: view.sha256, size: PNG.length });
    expect(Buffer.compare(stored.content as Buffer, PNG)).toBe(0);
    // Nothing of it stays on this node's disk: the upload left var/tmp and nothing went to var/uploads.
    expect(readdirSync(join(varDir, 'tmp'))).toEqual([]);
    expect(existsSync(join(varDir, 'uploads'))).toBe(false);

    const own = await binary(t.http.get(view.url).set(auth('saltmarsh')));
    expect(own.status).toBe(200);
    expect(own.headers['content-type']).toBe('image/png');
    expect(own.headers['content-disposition']).toContain(
      'inline; filename="as found _ front panel.jpg"; filename*=UTF-8\'\'as%20found%20%E2%80%93%20front%20panel.jpg',
    );
    expect(Buffer.compare(own.body as Buffer, PNG)).toBe(0);
    expect((await t.http.get(`${view.url}?download=true`).set(auth('engineer'))).headers['content-disposition']).toMatch(/^attachment;/);
    const list = await t.http.get(`/api/instruments/${saltmarshRun.instrumentId}/attachments`).set(auth('saltmarsh'));
    expect(list.body).toEqual({ items: [view], total: 1 });
  });

  it("answers 404 to another organisation's client, for the list and for the bytes", async () => {
    const res = await attach('lead', `/api/jobs/${saltmarshRun.jobId}/attachments`, PDF, 'setup.pdf');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ owner: 'job', jobId: saltmarshRun.jobId, contentType: 'application/pdf' });
    expect((await t.http.get(res.body.url).set(auth('northgate'))).status).toBe(404);
    expect((await t.http.get(`/api/jobs/${saltmarshRun.jobId}/attachments`).set(auth('northgate'))).status).toBe(404);
    expect((await t.http.get(`/api/instruments/${saltmarshRun.instrumentId}/attachments`).set(auth('northgate'))).status).toBe(404);
    expect((await t.http.get(res.body.url)).status).toBe(401);
  });

  it('decides the type from the bytes: text named .png is text, a ZIP or unknown bytes are refused (415), whatever was declared', async () => {
    const text = await attach('tech', `/api/jobs/${saltmarshRun.jobId}/attachments`, Buffer.from('Owner says: hums on band 2.\n'), 'photo.png', 'image/png');
    expect(text.status).toBe(201);
    expect(text.body.contentType).toBe('text/plain');
    expect((await t.http.get(text.body.url).set(auth('tech'))).headers['content-type']).toBe('text/plain; charset=utf-8');
    const before = (await storedFiles()).length;
    const zip = await attach('tech', `/api/jobs/${saltmarshRun.jobId}/attachments`, ZIP, 'scan.jpg', 'image/jpeg');
    expect(zip.status).toBe(415);
    expect(zip.body.message).toBe(
      'attachments may be JPEG, PNG, GIF or WebP images, PDF documents or plain text; this file looks like a ZIP archive (an .xlsx, .ods or .docx file is one)',
    );
    const noise = await attach('tech', `/api/jobs/${saltmarshRun.jobId}/attachments`, Buffer.from([0, 1, 2, 3, 250, 251, 0, 9]), 'photo.jpg', 'image/jpeg');
    expect(noise.status).toBe(415);
    expect(noise.body.message).toContain('binary data');
    const big = await attach('tech', `/api/jobs/${saltmarshRun.jobId}/attachments`, Buffer.concat([PNG, Buffer.alloc(25 * 1024)]), 'big.png');
    expect(big.status).toBe(413);
    expect((await storedFiles()).length).toBe(before);
    expect(readdirSync(join(varDir, 'tmp'))).toEqual([]);
  });

  it('only technicians, leads and admins attach; only leads and admins delete, which is audited and removes the stored file', async () => {
    expect((await attach('engineer', `/api/jobs/${saltmarshRun.jobId}/attachments`, PNG, 'x.png')).status).toBe(403);
    expect((await attach('saltmarsh', `/api/jobs/${saltmarshRun.jobId}/attachments`, PNG, 'x.png')).status).toBe(403);
    expect((await attach('tech', '/api/jobs/999999/attachments', PNG, 'x.png')).status).toBe(404);
    const res = await attach('tech', `/api/jobs/${saltmarshRun.jobId}/attachments`, PNG, 'doomed.png');
    const [row] = await t.dataSource.query('SELECT file_id FROM attachments WHERE id = ?', [res.body.id]);
    expect(await storedFiles()).toContain(Number(row.file_id));
    expect((await t.http.delete(res.body.url).set(auth('tech'))).status).toBe(403);
    expect((await t.http.delete(res.body.url).set(auth('lead'))).status).toBe(204);
    expect(await storedFiles()).not.toContain(Number(row.file_id));
    expect(await t.dataSource.query('SELECT id FROM stored_files WHERE id = ? OR file_id = ?', [row.file_id, row.file_id])).toEqual([]);
    expect((await t.http.get(res.body.url).set(auth('lead'))).status).toBe(404);
    const [audit] = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'job' AND action = 'detach' ORDER BY id DESC LIMIT 1");
    expect(typeof audit.changes === 'string' ? JSON.parse(audit.changes) : audit.changes).toMatchObject({
      attachmentId: res.body.id,
      originalName: 'doomed.png',
    });
  });
});
