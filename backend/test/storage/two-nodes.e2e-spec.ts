// Before the app loads: node A's var directory, and one session secret for both nodes (as a cluster shares it).
import { createHash, randomBytes } from 'node:crypto';
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { REPO_ROOT } from '../../src/config/app-config.js';
process.env.KC_DB_PASSWORD ??= readFileSync(join(REPO_ROOT, 'var', 'db-password'), 'utf8').trim();
const nodeA = mkdtempSync(join(tmpdir(), 'kc-node-a-'));
const nodeB = mkdtempSync(join(tmpdir(), 'kc-node-b-'));
process.env.KC_VAR_DIR = nodeA;
process.env.KC_JWT_SECRET = randomBytes(32).toString('hex');

import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';
import { binary } from '../support/binary-body.js';

/** A PNG of 2.5 MiB: three parts in the file store (1 MiB each at most). */
const PHOTO = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), randomBytes(2.5 * 1024 * 1024)]);
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/** Every file under a var directory, relative to it. */
function filesUnder(dir: string): string[] {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => join(e.parentPath, e.name).slice(dir.length + 1))
    .sort();
}

describe('two app nodes, one database: a file written through one is served and verified through the other', () => {
  let a: TestApp | null = null;
  let b: TestApp | null = null;
  const issued = { id: 0, number: '', sha256: '' };
  const attachment = { id: 0, url: '' };
  let pdfFromA: Buffer;

  beforeAll(async () => {
    // Node A: empties the database, migrates, loads the demo data (its signing key is made in A's var/keys).
    a = await createTestApp();
    // Northgate on account: its certificates are released at once (the hold until an invoice is paid is test/invoices').
    await a.dataSource.query(
      "REPLACE INTO customer_terms (organization_id, payment_terms, net_days) SELECT id, 'on_account', 30 FROM organizations WHERE name = 'Northgate Radio Club'",
    );
    const lead = { Authorization: `Bearer ${await tokenFor(a.http, DEMO.lead)}` };
    const tech = { Authorization: `Bearer ${await tokenFor(a.http, DEMO.tech)}` };
    const [job] = await a.dataSource.query(
      "SELECT j.id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1041' AND j.status = 'in_review'",
    );
    const signed = await a.http.post(`/api/jobs/${job.id}/sign`).set(lead).send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
    expect(signed.status).toBe(200);
    Object.assign(issued, { id: signed.body.id, number: signed.body.number, sha256: signed.body.sha256 });
    const got = await binary(a.http.get(`/api/certificates/${issued.id}/pdf`).set(lead));
    expect(got.status).toBe(200);
    pdfFromA = got.body as Buffer;
    const [instrument] = await a.dataSource.query('SELECT instrument_id FROM jobs WHERE id = ?', [job.id]);
    const uploaded = await a.http
      .post(`/api/instruments/${instrument.instrument_id}/attachments`)
      .set(tech)
      .attach('file', PHOTO, { filename: 'rear panel.png', contentType: 'image/png' });
    expect(uploaded.status).toBe(201);
    Object.assign(attachment, { id: uploaded.body.id, url: uploaded.body.url });
    // Nothing of either went to A's disk: only its key pair (the upload waited in tmp/ and is gone).
    expect(filesUnder(nodeA)).toEqual(['keys/certificate-signing.key.pem', 'keys/certificate-signing.pub.pem']);
    await a.close();
    a = null;

    // Node B: another var directory holding only the signing key files, the same database. Node A's disk is gone.
    cpSync(join(nodeA, 'keys'), join(nodeB, 'keys'), { recursive: true });
    rmSync(nodeA, { recursive: true, force: true });
    process.env.KC_VAR_DIR = nodeB;
    b = await createTestApp({ reset: false });
  }, 120_000);

  afterAll(async () => {
    await a?.close();
    await b?.close();
    rmSync(nodeA, { recursive: true, force: true });
    rmSync(nodeB, { recursive: true, force: true });
  });

  it('serves the certificate PDF issued through node A, byte for byte, to its customer through node B', async () => {
    const northgate = { Authorization: `Bearer ${await tokenFor(b!.http, DEMO.northgate)}` };
    const res = await binary(b!.http.get(`/api/certificates/${issued.id}/pdf`).set(northgate));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('application/pdf');
    expect(Buffer.compare(res.body as Buffer, pdfFromA)).toBe(0);
    expect(sha256(res.body as Buffer)).toBe(issued.sha256);
  });

  it('verifies that PDF on node B: the stored hash matches and the Ed25519 seal checks with the shared key', async () => {
    const check = await b!.http.post(`/api/public/certificates/${issued.number}/check`).set('Content-Type', 'application/pdf').send(pdfFromA);
    expect(check.status).toBe(200);
    expect(check.body).toMatchObject({ match: true, signatureValid: true, revision: 1, status: 'issued', sha256: issued.sha256 });
    const changed = Buffer.from(pdfFromA);
    changed[100] ^= 0x01;
    const refused = await b!.http.post(`/api/public/certificates/${issued.number}/check`).set('Content-Type', 'application/pdf').send(changed);
    expect(refused.body.match).toBe(false);
  });

  it('serves the attachment uploaded through node A, byte-identical, through node B', async () => {
    const lead = { Authorization: `Bearer ${await tokenFor(b!.http, DEMO.lead)}` };
    const res = await binary(b!.http.get(attachment.url).set(lead));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('image/png');
    expect(res.headers['content-length']).toBe(String(PHOTO.length));
    expect(Buffer.compare(res.body as Buffer, PHOTO)).toBe(0);
  });

  it('writes nothing to node B’s disk while serving: its var directory still holds only the keys', () => {
    expect(existsSync(nodeA)).toBe(false);
    expect(filesUnder(nodeB)).toEqual(['keys/certificate-signing.key.pem', 'keys/certificate-signing.pub.pem']);
  });
});
