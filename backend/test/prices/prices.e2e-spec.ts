import { organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type Terms = {
  organizationId: number;
  organizationName: string;
  taxRateId: number | null;
  taxRateBasisPoints: number | null;
  paymentTerms: string;
  netDays: number;
  requiresQuote: boolean;
  taxRegistration: string | null;
};

describe('prices: the price list, tax rates and customer terms (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let orgs: Record<string, number>;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    orgs = await organizationIds(t, as('admin'));
  });
  afterAll(async () => {
    await t.close();
  });
  const audits = async (entity: string, entityId: number | string) =>
    (await t.dataSource.query('SELECT action, actor_id, changes FROM audit_events WHERE entity = ? AND entity_id = ? ORDER BY id', [
      entity,
      String(entityId),
    ])) as Array<{
      action: string;
      actor_id: number | null;
      changes: unknown;
    }>;

  describe('price items', () => {
    it('should let technicians and engineers read the list but not change it, and keep clients out', async () => {
      for (const who of ['tech', 'engineer', 'lead', 'admin'] as const) {
        const res = await t.http.get('/api/prices/items?sort=code').set(as(who));
        expect(res.status).toBe(200);
        expect(res.body.items.map((i: { code: string }) => i.code)).toEqual(expect.arrayContaining(['CAL-RNG', 'STAB-HR', 'JOB-ADM']));
      }
      expect((await t.http.get('/api/prices/items').set(as('northgate'))).status).toBe(403);
      const body = { code: 'TEST-ONE', description: 'A test service', unit: 'per_job', unitPriceMinor: 1000 };
      for (const who of ['tech', 'engineer', 'northgate'] as const) expect((await t.http.post('/api/prices/items').set(as(who)).send(body)).status).toBe(403);
      const [item] = await t.dataSource.query("SELECT id FROM price_items WHERE code = 'CAL-RNG'");
      expect((await t.http.patch(`/api/prices/items/${item.id}`).set(as('tech')).send({ unitPriceMinor: 1 })).status).toBe(403);
      expect((await t.http.get('/api/prices/items?code=TEST-ONE').set(as('lead'))).status).toBe(400); // unknown filter
    });

    it('should create and change an item, audited, and filter by active', async () => {
      const created = await t.http
        .post('/api/prices/items')
        .set(as('lead'))
        .send({ code: 'FREQ-CNT', description: 'Counter check, per job', unit: 'per_job', unitPriceMinor: 2_750 });
      expect(created.status).toBe(201);
      expect(created.body).toMatchObject({ code: 'FREQ-CNT', unit: 'per_job', unitPriceMinor: 2750, proposeOnQuotes: false, active: true });
      const changed = await t.http.patch(`/api/prices/items/${created.body.id}`).set(as('admin')).send({ unitPriceMinor: 2_900, active: false });
      expect(changed.status).toBe(200);
      expect(changed.body).toMatchObject({ unitPriceMinor: 2900, active: false });
      const events = await audits('price_item', created.body.id);
      expect(events.map((e) => e.action)).toEqual(['create', 'update']);
      expect(parseChanges(events[1]!.changes)).toEqual({ unitPriceMinor: { from: 2750, to: 2900 }, active: { from: true, to: false } });
      const inactive = await t.http.get('/api/prices/items?active=false').set(as('lead'));
      expect(inactive.body.items.map((i: { code: string }) => i.code)).toEqual(expect.arrayContaining(['FREQ-CNT', 'CAL-XTAL']));
      expect(inactive.body.items.every((i: { active: boolean }) => !i.active)).toBe(true);
      const twice = await t.http.post('/api/prices/items').set(as('lead')).send({ code: 'FREQ-CNT', description: 'Again', unit: 'per_job', unitPriceMinor: 1 });
      expect(twice.status).toBe(409);
    });

    it('should refuse bad input with 400 naming the field, and store nothing', async () => {
      const [{ n: before }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM price_items');
      const good = { code: 'BAD-ONE', description: 'Bad', unit: 'per_job', unitPriceMinor: 100 };
      const cases: Array<[Record<string, unknown>, string]> = [
        [{ unitPriceMinor: -1 }, 'unitPriceMinor must not be negative'],
        [{ unitPriceMinor: 12.5 }, 'unitPriceMinor must be a whole number'],
        [{ unitPriceMinor: '100' }, 'unitPriceMinor must be a whole number'],
        [{ unitPriceMinor: 10_000_000_001 }, 'unitPriceMinor must be at most'],
        [{ unit: 'per_week' }, 'unit must be one of: per_range, per_hour, per_job'],
        [{ code: 'lower-case' }, 'code must be'],
        [{ description: '' }, 'description must not be empty'],
        [{ description: 'two\nlines' }, 'description'],
      ];
      for (const [patch, message] of cases) {
        const res = await t.http
          .post('/api/prices/items')
          .set(as('lead'))
          .send({ ...good, ...patch });
        expect([res.status, String(res.body.message)]).toEqual([400, expect.stringContaining(message)]);
      }
      const [{ n: after }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM price_items');
      expect(Number(after)).toBe(Number(before));
    });
  });

  describe('tax rates', () => {
    it('should list, create and refuse a rate over 100 % or a duplicate name; a rate still charged cannot be retired', async () => {
      const list = await t.http.get('/api/prices/tax-rates').set(as('engineer'));
      expect(list.body.items.map((r: { name: string; rateBasisPoints: number }) => [r.name, r.rateBasisPoints])).toEqual([
        ['Standard rate', 2000],
        ['Reduced rate', 500],
      ]);
      expect((await t.http.post('/api/prices/tax-rates').set(as('tech')).send({ name: 'Zero', rateBasisPoints: 0 })).status).toBe(403);
      const zero = await t.http.post('/api/prices/tax-rates').set(as('admin')).send({ name: 'Zero rate', rateBasisPoints: 0 });
      expect(zero.status).toBe(201);
      expect((await audits('tax_rate', zero.body.id)).map((e) => e.action)).toEqual(['create']);
      const over = await t.http.post('/api/prices/tax-rates').set(as('admin')).send({ name: 'Too much', rateBasisPoints: 10_001 });
      expect([over.status, String(over.body.message)]).toEqual([400, expect.stringContaining('rateBasisPoints must be at most 10000')]);
      expect((await t.http.post('/api/prices/tax-rates').set(as('admin')).send({ name: 'Zero rate', rateBasisPoints: 0 })).status).toBe(409);
      const standard = list.body.items[0].id;
      const retire = await t.http.patch(`/api/prices/tax-rates/${standard}`).set(as('admin')).send({ active: false });
      expect([retire.status, String(retire.body.message)]).toEqual([409, expect.stringContaining('charged to 2 customers')]);
      expect((await t.http.patch(`/api/prices/tax-rates/${zero.body.id}`).set(as('admin')).send({ active: false })).status).toBe(200);
    });
  });

  describe('customer terms', () => {
    it('should list one row per customer, with the defaults for a customer without terms', async () => {
      const made = await t.http.post('/api/organizations').set(as('admin')).send({ name: 'Tidewater Sea Scouts', kind: 'customer' });
      expect(made.status).toBe(201);
      const list = await t.http.get('/api/prices/customer-terms?pageSize=50').set(as('tech'));
      expect(list.status).toBe(200);
      const byName = new Map<string, Terms>(list.body.items.map((row: Terms) => [row.organizationName, row]));
      expect([...byName.keys()].sort()).toEqual([
        'Fellside Schools Radio Trust',
        'Northgate Radio Club',
        'Saltmarsh Restoration Works',
        'Tidewater Sea Scouts',
      ]);
      expect(byName.get('Northgate Radio Club')).toMatchObject({
        paymentTerms: 'pay_before_release',
        netDays: 0,
        requiresQuote: true,
        taxRateBasisPoints: 2000,
      });
      expect(byName.get('Saltmarsh Restoration Works')).toMatchObject({
        paymentTerms: 'on_account',
        netDays: 30,
        requiresQuote: false,
        taxRateBasisPoints: 2000,
      });
      expect(byName.get('Fellside Schools Radio Trust')).toMatchObject({ taxRateId: null, taxRegistration: 'FSRT-40715' });
      // The defaults: pay before release, net 0, no quote, the active rate with the lowest id (the standard rate).
      const [standard] = await t.dataSource.query('SELECT id FROM tax_rates WHERE active = 1 ORDER BY id LIMIT 1');
      expect(byName.get('Tidewater Sea Scouts')).toMatchObject({
        organizationId: made.body.id,
        taxRateId: standard.id,
        taxRateBasisPoints: 2000,
        paymentTerms: 'pay_before_release',
        netDays: 0,
        requiresQuote: false,
        taxRegistration: null,
      });
      expect((await t.http.get('/api/prices/customer-terms').set(as('northgate'))).status).toBe(403);
    });

    it('should show a client its own terms and 404 another’s', async () => {
      const own = await t.http.get(`/api/prices/customer-terms/${orgs['Northgate Radio Club']}`).set(as('northgate'));
      expect(own.status).toBe(200);
      expect(own.body).toMatchObject({ organizationName: 'Northgate Radio Club', requiresQuote: true });
      expect((await t.http.get(`/api/prices/customer-terms/${orgs['Saltmarsh Restoration Works']}`).set(as('northgate'))).status).toBe(404);
      expect((await t.http.get(`/api/prices/customer-terms/${orgs['Quarry Lane Frequency Lab']}`).set(as('lead'))).status).toBe(404);
    });

    it('should require a registration number for an exempt customer, net 0 before release, and audit every change', async () => {
      const id = orgs['Saltmarsh Restoration Works']!;
      const base = { taxRateId: null, paymentTerms: 'on_account', netDays: 30, requiresQuote: false };
      const exempt = await t.http.put(`/api/prices/customer-terms/${id}`).set(as('lead')).send(base);
      expect([exempt.status, String(exempt.body.message)]).toEqual([400, expect.stringContaining('taxRegistration')]);
      const blank = await t.http
        .put(`/api/prices/customer-terms/${id}`)
        .set(as('lead'))
        .send({ ...base, taxRegistration: '   ' });
      expect([blank.status, String(blank.body.message)]).toEqual([400, expect.stringContaining('taxRegistration')]);
      const net = await t.http
        .put(`/api/prices/customer-terms/${id}`)
        .set(as('lead'))
        .send({ ...base, taxRegistration: 'SRW-1', paymentTerms: 'pay_before_release', netDays: 14 });
      expect([net.status, String(net.body.message)]).toEqual([400, expect.stringContaining('netDays must be 0')]);
      const retired = await t.http
        .put(`/api/prices/customer-terms/${id}`)
        .set(as('lead'))
        .send({ ...base, taxRateId: 999_999 });
      expect([retired.status, String(retired.body.message)]).toEqual([400, expect.stringContaining('taxRateId')]);
      expect(
        (
          await t.http
            .put(`/api/prices/customer-terms/${id}`)
            .set(as('engineer'))
            .send({ ...base, taxRegistration: 'SRW-1' })
        ).status,
      ).toBe(403);
      const ok = await t.http
        .put(`/api/prices/customer-terms/${id}`)
        .set(as('lead'))
        .send({ ...base, taxRegistration: 'SRW-1' });
      expect(ok.status).toBe(200);
      expect(ok.body).toMatchObject({ taxRateId: null, taxRateBasisPoints: null, taxRegistration: 'SRW-1', paymentTerms: 'on_account', netDays: 30 });
      const [standard] = await t.dataSource.query("SELECT id FROM tax_rates WHERE name = 'Standard rate'");
      const back = await t.http
        .put(`/api/prices/customer-terms/${id}`)
        .set(as('admin'))
        .send({ ...base, taxRateId: standard.id });
      expect(back.body).toMatchObject({ taxRateBasisPoints: 2000, taxRegistration: null });
      const events = await audits('customer_terms', id);
      expect(events.map((e) => e.action)).toEqual(['update', 'update', 'update']); // the demo's, then the two above
      expect(parseChanges(events[2]!.changes)).toMatchObject({ from: { taxRateId: null, taxRegistration: 'SRW-1' }, to: { taxRateId: standard.id } });
    });
  });
});
