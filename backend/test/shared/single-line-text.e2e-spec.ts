// Single-line text fields refuse control characters (C0 with CR, LF and TAB; DEL; C1; U+2028/2029) with a 400
// naming the field, and nothing is stored; multi-line fields keep their line breaks.
import { khzRange, organizationIds } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

const message = (field: string) => `${field} must be a single line of text without control characters`;

describe('single-line text fields (e2e, MariaDB)', () => {
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

  const count = async (sql: string, params: unknown[] = []): Promise<number> => Number((await t.dataSource.query(sql, params))[0].n);
  const auditCount = () => count('SELECT COUNT(*) AS n FROM audit_events');
  const instrument = (overrides: Record<string, unknown> = {}) => ({
    organizationId: orgs['Saltmarsh Restoration Works'],
    make: 'Test Works',
    model: 'TG-1 test oscillator',
    serial: `SL-${process.pid}`,
    ranges: [khzRange('Main 1000–2000 kHz', 1000, 2000)],
    ...overrides,
  });

  it.each([
    ['make', 'Test\r\nWorks'],
    ['serial', 'SN 1234\r\nCalibration: PASS'],
    ['model', 'TG-1\tmk II'],
    ['assetTag', 'TAG\u2028PASS'],
  ])('POST /api/instruments refuses a %s with a control character, storing nothing', async (field, value) => {
    const [instrumentsBefore, rangesBefore, auditBefore] = [
      await count('SELECT COUNT(*) AS n FROM instruments'),
      await count('SELECT COUNT(*) AS n FROM instrument_ranges'),
      await auditCount(),
    ];
    const res = await t.http
      .post('/api/instruments')
      .set(as('lead'))
      .send(instrument({ [field]: value }));
    expect(res.status).toBe(400);
    expect(res.body.message).toEqual([message(field)]);
    expect(await count('SELECT COUNT(*) AS n FROM instruments')).toBe(instrumentsBefore);
    expect(await count('SELECT COUNT(*) AS n FROM instrument_ranges')).toBe(rangesBefore);
    expect(await auditCount()).toBe(auditBefore);
  });

  it('PATCH /api/instruments/:id refuses a serial or a range label with a line break and changes nothing', async () => {
    const created = await t.http
      .post('/api/instruments')
      .set(as('lead'))
      .send(instrument({ serial: `SL-${process.pid}-patch` }));
    expect(created.status).toBe(201);
    const id = created.body.id as number;
    const before =
      JSON.stringify(await t.dataSource.query('SELECT * FROM instruments WHERE id = ?', [id])) +
      JSON.stringify(await t.dataSource.query('SELECT * FROM instrument_ranges WHERE instrument_id = ? ORDER BY id', [id]));
    const auditBefore = await auditCount();

    const serial = await t.http.patch(`/api/instruments/${id}`).set(as('lead')).send({ serial: 'SL-1\nSL-2' });
    expect(serial.status).toBe(400);
    expect(serial.body.message).toEqual(expect.arrayContaining([message('serial')]));

    const range = { ...created.body.ranges[0], label: 'Band A\r\nBand B' };
    const label = await t.http
      .patch(`/api/instruments/${id}`)
      .set(as('lead'))
      .send({ ranges: [range] });
    expect(label.status).toBe(400);
    expect(label.body.message).toEqual(expect.arrayContaining([expect.stringContaining(message('label'))]));
    expect(label.body.message.join(' ')).toContain('ranges.0.label');

    const after =
      JSON.stringify(await t.dataSource.query('SELECT * FROM instruments WHERE id = ?', [id])) +
      JSON.stringify(await t.dataSource.query('SELECT * FROM instrument_ranges WHERE instrument_id = ? ORDER BY id', [id]));
    expect(after).toBe(before);
    expect(await auditCount()).toBe(auditBefore);
  });

  it('a multi-line description keeps its line breaks', async () => {
    const res = await t.http
      .post('/api/instruments')
      .set(as('lead'))
      .send(instrument({ serial: `SL-${process.pid}-ml`, description: 'Two-band signal generator.\nDial cord replaced 1998.' }));
    expect(res.status).toBe(201);
    const [row] = await t.dataSource.query('SELECT description FROM instruments WHERE id = ?', [res.body.id]);
    expect(row.description).toBe('Two-band signal generator.\nDial cord replaced 1998.');
  });

  it('reference standards: POST refuses a name with a tab, PATCH a serial with U+2028', async () => {
    const valid = {
      name: 'Reference SL-1',
      kind: 'reference',
      makeModel: 'Fellgate RS-3 rubidium standard',
      serial: 'RB10-SL1',
      certificateNumber: 'WRL-25-SL1',
      dueDate: '2099-06-30',
      timebaseAccuracyPpm: 0.0005,
      resolutionHz: 0.0001,
      calibrationUPpm: 0.0002,
      calibrationK: 2,
    };
    const standardsBefore = await count('SELECT COUNT(*) AS n FROM standards');
    const auditBefore = await auditCount();
    const post = await t.http
      .post('/api/standards')
      .set(as('lead'))
      .send({ ...valid, name: 'Reference\tSL-1' });
    expect(post.status).toBe(400);
    expect(post.body.message).toEqual(expect.arrayContaining([message('name')]));
    expect(await count('SELECT COUNT(*) AS n FROM standards')).toBe(standardsBefore);
    expect(await auditCount()).toBe(auditBefore);

    const [existing] = await t.dataSource.query('SELECT id, serial FROM standards ORDER BY id LIMIT 1');
    const patch = await t.http.patch(`/api/standards/${existing.id}`).set(as('lead')).send({ serial: 'X\u2028Y', certificateNumber: 'C\u0000' });
    expect(patch.status).toBe(400);
    expect(patch.body.message).toEqual(expect.arrayContaining([message('serial'), message('certificateNumber')]));
    const [after] = await t.dataSource.query('SELECT serial FROM standards WHERE id = ?', [existing.id]);
    expect(after.serial).toBe(existing.serial);
    expect(await auditCount()).toBe(auditBefore);
  });

  it('users: POST refuses a name with CR LF and creates no account', async () => {
    const res = await t.http.post('/api/users').set(as('admin')).send({
      email: 'one.line@kilocycle.test',
      name: 'One\r\nLine',
      role: 'technician',
      organizationId: orgs['Saltmarsh Restoration Works'],
      password: 'a-good-long-password',
    });
    expect(res.status).toBe(400);
    expect(res.body.message).toEqual(expect.arrayContaining([message('name')]));
    expect(await count('SELECT COUNT(*) AS n FROM users WHERE email = ?', ['one.line@kilocycle.test'])).toBe(0);
  });

  it('organisations: POST and PATCH refuse a name with a line break (LF, NEL) and change nothing', async () => {
    const orgsBefore = await count('SELECT COUNT(*) AS n FROM organizations');
    const auditBefore = await auditCount();
    const post = await t.http.post('/api/organizations').set(as('admin')).send({ name: 'Harbour\nRadio', kind: 'customer' });
    expect(post.status).toBe(400);
    expect(post.body.message).toEqual(expect.arrayContaining([message('name')]));
    expect(await count('SELECT COUNT(*) AS n FROM organizations')).toBe(orgsBefore);

    const id = orgs['Saltmarsh Restoration Works'];
    const patch = await t.http.patch(`/api/organizations/${id}`).set(as('admin')).send({ name: 'Saltmarsh\u0085Works' });
    expect(patch.status).toBe(400);
    expect(patch.body.message).toEqual(expect.arrayContaining([message('name')]));
    const [row] = await t.dataSource.query('SELECT name FROM organizations WHERE id = ?', [id]);
    expect(row.name).toBe('Saltmarsh Restoration Works');
    expect(await auditCount()).toBe(auditBefore);
  });

  it('benches and procedures refuse control characters too', async () => {
    const bench = await t.http.post('/api/benches').set(as('admin')).send({ name: 'Bench\r\n2' });
    expect(bench.status).toBe(400);
    expect(bench.body.message).toEqual([message('name')]);
    const procedure = await t.http.post('/api/procedures').set(as('lead')).send({
      name: 'Proc\u007f',
      method: 'Line one.\nLine two.',
      decisionRule: 'simple',
      dialHalfDivisionPercentOfSpan: 0.1,
      driftPpm: 0,
      driftHz: 0,
      extraComponents: [],
    });
    expect(procedure.status).toBe(400);
    // The multi-line method is fine; only the name is refused.
    expect(procedure.body.message).toEqual([message('name')]);
  });
});
