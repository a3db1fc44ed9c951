// Every bad request answers 4xx with a message naming what is wrong, and changes nothing: body size,
// nesting depth and UTF-8 checked before validation, null refused where the column cannot be null,
// page/pageSize bounded, ids in decimal digits only, import file errors in every phase, and the
// public check refusing bodies it cannot read (415) at once.
import { createRun, organizationId } from '../ingest/ingest-fixtures.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { countChanges, rowCounter } from '../support/row-counts.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type Answer = { status: number; body: { message?: string | string[] } };
const text = (res: Answer) => (Array.isArray(res.body.message) ? res.body.message.join('; ') : String(res.body.message ?? ''));

describe('bad requests answer 4xx and change nothing (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let counts: () => Promise<Record<string, number>>;
  let before: Record<string, number>;

  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    counts = await rowCounter(t.dataSource);
  });
  afterAll(() => t.close());
  beforeEach(async () => {
    before = await counts();
  });
  afterEach(async () => {
    expect(countChanges(before, await counts())).toEqual([]);
  });

  // The bytes as given (superagent would otherwise write a Buffer out as JSON).
  const raw = ((body: Buffer) => body) as unknown as (body: unknown) => string;
  const deep = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);
  const deepObject = (depth: number) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);

  describe('JSON bodies: depth, size and UTF-8 checked before validation', () => {
    it.each([
      ['anonymous sign-in, 2,000 deep', '/api/auth/login', null, `{"email":${deep(2000)},"password":"x"}`],
      ['anonymous sign-in, 100,000 deep objects', '/api/auth/login', null, deepObject(100_000)],
      ['a user, 33 deep', '/api/users', 'admin', `{"name":${deep(33)}}`],
      ['a comparison, 5,000 deep', '/api/comparisons/compute', 'engineer', `{"runIds":${deep(5000)}}`],
    ] as const)('%s answers 400 naming the nesting limit', async (_label, path, who, body) => {
      let req = t.http.post(path).set('Content-Type', 'application/json');
      if (who) req = req.set(as(who));
      const res = await req.send(body);
      expect(res.status).toBe(400);
      expect(text(res)).toBe('the JSON body is nested deeper than 32 levels');
    });

    it('32 levels of brackets inside a string are text, not nesting: the request reaches validation', async () => {
      const res = await t.http
        .post('/api/auth/login')
        .set('Content-Type', 'application/json')
        .send(`{"email":"${'['.repeat(40)}","password":"x"}`);
      expect(res.status).toBe(400);
      expect(text(res)).toContain('email');
    });

    it('a body over 1 MB answers 413', async () => {
      const res = await t.http
        .post('/api/auth/login')
        .set('Content-Type', 'application/json')
        .send(`{"email":"${'a'.repeat(1_100_000)}"}`);
      expect(res.status).toBe(413);
    });

    it('invalid UTF-8 is refused with 400, not stored as U+FFFD', async () => {
      const users = await t.http.get('/api/users').set(as('admin'));
      const target = (users.body.items as Array<{ id: number; name: string; email: string }>).find((u) => u.email === 'tech@kilocycle.test')!;
      // "Tech" followed by 0xC3 0x28: a two-byte lead byte with an invalid continuation (RFC 3629 §3).
      const body = Buffer.concat([Buffer.from('{"name":"Tech'), Buffer.from([0xc3, 0x28]), Buffer.from('"}')]);
      const res = await t.http.patch(`/api/users/${target.id}`).set(as('admin')).set('Content-Type', 'application/json').serialize(raw).send(body);
      expect(res.status).toBe(400);
      expect(text(res)).toBe('the JSON body is not valid UTF-8 text');
      const after = await t.http.get(`/api/users/${target.id}`).set(as('admin'));
      expect(after.body.name).toBe(target.name);
    });
  });

  describe('null where the column cannot be null answers 400 naming the field', () => {
    it.each([
      ['PATCH', '/api/users/:tech', 'admin', { name: null }, 'name must not be null'],
      ['PATCH', '/api/settings', 'admin', { labAddress: null }, 'labAddress must not be null'],
      ['POST', '/api/comparisons/compute', 'engineer', { runIds: [4, 5], labels: null }, 'labels must not be null'],
      ['PATCH', '/api/comparisons/:comparison', 'engineer', { title: null }, 'title must be a string'],
      ['PATCH', '/api/standards/:standard', 'lead', { calibrationK: null }, 'calibrationK must not be null'],
      ['PATCH', '/api/organizations/:org', 'admin', { active: null }, 'active must not be null'],
      ['PATCH', '/api/instruments/:instrument', 'lead', { serial: null }, 'serial must not be null'],
    ] as const)('%s %s %j', async (method, template, who, body, message) => {
      const path = template.replace(/:(\w+)/, (_m, name: string) => String(ids[name]));
      const res = await t.http[method.toLowerCase() as 'patch'](path).set(as(who)).send(body);
      expect(res.status).toBe(400);
      expect(text(res)).toContain(message);
    });

    const ids: Record<string, number> = {};
    beforeAll(async () => {
      const users = await t.http.get('/api/users').set(as('admin'));
      ids.tech = (users.body.items as Array<{ id: number; email: string }>).find((u) => u.email === 'tech@kilocycle.test')!.id;
      const [comparison] = await t.dataSource.query('SELECT id FROM comparisons ORDER BY id LIMIT 1');
      const [standard] = await t.dataSource.query('SELECT id FROM standards ORDER BY id LIMIT 1');
      const [org] = await t.dataSource.query("SELECT id FROM organizations WHERE kind = 'customer' ORDER BY id LIMIT 1");
      const [instrument] = await t.dataSource.query('SELECT id FROM instruments ORDER BY id LIMIT 1');
      Object.assign(ids, { comparison: comparison?.id, standard: standard.id, org: org.id, instrument: instrument.id });
    });

    it("null stays allowed where the column takes it: an instrument's asset tag is cleared", async () => {
      const res = await t.http.patch(`/api/instruments/${ids.instrument}`).set(as('lead')).send({ assetTag: null });
      expect(res.status).toBe(200);
      expect(res.body.assetTag).toBeNull();
      before = await counts(); // a real change (and its audit event): not what this suite checks
    });
  });

  describe('page and pageSize are bounded decimal integers', () => {
    it.each(['1e20', '100001', '0x10', '2.0', ' 2', '0', '-1'])('?page=%s answers 400 naming page', async (page) => {
      const res = await t.http.get('/api/instruments').query({ page }).set(as('northgate'));
      expect(res.status).toBe(400);
      expect(text(res)).toMatch(/^page /);
    });
    it.each(['1e3', '501', '0'])('?pageSize=%s answers 400 naming pageSize', async (pageSize) => {
      const res = await t.http.get('/api/jobs').query({ pageSize }).set(as('lead'));
      expect(res.status).toBe(400);
      expect(text(res)).toMatch(/pageSize/);
    });
    it.each(['1e20', '100001', '0x2'])("a run's readings, ?page=%s, answers 400 naming page", async (page) => {
      const [run] = await t.dataSource.query('SELECT id FROM runs ORDER BY id LIMIT 1');
      const res = await t.http.get(`/api/runs/${run.id}/readings`).query({ page }).set(as('lead'));
      expect(res.status).toBe(400);
      expect(text(res)).toMatch(/^page /);
    });
    it('the largest page is still a plain answer', async () => {
      const res = await t.http.get('/api/instruments').query({ page: '100000', pageSize: '500' }).set(as('lead'));
      expect(res.status).toBe(200);
      expect(res.body.items).toEqual([]);
    });
  });

  describe('ids in paths are decimal digits only', () => {
    it.each(['0x10', '1e1', '%2016', '16.0', '16%20', '-16', '99999999999'])('/api/users/%s answers 400 naming id', async (id) => {
      const res = await t.http.patch(`/api/users/${id}`).set(as('admin')).send({ name: 'Renamed' });
      expect(res.status).toBe(400);
      expect(text(res)).toBe('id must be a whole number written in decimal digits, at most 2147483647');
    });
    it('the parameter is named as the route names it', async () => {
      const res = await t.http.post('/api/runs/1/readings/0x1/exclusion').set(as('lead')).send({ reason: 'counter glitch' });
      expect(res.status).toBe(400);
      expect(text(res)).toMatch(/^readingId must be a whole number/);
    });
    it('a certificate id that is not digits is simply not found', async () => {
      const res = await t.http.get('/api/certificates/0x1').set(as('lead'));
      expect(res.status).toBe(404);
    });
  });

  describe('CSV import errors are 4xx in every phase', () => {
    it('a line over 4 million characters after the header answers 400, nothing imported', async () => {
      const org = await organizationId(t.dataSource, DEMO_CUSTOMERS.northgate);
      const run = await createRun(t.dataSource, { organizationId: org, benchId: null, kind: 'warmup' });
      before = await counts();
      const file = Buffer.from(`time,frequency\n0,7001000\n1,"${'7'.repeat(4_100_000)}\n`, 'utf8');
      const res = await t.http.post(`/api/runs/${run.runId}/imports`).set(as('tech')).attach('file', file, { filename: 'long.csv', contentType: 'text/csv' });
      expect(res.status).toBe(400);
      expect(text(res)).toMatch(/a line runs on for more than 4 million characters/);
      expect(res.body.imported).toBe(0);
    });
  });

  describe('the public certificate check reads only a PDF or multipart', () => {
    it.each([
      ['application/json', '{"file":"x"}'],
      ['application/x-www-form-urlencoded', 'file=x'],
      ['text/plain', 'not a pdf'],
    ])('%s answers 415 within a second', async (type, body) => {
      const [certificate] = await t.dataSource.query("SELECT number FROM certificates WHERE status = 'issued' LIMIT 1");
      const started = Date.now();
      const res = await t.http.post(`/api/public/certificates/${certificate.number}/check`).set('Content-Type', type).timeout(5000).send(body);
      expect(Date.now() - started).toBeLessThan(1000);
      expect(res.status).toBe(415);
      expect(text(res)).toMatch(/application\/pdf.*multipart\/form-data/);
    });
  });
});
