// Backup and restore through the real commands (bin/kilocycle backup | restore | db), on a var directory
// and a private MariaDB of this test's own (its own port), so the shared var/ and server are never touched.
import { spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Test } from '@nestjs/testing';
import { AppModule } from '../../src/app.module.js';
import { REPO_ROOT } from '../../src/config/app-config.js';
import { MIGRATIONS } from '../../src/database/migrations/index.js';
import { createTestApp, resetDatabase, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

const KILOCYCLE = join(REPO_ROOT, 'bin', 'kilocycle');
const work = mkdtempSync(join(tmpdir(), 'kc-backup-'));
const varDir = join(work, 'var');
const archives = join(work, 'archives');
const savedEnv = { ...process.env };
let dbPort = 0;
let appPort = 0;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
    server.on('error', reject);
  });
}

function childEnv(varPath = varDir): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...savedEnv, KC_VAR_DIR: varPath, KC_DB_PORT: String(dbPort), KC_PORT: String(appPort), KC_DB_NAME: 'kilocycle' };
  delete env.NODE_OPTIONS; // jest's --experimental-vm-modules is not for the commands
  delete env.KC_DB_PASSWORD;
  return env;
}

function kilocycle(args: string[], varPath = varDir): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(KILOCYCLE, args, { env: childEnv(varPath), encoding: 'utf8', timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** The table as the mariadb client prints it, over the test server's root socket: independent of the app. */
function tableDigest(table: string): { count: number; sha256: string } {
  const out = spawnSync(
    'mariadb',
    ['--no-defaults', `--socket=${join(varDir, 'mariadb', 'mysqld.sock')}`, '-uroot', '-N', '-B', '-e', `SELECT * FROM ${table} ORDER BY id`, 'kilocycle'],
    { encoding: 'utf8' },
  );
  if (out.status !== 0) throw new Error(out.stderr);
  return { count: out.stdout.split('\n').filter(Boolean).length, sha256: createHash('sha256').update(out.stdout).digest('hex') };
}

function sqlValue(statement: string): string {
  const out = spawnSync(
    'mariadb',
    ['--no-defaults', `--socket=${join(varDir, 'mariadb', 'mysqld.sock')}`, '-uroot', '-N', '-B', '-e', statement, 'kilocycle'],
    { encoding: 'utf8' },
  );
  if (out.status !== 0) throw new Error(out.stderr);
  return out.stdout.trim();
}

/** Every file under dir with its SHA-256, to show that a refused restore changed nothing. */
function filesDigest(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    if (!existsSync(d)) return;
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = join(d, e.name);
      if (e.isDirectory()) walk(p);
      else out[p.slice(dir.length)] = createHash('sha256').update(readFileSync(p)).digest('hex');
    }
  };
  for (const sub of ['keys', 'certificates', 'uploads']) walk(join(dir, sub));
  for (const f of ['jwt-secret', 'db-password'])
    if (existsSync(join(dir, f)))
      out[`/${f}`] = createHash('sha256')
        .update(readFileSync(join(dir, f)))
        .digest('hex');
  return out;
}

/** 1.5 MiB: two parts in the file store, so the dump carries a file split over rows. */
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), randomBytes(1.5 * 1024 * 1024)]);

describe('backup and restore (bin/kilocycle, own MariaDB and var directory)', () => {
  let t: TestApp | null = null;
  let archive = '';
  let certificateId = 0;
  let certificateNumber = '';
  let attachmentId = 0;
  let pdfBefore: Buffer;
  let readingsBefore: { count: number; sha256: string };
  let certificatesBefore: { count: number; sha256: string };

  const startApp = async (): Promise<{ app: TestApp; as: AsDemo }> => {
    t = await createTestApp({ reset: false });
    return { app: t, as: await signInDemo(t.http) };
  };
  const stopApp = async () => {
    await t?.close();
    t = null;
  };

  beforeAll(async () => {
    dbPort = await freePort();
    appPort = await freePort();
    const started = kilocycle(['db', 'start']);
    expect(started.stderr).toBe('');
    expect(started.status).toBe(0);
    Object.assign(process.env, { KC_VAR_DIR: varDir, KC_DB_PORT: String(dbPort), KC_DB_NAME: 'kilocycle' });
    delete process.env.KC_DB_PASSWORD; // the app reads var/db-password, as on a machine
    await resetDatabase(); // migrations and the demo data, which issues certificate QL-2026-0001 with a key in varDir/keys
    const { app, as } = await startApp();
    const [cert] = await app.dataSource.query("SELECT id, number FROM certificates WHERE status = 'issued' AND signature IS NOT NULL ORDER BY id LIMIT 1");
    certificateId = Number(cert.id);
    certificateNumber = String(cert.number);
    const pdf = await app.http
      .get(`/api/certificates/${certificateId}/pdf`)
      .set(as('lead'))
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    pdfBefore = pdf.body as Buffer;
    const [instrument] = await app.dataSource.query('SELECT id FROM instruments ORDER BY id LIMIT 1');
    const attached = await app.http
      .post(`/api/instruments/${instrument.id}/attachments`)
      .set(as('tech'))
      .attach('file', PNG, { filename: 'front panel.png', contentType: 'image/png' });
    expect(attached.status).toBe(201);
    attachmentId = Number(attached.body.id);
    await stopApp();
    readingsBefore = tableDigest('readings');
    certificatesBefore = tableDigest('certificates');
    expect(readingsBefore.count).toBeGreaterThan(100);
  }, 120_000);

  afterAll(async () => {
    await stopApp();
    kilocycle(['db', 'stop']);
    process.env = savedEnv;
    rmSync(work, { recursive: true, force: true });
  });

  it('writes one archive with the dump (stored PDFs and attachments inside it), the keys, the secrets, a manifest and checksums', () => {
    const res = kilocycle(['backup', '--to', archives]);
    expect(res.stderr).toBe('');
    expect(res.status).toBe(0);
    const names = readdirSync(archives);
    expect(names).toHaveLength(1);
    expect(names[0]).toMatch(/^kilocycle-\d{8}-\d{6}\.tar\.gz$/);
    archive = join(archives, names[0]!);
    expect(res.stdout).toContain(archive);

    // Open it with Debian's tools, as an operator would, and check every member with sha256sum.
    const out = join(work, 'opened');
    mkdirSync(out);
    expect(spawnSync('tar', ['-xzf', archive, '-C', out]).status).toBe(0);
    const top = join(out, 'kilocycle-backup');
    const sums = spawnSync('sha256sum', ['--check', '--strict', 'SHA256SUMS'], { cwd: top, encoding: 'utf8' });
    expect(sums.status).toBe(0);
    const manifest = JSON.parse(readFileSync(join(top, 'manifest.json'), 'utf8'));
    expect(manifest).toMatchObject({ format: 'kilocycle-backup', formatVersion: 1, database: { name: 'kilocycle' } });
    expect(Date.parse(manifest.createdAt)).toBeGreaterThan(Date.now() - 120_000);
    expect(manifest.database.migrations.count).toBe(MIGRATIONS.length);
    expect(manifest.database.migrations.count).toBe(Number(sqlValue('SELECT COUNT(*) FROM kc_migrations')));
    expect(manifest.database.counts.readings).toBe(readingsBefore.count);
    expect(manifest.database.counts.certificates).toBe(certificatesBefore.count);
    const paths = (manifest.files as { path: string }[]).map((f) => f.path);
    expect(paths).toEqual(
      expect.arrayContaining([
        'database.sql',
        'files/keys/certificate-signing.key.pem',
        'files/keys/certificate-signing.pub.pem',
        'files/jwt-secret',
        'files/db-password',
      ]),
    );
    // PDFs and attachments live in the database (stored_files), not under var/: the dump carries them.
    expect(existsSync(join(varDir, 'certificates'))).toBe(false);
    expect(existsSync(join(varDir, 'uploads'))).toBe(false);
    expect(paths.some((p) => p.startsWith('files/certificates/') || p.startsWith('files/uploads/'))).toBe(false);
    // Every member but the list itself is named in the manifest and in SHA256SUMS.
    const summed = readFileSync(join(top, 'SHA256SUMS'), 'utf8')
      .trim()
      .split('\n')
      .map((l) => l.slice(66));
    expect(summed.sort()).toEqual(['manifest.json', ...paths].sort());
    const dump = readFileSync(join(top, 'database.sql'), 'utf8');
    expect(dump).toContain('CREATE TABLE `readings`');
    expect(dump).toContain('CREATE TABLE `stored_files`');
    // mariadb-dump --hex-blob writes each part as 0x…: the PDF's first bytes and the photo's last are in it.
    expect(dump).toContain(pdfBefore.subarray(0, 256).toString('hex').toUpperCase());
    expect(dump).toContain(
      PNG.subarray(PNG.length - 256)
        .toString('hex')
        .toUpperCase(),
    );
  });

  it('refuses a damaged archive (one byte flipped, or a member changed) and changes nothing', () => {
    const before = { readings: tableDigest('readings'), files: filesDigest(varDir) };
    const flipped = join(work, 'flipped.tar.gz');
    const bytes = readFileSync(archive);
    bytes[Math.floor(bytes.length / 2)] ^= 0x01;
    writeFileSync(flipped, bytes);
    const res = kilocycle(['restore', '--force', flipped]);
    expect(res.status).not.toBe(0);
    expect(res.stderr).toContain('is damaged or is not a Kilocycle backup');
    expect(res.stderr).toContain('Nothing was changed');
    expect(tableDigest('readings')).toEqual(before.readings);
    expect(filesDigest(varDir)).toEqual(before.files);

    // A member changed after the backup, the archive repacked: gzip is happy, the checksum is not.
    const out = join(work, 'tamper');
    mkdirSync(out);
    expect(spawnSync('tar', ['-xzf', archive, '-C', out]).status).toBe(0);
    const dump = join(out, 'kilocycle-backup', 'database.sql');
    writeFileSync(dump, readFileSync(dump, 'utf8').replace('CREATE TABLE `readings`', 'CREATE TABLE `readingz`'));
    const tampered = join(work, 'tampered.tar.gz');
    expect(spawnSync('tar', ['-czf', tampered, '-C', out, 'kilocycle-backup']).status).toBe(0);
    const fresh = join(work, 'fresh-var');
    const refused = kilocycle(['restore', tampered], fresh);
    expect(refused.status).not.toBe(0);
    expect(refused.stderr).toContain('database.sql does not match its SHA-256 checksum');
    expect(existsSync(fresh)).toBe(false); // not even the var directory was made
  });

  it('refuses to restore over a database and files that hold data unless --force', () => {
    const before = { readings: tableDigest('readings'), files: filesDigest(varDir) };
    const res = kilocycle(['restore', archive]);
    expect(res.status).not.toBe(0);
    expect(res.stderr).toContain('refusing to overwrite');
    expect(res.stderr).toContain('--force');
    expect(tableDigest('readings')).toEqual(before.readings);
    expect(filesDigest(varDir)).toEqual(before.files);
  });

  it('restores on an empty var directory: the certificate downloads, its public check passes, every reading is there', async () => {
    expect(kilocycle(['db', 'stop']).status).toBe(0);
    const filesBefore = filesDigest(varDir);
    rmSync(varDir, { recursive: true, force: true });

    const res = kilocycle(['restore', archive]);
    expect(res.stderr).not.toMatch(/kilocycle: /);
    expect(res.status).toBe(0);
    expect(filesDigest(varDir)).toEqual(filesBefore);
    expect(kilocycle(['db', 'start']).status).toBe(0);
    expect(tableDigest('readings')).toEqual(readingsBefore);
    expect(tableDigest('certificates')).toEqual(certificatesBefore);

    const { app, as } = await startApp();
    const pdf = await app.http
      .get(`/api/certificates/${certificateId}/pdf`)
      .set(as('lead'))
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    expect(Buffer.compare(pdf.body as Buffer, pdfBefore)).toBe(0);
    const check = await app.http
      .post(`/api/public/certificates/${certificateNumber}/check`)
      .attach('file', pdfBefore, { filename: 'certificate.pdf', contentType: 'application/pdf' });
    expect(check.status).toBe(200);
    expect(check.body).toMatchObject({ match: true, signatureValid: true });
    const attachment = await app.http
      .get(`/api/attachments/${attachmentId}`)
      .set(as('tech'))
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(attachment.status).toBe(200);
    expect(Buffer.compare(attachment.body as Buffer, PNG)).toBe(0);
    await stopApp();
  });

  it('refuses to start, without making a new key, while issued certificates exist and var/keys is missing', async () => {
    const keys = join(varDir, 'keys');
    const kept = readFileSync(join(keys, 'certificate-signing.key.pem'));
    rmSync(keys, { recursive: true, force: true });

    // In process, as createTestApp would start it; the refused app is closed so its pool does not linger.
    const refusedApp = (await Test.createTestingModule({ imports: [AppModule] }).compile()).createNestApplication({ logger: false });
    await expect(refusedApp.init()).rejects.toThrow(/signing key .* is missing[\s\S]*Restore var\/keys from your backup: bin\/kilocycle restore/);
    await refusedApp.close();
    expect(existsSync(keys)).toBe(false);

    // The real server process: exits non-zero with the message, and no stack trace.
    const main = join(REPO_ROOT, 'backend', 'dist', 'main.js');
    expect(existsSync(join(REPO_ROOT, 'backend', 'dist', 'certificates', 'signing-key-check.js'))).toBe(true); // build first
    const server = spawnSync(process.execPath, [main], {
      env: { ...childEnv(), KC_SMTP_PORT: '0', KC_RECALL_DISABLED: '1' },
      encoding: 'utf8',
      timeout: 30_000,
    });
    expect(server.status).toBe(1);
    expect(server.stderr).toContain('Restore var/keys from your backup');
    expect(server.stderr).not.toMatch(/^\s+at /m);
    expect(existsSync(keys)).toBe(false);

    // The way out the message names: the keys alone, from the archive.
    const res = kilocycle(['restore', '--keys-only', archive]);
    expect(res.status).toBe(0);
    expect(Buffer.compare(readFileSync(join(keys, 'certificate-signing.key.pem')), kept)).toBe(0);
    const { app } = await startApp();
    const check = await app.http.post(`/api/public/certificates/${certificateNumber}/check`).set('Content-Type', 'application/pdf').send(pdfBefore);
    expect(check.body).toMatchObject({ match: true, signatureValid: true });
    await stopApp();
  });

  it('with --force, replaces what is there after keeping a backup of it', () => {
    const res = kilocycle(['restore', '--force', archive]);
    expect(res.stderr).not.toMatch(/kilocycle: /);
    expect(res.status).toBe(0);
    const kept = readdirSync(join(varDir, 'backups')).filter((n) => n.startsWith('kilocycle-pre-restore-'));
    expect(kept).toHaveLength(1);
    expect(tableDigest('readings')).toEqual(readingsBefore);
  });
});
