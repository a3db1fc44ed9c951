import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

describe('reference standards (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
  });
  afterAll(async () => {
    await t.close();
  });
  const valid = {
    name: 'Rubidium reference R1',
    kind: 'reference',
    makeModel: 'Fellgate RS-3 rubidium standard',
    serial: 'RB10-0091',
    certificateNumber: 'WRL-25-00310',
    dueDate: '2099-06-30',
    timebaseAccuracyPpm: 0.0005,
    resolutionHz: 0.0001,
    calibrationUPpm: 0.0002,
    calibrationK: 2,
  };

  describe('GET /api/standards', () => {
    it('should list the demo standards with the lapsed one flagged overdue', async () => {
      const res = await t.http.get('/api/standards?sort=name').set(as('tech'));
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(2);
      expect(res.body.items.map((s: { name: string; overdue: boolean }) => [s.name, s.overdue])).toEqual([
        ['Bench counter A', false],
        ['Bench counter B (spare)', true],
      ]);
    });

    it('should filter on overdue and search by certificate number', async () => {
      const overdue = await t.http.get('/api/standards?overdue=true').set(as('engineer'));
      expect(overdue.body.items.map((s: { name: string }) => s.name)).toEqual(['Bench counter B (spare)']);
      const found = await t.http.get('/api/standards?q=WRL-24').set(as('lead'));
      expect(found.body.items.map((s: { name: string }) => s.name)).toEqual(['Bench counter A']);
    });

    it('should answer 403 to a client, the standards being the lab’s own equipment', async () => {
      expect((await t.http.get('/api/standards').set(as('northgate'))).status).toBe(403);
    });

    it('should refuse an unknown sort field with 400', async () => {
      const res = await t.http.get('/api/standards?sort=secret').set(as('lead'));
      expect(res.status).toBe(400);
      expect(res.body.message).toContain('sort must be one of');
    });
  });

  describe('POST and PATCH /api/standards', () => {
    it.each(['tech', 'engineer', 'northgate'] as const)('should answer 403 when %s tries to add a standard', async (who) => {
      expect((await t.http.post('/api/standards').set(as(who)).send(valid)).status).toBe(403);
    });

    it('should answer 400 naming each bad field', async () => {
      const res = await t.http
        .post('/api/standards')
        .set(as('lead'))
        .send({ ...valid, dueDate: '30/06/2099', resolutionHz: 0, kind: 'sundial', colour: 'red' });
      expect(res.status).toBe(400);
      expect(res.body.message).toEqual(
        expect.arrayContaining([
          'dueDate must be a date (YYYY-MM-DD)',
          'resolutionHz must be greater than zero',
          'kind must be one of: counter, reference',
          'property colour should not exist',
        ]),
      );
    });

    it('should create a standard as a lead, audit it, and refuse a second of the same name', async () => {
      const res = await t.http.post('/api/standards').set(as('lead')).send(valid);
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ name: valid.name, dueDate: '2099-06-30', active: true, overdue: false });
      const [row] = await t.dataSource.query('SELECT action, actor_id FROM audit_events WHERE entity = ? AND entity_id = ?', ['standard', String(res.body.id)]);
      expect(row.action).toBe('create');
      expect((await t.http.post('/api/standards').set(as('admin')).send(valid)).status).toBe(409);
    });

    it('should update the due date as an admin, recording from and to', async () => {
      const list = await t.http.get('/api/standards?q=spare').set(as('admin'));
      const lapsed = list.body.items[0];
      const res = await t.http.patch(`/api/standards/${lapsed.id}`).set(as('admin')).send({ dueDate: '2099-01-31', certificateNumber: 'WRL-25-01999' });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ dueDate: '2099-01-31', overdue: false });
      const [row] = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'standard' AND entity_id = ? AND action = 'update'", [
        String(lapsed.id),
      ]);
      const changes = typeof row.changes === 'string' ? JSON.parse(row.changes) : row.changes;
      expect(changes.dueDate).toEqual({ from: lapsed.dueDate, to: '2099-01-31' });
      expect((await t.http.patch('/api/standards/999999').set(as('admin')).send({ active: false })).status).toBe(404);
    });
  });
});
