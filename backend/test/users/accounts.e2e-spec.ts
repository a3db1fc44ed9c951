import { createTestApp, DEMO, signInDemo, tokenFor, type AsDemo, type TestApp } from '../support/test-app.js';

// Issue #13, item 5: the organisation-kind rule on PATCH as on POST, and the password policy (common
// passwords, the account's own name and e-mail, at most 72 bytes because bcrypt ignores the rest).
describe('accounts: role and organisation kind, password policy (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let ids: Record<string, number>;
  let labId: number;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    const rows: { id: number; email: string }[] = await t.dataSource.query('SELECT id, email FROM users');
    ids = Object.fromEntries(rows.map((r) => [r.email, r.id]));
    [{ id: labId }] = await t.dataSource.query("SELECT id FROM organizations WHERE kind = 'lab'");
  });
  afterAll(async () => {
    await t.close();
  });

  const roleOf = async (id: number) => ((await t.dataSource.query('SELECT role FROM users WHERE id = ?', [id])) as { role: string }[])[0]!.role;

  describe('PATCH /api/users/:id and the organisation kind', () => {
    it("should refuse to make a customer's client lab staff, and leave the account as it was", async () => {
      const id = ids[DEMO.northgate]!;
      for (const role of ['technician', 'lead', 'engineer', 'admin']) {
        const res = await t.http.patch(`/api/users/${id}`).set(as('admin')).send({ role });
        expect(res.status).toBe(400);
        expect(res.body.message).toMatch(new RegExp(`^a ${role} must belong to the lab organisation`));
      }
      expect(await roleOf(id)).toBe('client');
      // The client still signs in as a client.
      expect((await t.http.post('/api/auth/login').send({ email: DEMO.northgate, password: 'kilocycle-demo' })).body.user.role).toBe('client');
    });

    it('should refuse to make lab staff a client of the lab, and allow a change between lab roles', async () => {
      const id = ids[DEMO.engineer]!;
      const res = await t.http.patch(`/api/users/${id}`).set(as('admin')).send({ role: 'client' });
      expect(res.status).toBe(400);
      expect(res.body.message).toBe('a client must belong to a customer organisation');
      expect(await roleOf(id)).toBe('engineer');
      const ok = await t.http.patch(`/api/users/${id}`).set(as('admin')).send({ role: 'technician' });
      expect(ok.status).toBe(200);
      expect(ok.body.role).toBe('technician');
    });
  });

  describe('password policy', () => {
    const person = { email: 'margarethe.oberholzer@kilocycle.test', name: 'Margarethe Oberholzer', role: 'technician' };
    const count = async () => Number(((await t.dataSource.query('SELECT COUNT(*) AS n FROM users')) as { n: number }[])[0]!.n);

    it('should refuse guessable passwords on creation with a message, and create nothing', async () => {
      const before = await count();
      for (const password of [' '.repeat(12), '123456789012', person.email, person.name, 'oberholzer12']) {
        const res = await t.http
          .post('/api/users')
          .set(as('admin'))
          .send({ ...person, organizationId: labId, password });
        expect(res.status).toBe(400);
        expect(res.body.message).toEqual([expect.stringMatching(/^password is too easy to guess/)]);
      }
      expect(await count()).toBe(before);
    });

    it('should refuse a 73-byte password saying why, and accept a strong 72-byte one that then signs in', async () => {
      const strong72 = 'Quartz-ladder-violet-mains-hum-1735kHz-'.padEnd(72, 'x7');
      expect(Buffer.byteLength(strong72)).toBe(72);
      const tooLong = `${strong72}y`;
      const refused = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ ...person, organizationId: labId, password: tooLong });
      expect(refused.status).toBe(400);
      expect(refused.body.message).toEqual([expect.stringMatching(/^password must be at most 72 bytes in UTF-8 \(it has 73\)/)]);
      // Multi-byte characters count by bytes: 25 × "周" is 75 bytes though 25 characters.
      const wide = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ ...person, organizationId: labId, password: '周'.repeat(25) });
      expect(wide.status).toBe(400);
      expect(wide.body.message).toEqual([expect.stringMatching(/at most 72 bytes .*it has 75/)]);
      const created = await t.http
        .post('/api/users')
        .set(as('admin'))
        .send({ ...person, organizationId: labId, password: strong72 });
      expect(created.status).toBe(201);
      expect(typeof (await tokenFor(t.http, person.email, strong72))).toBe('string');
    });

    it('should apply the same policy to a password change, naming the problem', async () => {
      const id = ids[DEMO.tech]!;
      const [{ password_hash: before }] = await t.dataSource.query('SELECT password_hash FROM users WHERE id = ?', [id]);
      for (const password of ['123456789012', DEMO.tech, 'Tomas Reyes 1']) {
        const res = await t.http.patch(`/api/users/${id}`).set(as('admin')).send({ password });
        expect(res.status).toBe(400);
        expect(res.body.message).toEqual([expect.stringMatching(/^password is too easy to guess/)]);
      }
      const long = await t.http
        .patch(`/api/users/${id}`)
        .set(as('admin'))
        .send({ password: 'z'.repeat(73) });
      expect(long.status).toBe(400);
      const [{ password_hash: after }] = await t.dataSource.query('SELECT password_hash FROM users WHERE id = ?', [id]);
      expect(after).toBe(before);
    });
  });
});
