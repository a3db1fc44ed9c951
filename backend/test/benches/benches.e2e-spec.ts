import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { Socket } from 'socket.io-client';
import { INGEST_EVENTS, NAMESPACES } from '@kilocycle/common/events';
import { REPO_ROOT } from '../../src/config/app-config.js';
import { connect, listen, request } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

const run = promisify(execFile);
// `bin/kilocycle bench …` runs the command line's composition root with `bench` first.
const CLI = join(REPO_ROOT, 'backend', 'dist', 'cli.js');
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

describe('benches and bench tokens (e2e, MariaDB)', () => {
  let t: TestApp;
  let url: string;
  let sockets: Socket[] = [];
  const tokens: Partial<Record<keyof typeof DEMO, string>> = {};

  beforeAll(async () => {
    t = await createTestApp();
    url = await listen(t);
    for (const who of ['admin', 'lead', 'tech', 'engineer', 'northgate'] as const) tokens[who] = await tokenFor(t.http, DEMO[who]);
  });
  afterEach(() => {
    for (const s of sockets) s.disconnect();
    sockets = [];
  });
  afterAll(async () => {
    await t.close();
  });
  const as = (who: keyof typeof DEMO) => ({ Authorization: `Bearer ${tokens[who]}` });
  const auditOf = (benchId: number) =>
    t.dataSource.query('SELECT action, actor_id, changes FROM audit_events WHERE entity = ? AND entity_id = ? ORDER BY id', ['bench', String(benchId)]);

  it('should bring a demo Bench 1 with the in-date counter, and an open warm-up run on it for the live demo', async () => {
    const list = await t.http.get('/api/benches?q=Bench%201').set(as('tech'));
    expect(list.body.items).toEqual([expect.objectContaining({ name: 'Bench 1', defaultStandardName: 'Bench counter A', hasToken: false, active: true })]);
    const [run] = await t.dataSource.query(
      "SELECT r.id, r.kind, r.status, j.status AS job_status FROM runs r JOIN jobs j ON j.id = r.job_id WHERE r.bench_id = ? AND r.status = 'open'",
      [list.body.items[0].id],
    );
    expect(run).toMatchObject({ kind: 'warmup', status: 'open', job_status: 'in_progress' });
    const { token } = (await t.http.post(`/api/benches/${list.body.items[0].id}/token`).set(as('admin'))).body;
    const socket = await connect(url, NAMESPACES.ingest, token, sockets);
    expect(await request(socket, INGEST_EVENTS.attach, { runId: run.id })).toMatchObject({
      ok: true,
      lastSeq: 0,
      kind: 'warmup',
      benchName: 'Bench 1',
      range: { dialMin: 7000, dialMax: 7200 },
    });
  });

  it('should let the admin create and edit benches, lab roles read them, and refuse clients', async () => {
    expect((await t.http.get('/api/benches')).status).toBe(401);
    expect((await t.http.post('/api/benches').set(as('lead')).send({ name: 'Bench Z' })).status).toBe(403);
    const created = await t.http.post('/api/benches').set(as('admin')).send({ name: '  Bench Z ', location: 'Back room' });
    expect(created.status).toBe(201);
    expect(created.body).toEqual({
      id: expect.any(Number),
      name: 'Bench Z',
      location: 'Back room',
      defaultStandardId: null,
      defaultStandardName: null,
      hasToken: false,
      tokenIssuedAt: null,
      active: true,
    });
    expect((await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench Z' })).status).toBe(409);
    const bad = await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench Y', defaultStandardId: 99999, colour: 'red' });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toEqual(expect.arrayContaining(['property colour should not exist']));
    expect((await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench Y', defaultStandardId: 99999 })).body.message).toContain(
      'no reference standard 99999',
    );
    const patched = await t.http.patch(`/api/benches/${created.body.id}`).set(as('admin')).send({ location: 'Front room' });
    expect(patched.body.location).toBe('Front room');
    for (const who of ['lead', 'tech', 'engineer'] as const) {
      const list = await t.http.get('/api/benches?q=Bench%20Z').set(as(who));
      expect(list.status).toBe(200);
      expect(list.body).toEqual({ items: [expect.objectContaining({ name: 'Bench Z' })], total: 1 });
    }
    expect((await t.http.get('/api/benches').set(as('northgate'))).status).toBe(403);
    expect((await t.http.get(`/api/benches/${created.body.id}`).set(as('tech'))).body.name).toBe('Bench Z');
    expect((await auditOf(created.body.id)).map((a: { action: string }) => a.action)).toEqual(['create', 'update']);
  });

  it('should issue a token shown once and stored only as its SHA-256, replace it, and revoke it', async () => {
    const bench = (await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench Tokens' })).body;
    expect((await t.http.post(`/api/benches/${bench.id}/token`).set(as('lead'))).status).toBe(403);
    const issued = await t.http.post(`/api/benches/${bench.id}/token`).set(as('admin'));
    expect(issued.status).toBe(201);
    expect(issued.body).toEqual({ benchId: bench.id, token: expect.stringMatching(/^kcb_[A-Za-z0-9_-]{43}$/) });
    const [row] = await t.dataSource.query('SELECT token_hash FROM benches WHERE id = ?', [bench.id]);
    expect(row.token_hash).toBe(sha256(issued.body.token));
    const everything =
      JSON.stringify(await t.dataSource.query('SELECT * FROM benches')) + JSON.stringify(await t.dataSource.query('SELECT * FROM audit_events'));
    expect(everything).not.toContain(issued.body.token);
    expect((await t.http.get(`/api/benches/${bench.id}`).set(as('admin'))).body).toMatchObject({ hasToken: true, tokenIssuedAt: expect.any(String) });

    const socket = await connect(url, NAMESPACES.ingest, issued.body.token, sockets);
    const dropped = new Promise((resolve) => socket.once('disconnect', resolve));
    const second = await t.http.post(`/api/benches/${bench.id}/token`).set(as('admin'));
    await dropped; // the old token's connection ends when a new token is issued
    await expect(connect(url, NAMESPACES.ingest, issued.body.token, sockets)).rejects.toMatchObject({ data: { code: 'bad_token' } });
    await connect(url, NAMESPACES.ingest, second.body.token, sockets);

    const revoked = await t.http.delete(`/api/benches/${bench.id}/token`).set(as('admin'));
    expect(revoked.status).toBe(200);
    expect(revoked.body).toMatchObject({ hasToken: false, tokenIssuedAt: null });
    await expect(connect(url, NAMESPACES.ingest, second.body.token, sockets)).rejects.toMatchObject({
      message: expect.stringContaining('revoked'),
      data: { code: 'bad_token' },
    });
    const audit = await auditOf(bench.id);
    expect(audit.map((a: { action: string; actor_id: number | null }) => [a.action, a.actor_id !== null])).toEqual([
      ['create', true],
      ['token_issue', true],
      ['token_issue', true],
      ['token_revoke', true],
    ]);
  });

  it('should disconnect a deactivated bench', async () => {
    const bench = (await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench Off' })).body;
    const { token } = (await t.http.post(`/api/benches/${bench.id}/token`).set(as('admin'))).body;
    const socket = await connect(url, NAMESPACES.ingest, token, sockets);
    const dropped = new Promise((resolve) => socket.once('disconnect', resolve));
    await t.http.patch(`/api/benches/${bench.id}`).set(as('admin')).send({ active: false });
    await dropped;
    await expect(connect(url, NAMESPACES.ingest, token, sockets)).rejects.toMatchObject({ data: { code: 'bench_inactive' } });
  });

  describe('bin/kilocycle bench token (the node script it runs)', () => {
    beforeAll(() => {
      if (!existsSync(CLI)) throw new Error(`${CLI} is missing: build the backend first (npm run build -w common && npm run build -w backend)`);
    });

    it('should print only a fresh token, store its hash and audit it with no actor', async () => {
      const bench = (await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench CLI 1' })).body;
      const { stdout, stderr } = await run(process.execPath, [CLI, 'bench', 'token', 'bench cli 1'], { env: process.env });
      expect(stderr).toBe('');
      expect(stdout).toMatch(/^kcb_[A-Za-z0-9_-]{43}\n$/);
      const token = stdout.trim();
      const [row] = await t.dataSource.query('SELECT token_hash FROM benches WHERE id = ?', [bench.id]);
      expect(row.token_hash).toBe(sha256(token));
      const audit = await auditOf(bench.id);
      expect(audit.at(-1)).toMatchObject({ action: 'token_issue', actor_id: null });
      await connect(url, NAMESPACES.ingest, token, sockets);
    });

    it('should name the benches there are when the name is unknown, and exit non-zero', async () => {
      const failed = await run(process.execPath, [CLI, 'bench', 'token', 'No Such Bench'], { env: process.env }).then(
        () => null,
        (error: { code: number; stdout: string; stderr: string }) => error,
      );
      expect(failed).toMatchObject({ code: 1, stdout: '' });
      expect(failed?.stderr).toContain('there is no bench named "No Such Bench"; benches: ');
      expect(failed?.stderr).toContain('"Bench CLI 1"');
    });

    it('should print its usage with --help', async () => {
      const { stdout } = await run(process.execPath, [CLI, 'bench', '--help']);
      expect(stdout).toContain('Usage: bin/kilocycle bench token');
    });
  });
});
