// Before the app loads: a private var directory, where the files lived before they moved into the database.
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { REPO_ROOT } from '../../src/config/app-config.js';
process.env.KC_DB_PASSWORD ??= readFileSync(join(REPO_ROOT, 'var', 'db-password'), 'utf8').trim();
const varDir = mkdtempSync(join(tmpdir(), 'kc-move-files-'));
process.env.KC_VAR_DIR = varDir;

import { jest } from '@jest/globals';
import { Logger } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { loadConfig } from '../../src/config/app-config.js';
import { createDataSource } from '../../src/database/create-data-source.js';
import { ENTITIES } from '../../src/database/entities.js';
import { MIGRATIONS } from '../../src/database/migrations/index.js';
import { typeormOptions } from '../../src/database/typeorm-options.js';
import { StoredFile } from '../../src/storage/stored-file.entity.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';
import { binary } from '../support/binary-body.js';

/** Where the move stands among the migrations, and the ones written after it (undone first, run again after it). */
const STORE_FILES = MIGRATIONS.findIndex((m) => new m().name === 'StoreFilesInDatabase1765000000000');
const LATER = MIGRATIONS.slice(STORE_FILES + 1).map((m) => new m().name);

/** 1.5 MiB: two parts in the file store. */
const PHOTO = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), randomBytes(1.5 * 1024 * 1024)]);
const NOTE = Buffer.from('Owner reports the dial lamp flickers on range C.\n');
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

async function columns(ds: DataSource, table: string): Promise<string[]> {
  return (await ds.query(`SHOW COLUMNS FROM ${table}`)).map((c: { Field: string }) => c.Field);
}

describe('migration StoreFilesInDatabase: files move from var/ into the database', () => {
  let ds: DataSource;
  let t: TestApp | null = null;
  /** Every issued certificate's PDF and each attachment's bytes, as served before the migration is undone and done again. */
  const pdfs = new Map<number, Buffer>();
  const kept = { certificateId: 0, number: '' };
  const lost = { certificateId: 0, number: '' };
  const photo = { id: 0 };
  const note = { id: 0 };

  beforeAll(async () => {
    t = await createTestApp();
    const lead = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.lead)}` };
    const tech = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.tech)}` };
    const [job] = await t.dataSource.query(
      "SELECT j.id, j.instrument_id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1041' AND j.status = 'in_review'",
    );
    const signed = await t.http.post(`/api/jobs/${job.id}/sign`).set(lead).send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
    expect(signed.status).toBe(200);
    Object.assign(lost, { certificateId: signed.body.id, number: signed.body.number });
    const rows: Array<{ id: number; number: string }> = await t.dataSource.query(
      'SELECT id, number FROM certificates WHERE pdf_file_id IS NOT NULL ORDER BY id',
    );
    expect(rows.length).toBeGreaterThanOrEqual(2);
    for (const row of rows) {
      const res = await binary(t.http.get(`/api/certificates/${row.id}/pdf`).set(lead));
      expect(res.status).toBe(200);
      pdfs.set(Number(row.id), res.body as Buffer);
    }
    const other = rows.find((r) => Number(r.id) !== lost.certificateId)!;
    Object.assign(kept, { certificateId: Number(other.id), number: other.number });
    const attach = (file: Buffer, name: string) => t!.http.post(`/api/instruments/${job.instrument_id}/attachments`).set(tech).attach('file', file, name);
    photo.id = (await attach(PHOTO, 'dial.png')).body.id;
    note.id = (await attach(NOTE, 'note.txt')).body.id;
    expect(photo.id && note.id).toBeTruthy();
    await t.close();
    t = null;
    ds = createDataSource();
    await ds.initialize();
  }, 120_000);

  afterAll(async () => {
    jest.restoreAllMocks();
    await t?.close();
    await ds?.destroy();
    rmSync(varDir, { recursive: true, force: true });
  });

  it('undone, writes every stored file back under var/ as the app before it kept them', async () => {
    // The migrations after it (issue 18's price list, quotes, …) go down first.
    for (let i = 0; i <= LATER.length; i += 1) await ds.undoLastMigration({ transaction: 'each' });
    expect((await ds.query("SHOW TABLES LIKE 'stored_files'")).length).toBe(0);
    expect(await columns(ds, 'certificates')).toContain('file_name');
    expect(await columns(ds, 'attachments')).toContain('storage_name');
    for (const [id, pdf] of pdfs) {
      const [row] = await ds.query('SELECT file_name FROM certificates WHERE id = ?', [id]);
      expect(Buffer.compare(readFileSync(join(varDir, 'certificates', row.file_name)), pdf)).toBe(0);
    }
    for (const [id, bytes] of [
      [photo.id, PHOTO],
      [note.id, NOTE],
    ] as const) {
      const [row] = await ds.query('SELECT storage_name FROM attachments WHERE id = ?', [id]);
      expect(Buffer.compare(readFileSync(join(varDir, 'uploads', 'attachments', row.storage_name)), bytes)).toBe(0);
    }
  });

  it('refuses to start the move when a folder stands where a file should be, and changes nothing', async () => {
    const [row] = await ds.query('SELECT storage_name FROM attachments WHERE id = ?', [photo.id]);
    const path = join(varDir, 'uploads', 'attachments', row.storage_name);
    renameSync(path, `${path}.aside`);
    mkdirSync(path);
    try {
      const refused: unknown = await ds.runMigrations({ transaction: 'each' }).catch((error: unknown) => error);
      expect(refused).toBeInstanceOf(Error);
      expect((refused as Error).message).toContain(`${path} is not a file`);
      expect((refused as Error).message).toContain('Nothing was changed');
      expect((await ds.query("SHOW TABLES LIKE 'stored_files'")).length).toBe(0);
      expect(await columns(ds, 'certificates')).toContain('file_name');
      expect(await columns(ds, 'certificates')).not.toContain('pdf_file_id');
      expect(Number((await ds.query('SELECT COUNT(*) AS n FROM kc_migrations'))[0].n)).toBe(STORE_FILES);
    } finally {
      rmSync(path, { recursive: true });
      renameSync(`${path}.aside`, path);
    }
  });

  it('moves every file into stored_files; a file already missing is logged and its row left naming no file', async () => {
    const [lostRow] = await ds.query('SELECT file_name FROM certificates WHERE id = ?', [lost.certificateId]);
    rmSync(join(varDir, 'certificates', lostRow.file_name));
    const [noteRow] = await ds.query('SELECT storage_name FROM attachments WHERE id = ?', [note.id]);
    rmSync(join(varDir, 'uploads', 'attachments', noteRow.storage_name));
    const warned: string[] = [];
    const logged: string[] = [];
    jest.spyOn(Logger.prototype, 'warn').mockImplementation((message: unknown) => void warned.push(String(message)));
    jest.spyOn(Logger.prototype, 'log').mockImplementation((message: unknown) => void logged.push(String(message)));
    const ran = await ds.runMigrations({ transaction: 'each' });
    jest.restoreAllMocks();
    expect(ran.map((m) => m.name)).toEqual(['StoreFilesInDatabase1765000000000', ...LATER]);
    expect(warned).toEqual([
      expect.stringMatching(
        new RegExp(`^certificate ${lost.number} revision 1: its PDF .*${lostRow.file_name} was already missing; the certificate now names no file`),
      ),
      expect.stringMatching(new RegExp(`^attachment ${note.id}: its file .*${noteRow.storage_name} was already missing; the attachment now names no file`)),
    ]);
    // Moved: every certificate PDF but the lost one, and the photo.
    expect(logged).toEqual([
      expect.stringContaining(`moved ${pdfs.size} file(s) from ${varDir} into the database (table stored_files); 2 named file(s) were missing`),
    ]);
    expect(await columns(ds, 'certificates')).not.toContain('file_name');
    expect(await columns(ds, 'attachments')).not.toContain('storage_name');
    const [lostNow] = await ds.query('SELECT pdf_file_id FROM certificates WHERE id = ?', [lost.certificateId]);
    expect(lostNow.pdf_file_id).toBeNull();
    const [keptNow] = await ds.query('SELECT s.sha256, s.size_bytes FROM certificates c JOIN stored_files s ON s.id = c.pdf_file_id WHERE c.id = ?', [
      kept.certificateId,
    ]);
    expect(keptNow).toEqual({ sha256: sha256(pdfs.get(kept.certificateId)!), size_bytes: pdfs.get(kept.certificateId)!.length });
    const [photoNow] = await ds.query('SELECT s.part_count FROM attachments a JOIN stored_files s ON s.id = a.file_id WHERE a.id = ?', [photo.id]);
    expect(photoNow.part_count).toBe(2);
  });

  it('leaves the schema the entities describe, the file store included', async () => {
    const config = loadConfig();
    const withStore = new DataSource({ ...typeormOptions(config), entities: [...ENTITIES, StoredFile] });
    await withStore.initialize();
    try {
      const pending = await withStore.driver.createSchemaBuilder().log();
      expect(pending.upQueries.map((q) => q.query)).toEqual([]);
    } finally {
      await withStore.destroy();
    }
  });

  it('serves and verifies from the database with var/certificates and var/uploads gone; a file that was missing answers 404 saying so', async () => {
    rmSync(join(varDir, 'certificates'), { recursive: true });
    rmSync(join(varDir, 'uploads'), { recursive: true });
    t = await createTestApp({ reset: false });
    const lead = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.lead)}` };
    const pdf = await binary(t.http.get(`/api/certificates/${kept.certificateId}/pdf`).set(lead));
    expect(pdf.status).toBe(200);
    expect(Buffer.compare(pdf.body as Buffer, pdfs.get(kept.certificateId)!)).toBe(0);
    const check = await t.http.post(`/api/public/certificates/${kept.number}/check`).set('Content-Type', 'application/pdf').send(pdf.body);
    expect(check.body).toMatchObject({ match: true, signatureValid: true });
    const gone = await t.http.get(`/api/certificates/${lost.certificateId}/pdf`).set(lead);
    expect(gone.status).toBe(404);
    expect(gone.body.message).toBe(`The PDF of certificate ${lost.number} revision 1 is missing from the store`);
    expect((await t.http.get(`/api/certificates/${lost.certificateId}`).set(lead)).body.pdfUrl).toBeNull();
    // Its hash and seal are still in the row: a customer's own copy still verifies.
    const copy = await t.http.post(`/api/public/certificates/${lost.number}/check`).set('Content-Type', 'application/pdf').send(pdfs.get(lost.certificateId)!);
    expect(copy.body).toMatchObject({ match: true, signatureValid: true });
    const photoRes = await binary(t.http.get(`/api/attachments/${photo.id}`).set(lead));
    expect(photoRes.status).toBe(200);
    expect(Buffer.compare(photoRes.body as Buffer, PHOTO)).toBe(0);
    const noteRes = await t.http.get(`/api/attachments/${note.id}`).set(lead);
    expect(noteRes.status).toBe(404);
    expect(noteRes.body.message).toBe(`the file of attachment ${note.id} is missing from the store`);
    expect(existsSync(join(varDir, 'certificates'))).toBe(false);
  });
});
