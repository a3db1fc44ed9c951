import { createTestApp, DEMO, signInDemo, tokenFor, type AsDemo, type TestApp } from '../support/test-app.js';

describe('users and organisations (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
  });
  afterAll(async () => {
    await t.close();
  });

  describe('GET /api/users', () => {
    it('should answer 401 without a session', async () => {
      expect((await t.http.get('/api/users')).status).toBe(401);
    });

    it('should page, sort and filter for lab staff', async () => {
      const res = await t.http.get('/api/users?page=1&pageSize=2&sort=-email&role=client').set(as('admin'));
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(2);
      expect(res.body.items.map((u: { email: string }) => u.email)).toEqual([DEMO.saltmarsh, DEMO.northgate]);
    });

    it('should show a client only the users of its own organisation', async () => {
      const res = await t.http.get('/api/users?pageSize=100').set(as('northgate'));
      expect(res.status).toBe(200);
      expect(res.body.items.map((u: { email: string }) => u.email)).toEqual([DEMO.northgate]);
      expect(res.body.total).toBe(1);
    });

    it("should answer 404 when a client asks for another organisation's user by id", async () => {
      const all = await t.http.get('/api/users?pageSize=100').set(as('admin'));
      const saltmarshUser = all.body.items.find((u: { email: string }) => u.email === DEMO.saltmarsh);
      const res = await t.http.get(`/api/users/${saltmarshUser.id}`).set(as('northgate'));
      expect(res.status).toBe(404);
    });

    it('should refuse an unknown sort field with 400 naming the allowed ones', async () => {
      const res = await t.http.get('/api/users?sort=passwordHash').set(as('admin'));
      expect(res.status).toBe(400);
      expect(res.body.message).toContain('sort must be one of');
    });
  });

  describe('POST /api/users and PATCH /api/users/:id', () => {
    it.each(['lead', 'tech', 'engineer', 'northgate'] as const)('should answer 403 when %s tries to create a user', async (who) => {
      const res = await t.http
        .post('/api/users')
        .set(as(who))
        .send({ email: 'x@kilocycle.test', name: 'X', role: 'technician', organizationId: 1, password: 'long-enough-password' });
      expect(res.status).toBe(403);
    });

    it('should answer 400 naming the field for an unknown field and a short password', async () => {
      const res = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ email: 'new@kilocycle.test', name: 'New', role: 'technician', organizationId: 1, password: 'short', shoeSize: 44 });
      expect(res.status).toBe(400);
      expect(res.body.message).toEqual(expect.arrayContaining(['property shoeSize should not exist', 'password must be at least 12 characters']));
    });

    it('should create a technician who can then sign in, and audit it', async () => {
      const orgs = await t.http.get('/api/organizations?kind=lab').set(as('admin'));
      const labId = orgs.body.items[0].id;
      const res = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ email: 'New.Tech@kilocycle.test', name: 'New Tech', role: 'technician', organizationId: labId, password: 'a-good-long-password' });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ email: 'new.tech@kilocycle.test', role: 'technician', active: true });
      const login = await t.http.post('/api/auth/login').send({ email: 'new.tech@kilocycle.test', password: 'a-good-long-password' });
      expect(login.status).toBe(200);
      const [audit] = await t.dataSource.query('SELECT action, actor_id FROM audit_events WHERE entity = ? AND entity_id = ?', ['user', String(res.body.id)]);
      expect(audit.action).toBe('create');
      const dup = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ email: 'new.tech@kilocycle.test', name: 'Again', role: 'technician', organizationId: labId, password: 'a-good-long-password' });
      expect(dup.status).toBe(409);
    });

    it('should refuse a client account in the lab organisation', async () => {
      const orgs = await t.http.get('/api/organizations?kind=lab').set(as('admin'));
      const res = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ email: 'c@kilocycle.test', name: 'C', role: 'client', organizationId: orgs.body.items[0].id, password: 'a-good-long-password' });
      expect(res.status).toBe(400);
      expect(res.body.message).toContain('customer organisation');
    });

    it('should refuse a deactivated user at once, also with a token issued before', async () => {
      const token = await tokenFor(t.http, DEMO.engineer);
      const me = await t.http.get('/api/auth/me').set('Authorization', `Bearer ${token}`);
      expect(me.status).toBe(200);
      const off = await t.http.patch(`/api/users/${me.body.id}`).set(as('admin')).send({ active: false });
      expect(off.status).toBe(200);
      expect(off.body.active).toBe(false);
      expect((await t.http.get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
      expect((await t.http.post('/api/auth/login').send({ email: DEMO.engineer, password: 'kilocycle-demo' })).status).toBe(401);
      const [row] = await t.dataSource.query('SELECT active FROM users WHERE id = ?', [me.body.id]);
      expect(Number(row.active)).toBe(0);
      await t.http.patch(`/api/users/${me.body.id}`).set(as('admin')).send({ active: true });
    });
  });

  describe('organisations', () => {
    it('should show a client only its own organisation, and 404 for another by id', async () => {
      const mine = await t.http.get('/api/organizations').set(as('saltmarsh'));
      expect(mine.body.items.map((o: { name: string }) => o.name)).toEqual(['Saltmarsh Restoration Works']);
      const all = await t.http.get('/api/organizations?pageSize=100').set(as('lead'));
      expect(all.body.total).toBe(4); // the lab, Northgate, Saltmarsh and the Fellside trust (prices demo)
      const northgate = all.body.items.find((o: { name: string }) => o.name === 'Northgate Radio Club');
      expect((await t.http.get(`/api/organizations/${northgate.id}`).set(as('saltmarsh'))).status).toBe(404);
    });

    it('should let the admin create and deactivate a customer, and refuse others', async () => {
      expect((await t.http.post('/api/organizations').set(as('lead')).send({ name: 'Hilltop Amateur Society', kind: 'customer' })).status).toBe(403);
      const created = await t.http
        .post('/api/organizations')
        .set(as('admin'))
        .send({ name: 'Hilltop Amateur Society', kind: 'customer', contactEmail: 'sec@hilltop.test' });
      expect(created.status).toBe(201);
      const off = await t.http.patch(`/api/organizations/${created.body.id}`).set(as('admin')).send({ active: false });
      expect(off.body.active).toBe(false);
      const second = await t.http.post('/api/organizations').set(as('admin')).send({ name: 'Another Lab', kind: 'lab' });
      expect(second.status).toBe(400);
    });
  });
});
