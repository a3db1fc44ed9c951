import { khzRange, organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type InstrumentBody = { id: number; serial: string; organizationName: string; ranges: Array<{ id: number; label: string; position: number }> };

describe('instruments and ranges (e2e, MariaDB)', () => {
  let t: TestApp;
  let orgs: Record<string, number>;
  let as: AsDemo;
  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    orgs = await organizationIds(t, as('admin'));
  });
  afterAll(async () => {
    await t.close();
  });
  const bySerial = async (serial: string): Promise<InstrumentBody> => (await t.http.get(`/api/instruments?q=${serial}`).set(as('admin'))).body.items[0];

  describe('GET /api/instruments', () => {
    it('should page and sort server-side', async () => {
      const [{ n }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM instruments');
      const serials = (await t.dataSource.query('SELECT serial FROM instruments'))
        .map((r: { serial: string }) => r.serial)
        .sort()
        .reverse();
      const first = await t.http.get('/api/instruments?page=1&pageSize=2&sort=-serial').set(as('tech'));
      expect(first.status).toBe(200);
      expect(first.body.total).toBe(Number(n));
      expect(first.body.items.map((i: InstrumentBody) => i.serial)).toEqual(serials.slice(0, 2));
      const second = await t.http.get('/api/instruments?page=2&pageSize=2&sort=-serial').set(as('tech'));
      expect(second.body.items.map((i: InstrumentBody) => i.serial)).toEqual(serials.slice(2, 4));
    });

    it('should filter by search text, organisation, due date and overdue', async () => {
      const harwick = await t.http.get('/api/instruments?q=SG-4').set(as('lead'));
      expect(harwick.body.total).toBe(2);
      const saltmarsh = await t.http.get(`/api/instruments?organizationId=${orgs['Saltmarsh Restoration Works']}`).set(as('lead'));
      // Saltmarsh's receiver and the wavemeter of its earlier, invoiced visits (the invoices demo), nobody else's.
      expect(saltmarsh.body.items.map((i: InstrumentBody) => i.serial).sort()).toEqual(['CR7-5520', 'SW-5512']);
      const overdue = await t.http.get('/api/instruments?overdue=true').set(as('lead'));
      expect(overdue.body.items.map((i: InstrumentBody) => i.serial)).toEqual(['N-1187']);
      // Demo due dates: N-1187 ten days ago, N-1041 in 20 days, QL-XR5-01 in 150 days (the receiver has none).
      const inHalfAYear = new Date(Date.now() + 180 * 86_400_000).toISOString().slice(0, 10);
      const dueSoon = await t.http.get(`/api/instruments?dueBefore=${inHalfAYear}&sort=nextDueDate`).set(as('lead'));
      expect(dueSoon.body.items.map((i: InstrumentBody) => i.serial)).toEqual(['N-1187', 'N-1041', 'QL-XR5-01']);
    });

    it('should carry each instrument’s ranges in position order', async () => {
      const generator = await bySerial('N-1041');
      expect(generator.ranges.map((r) => r.position)).toEqual([1, 2, 3, 4]);
      expect(generator.ranges[0]).toMatchObject({
        dialUnit: 'kHz',
        dialMin: 1750,
        dialMax: 2000,
        multipliers: [1, 2, 4],
        tolerance: { kind: 'percent', percent: 0.5 },
      });
    });

    it('should show a client only its own organisation’s instruments', async () => {
      const res = await t.http.get('/api/instruments?pageSize=100').set(as('northgate'));
      const [{ n }] = await t.dataSource.query('SELECT COUNT(*) AS n FROM instruments WHERE organization_id = ?', [orgs['Northgate Radio Club']]);
      expect(res.body.total).toBe(Number(n));
      expect(res.body.items.map((i: InstrumentBody) => i.serial)).toEqual(expect.arrayContaining(['N-1041', 'N-1187']));
      expect(new Set(res.body.items.map((i: InstrumentBody) => i.organizationName))).toEqual(new Set(['Northgate Radio Club']));
      // Asking for another organisation explicitly changes nothing.
      const other = await t.http.get(`/api/instruments?organizationId=${orgs['Saltmarsh Restoration Works']}`).set(as('northgate'));
      expect(other.body.total).toBe(0);
    });

    it('should answer 404 when a client asks for another organisation’s instrument by id', async () => {
      const receiver = await bySerial('CR7-5520');
      expect((await t.http.get(`/api/instruments/${receiver.id}`).set(as('northgate'))).status).toBe(404);
      expect((await t.http.get(`/api/instruments/${receiver.id}`).set(as('saltmarsh'))).status).toBe(200);
      expect((await t.http.get(`/api/instruments/${receiver.id}/band-plan`).set(as('northgate'))).status).toBe(404);
    });
  });

  describe('POST and PATCH /api/instruments', () => {
    const body = () => ({
      organizationId: orgs['Northgate Radio Club'],
      make: 'Pellow',
      model: 'GDO-3 dip oscillator',
      serial: 'P-330',
      assetTag: 'NRC-21',
      nextDueDate: '2026-04-30',
      ranges: [khzRange('Coil 1', 1700, 4000, [1]), khzRange('Coil 2', 3900, 9000, [1, 2])],
    });

    it('should answer 403 to a client and to an engineer', async () => {
      expect((await t.http.post('/api/instruments').set(as('northgate')).send(body())).status).toBe(403);
      expect((await t.http.post('/api/instruments').set(as('engineer')).send(body())).status).toBe(403);
      const generator = await bySerial('N-1041');
      expect((await t.http.patch(`/api/instruments/${generator.id}`).set(as('northgate')).send({ assetTag: 'X' })).status).toBe(403);
    });

    it('should answer 400 naming the field for missing and malformed fields', async () => {
      const missing = await t.http
        .post('/api/instruments')
        .set(as('tech'))
        .send({ ...body(), make: '', nextDueDate: 'soon' });
      expect(missing.status).toBe(400);
      expect(missing.body.message).toEqual(expect.arrayContaining(['make must not be empty', 'nextDueDate must be a date (YYYY-MM-DD)']));
      const badRange = await t.http
        .post('/api/instruments')
        .set(as('tech'))
        .send({
          ...body(),
          ranges: [
            { ...khzRange('Coil 1', 4000, 1700), freqMinHz: 4e6, freqMaxHz: 1.7e6 },
            { ...khzRange('Coil 2', 1, 2), dialLaw: { kind: 'spiral' } },
          ],
        });
      expect(badRange.status).toBe(400);
      expect(badRange.body.message).toEqual(
        expect.arrayContaining([
          'ranges[0].dialMax: must be greater than dialMin (4000)',
          'ranges[0].freqMaxHz: must be greater than freqMinHz (4000000)',
          "ranges[1].dialLaw.kind: must be 'direct' or 'table'",
        ]),
      );
      const nested = await t.http
        .post('/api/instruments')
        .set(as('tech'))
        .send({ ...body(), ranges: [{ ...khzRange('Coil 1', 1, 2), multipliers: [0] }] });
      expect(nested.status).toBe(400);
      expect(nested.body.message.join(' ')).toContain('multipliers must be 1 or more');
      const mismatched = await t.http
        .post('/api/instruments')
        .set(as('tech'))
        .send({ ...body(), ranges: [{ ...khzRange('Coil 1', 1, 2), dialLaw: { kind: 'direct', unit: 'MHz' } }] });
      expect(mismatched.body.message).toEqual([expect.stringContaining('ranges[0].dialLaw.unit: a direct-reading dial reads in its own unit')]);
    });

    it('should create an instrument with its ranges in one go, audit it, and refuse the same make, model and serial twice', async () => {
      const res = await t.http.post('/api/instruments').set(as('tech')).send(body());
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        make: 'Pellow',
        serial: 'P-330',
        organizationName: 'Northgate Radio Club',
        nextDueDate: '2026-04-30',
        recallIntervalMonths: 12,
      });
      expect(res.body.ranges.map((r: { label: string; position: number }) => [r.position, r.label])).toEqual([
        [1, 'Coil 1'],
        [2, 'Coil 2'],
      ]);
      const rows = await t.dataSource.query('SELECT COUNT(*) AS n FROM instrument_ranges WHERE instrument_id = ?', [res.body.id]);
      expect(Number(rows[0].n)).toBe(2);
      const [audit] = await t.dataSource.query("SELECT action, changes FROM audit_events WHERE entity = 'instrument' AND entity_id = ?", [String(res.body.id)]);
      expect(audit.action).toBe('create');
      expect(parseChanges(audit.changes).ranges).toEqual(['Coil 1', 'Coil 2']);
      const again = await t.http.post('/api/instruments').set(as('lead')).send(body());
      expect(again.status).toBe(409);
    });

    it('should replace the ranges in one transaction: keep, change, add and remove', async () => {
      const created = (
        await t.http
          .post('/api/instruments')
          .set(as('tech'))
          .send({ ...body(), serial: 'P-331' })
      ).body as InstrumentBody;
      const [coil1, coil2] = created.ranges;
      const res = await t.http
        .patch(`/api/instruments/${created.id}`)
        .set(as('tech'))
        .send({ assetTag: 'NRC-22', ranges: [{ ...khzRange('Coil 2 (relabelled)', 3900, 9000, [1, 2]), id: coil2!.id }, khzRange('Coil 3', 8800, 20000)] });
      expect(res.status).toBe(200);
      expect(res.body.assetTag).toBe('NRC-22');
      expect(res.body.ranges.map((r: { id: number; label: string; position: number }) => [r.position, r.label])).toEqual([
        [1, 'Coil 2 (relabelled)'],
        [2, 'Coil 3'],
      ]);
      expect(res.body.ranges[0].id).toBe(coil2!.id);
      const gone = await t.dataSource.query('SELECT id FROM instrument_ranges WHERE id = ?', [coil1!.id]);
      expect(gone).toEqual([]);
      const [audit] = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'instrument' AND entity_id = ? AND action = 'update'", [
        String(created.id),
      ]);
      expect(parseChanges(audit.changes).ranges).toEqual({ added: ['Coil 3'], removed: ['Coil 1'], changed: ['Coil 2 (relabelled)'] });
    });

    it('should answer 409 when a range with runs would be removed or its dial law or tolerance changed', async () => {
      const generator = await bySerial('N-1041');
      const full = (await t.http.get(`/api/instruments/${generator.id}`).set(as('tech'))).body;
      const withoutFirst = full.ranges.slice(1);
      const removed = await t.http.patch(`/api/instruments/${generator.id}`).set(as('tech')).send({ ranges: withoutFirst });
      expect(removed.status).toBe(409);
      expect(removed.body.message).toContain('already has runs and cannot be removed');
      const retoleranced = full.ranges.map((r: Record<string, unknown>, i: number) => (i === 0 ? { ...r, tolerance: { kind: 'percent', percent: 1 } } : r));
      const changed = await t.http
        .patch(`/api/instruments/${generator.id}`)
        .set(as('tech'))
        .send({ ranges: retoleranced.map(({ position: _p, ...r }: Record<string, unknown>) => r) });
      expect(changed.status).toBe(409);
      expect(changed.body.message).toContain('its tolerance cannot change');
      // A new label and multipliers on a used range are fine.
      const relabelled = full.ranges.map(({ position: _p, ...r }: Record<string, unknown>, i: number) =>
        i === 0 ? { ...r, label: 'A  160 m band-spread', multipliers: [1, 2] } : r,
      );
      const ok = await t.http.patch(`/api/instruments/${generator.id}`).set(as('tech')).send({ ranges: relabelled });
      expect(ok.status).toBe(200);
      expect(ok.body.ranges[0]).toMatchObject({ id: full.ranges[0].id, label: 'A  160 m band-spread', multipliers: [1, 2] });
    });

    it('should refuse a range id that belongs to another instrument', async () => {
      const generator = await bySerial('N-1041');
      const receiver = await bySerial('CR7-5520');
      const res = await t.http
        .patch(`/api/instruments/${generator.id}`)
        .set(as('tech'))
        .send({ ranges: [{ ...khzRange('X', 1, 2), id: receiver.ranges[0]!.id }] });
      expect(res.status).toBe(400);
      expect(res.body.message).toContain('ranges[0].id');
    });
  });

  describe('GET /api/instruments/:id/band-plan', () => {
    it('should place each range and multiplier against the Region 2 bands', async () => {
      const generator = await bySerial('N-1187');
      const res = await t.http.get(`/api/instruments/${generator.id}/band-plan?region=2`).set(as('northgate'));
      expect(res.status).toBe(200);
      const rangeA = res.body.rows.filter((r: { rangeId: number }) => r.rangeId === generator.ranges[0]!.id);
      // 1750–2000 kHz ×1, ×2, ×4 gives 1.75–2.0, 3.5–4.0 and 7.0–8.0 MHz: 160 m, 80 m and 40 m whole.
      expect(rangeA.map((r: { multiplier: number; outLowHz: number; outHighHz: number }) => [r.multiplier, r.outLowHz, r.outHighHz])).toEqual([
        [1, 1.75e6, 2.0e6],
        [2, 3.5e6, 4.0e6],
        [4, 7.0e6, 8.0e6],
      ]);
      expect(rangeA.map((r: { bands: Array<{ name: string; full: boolean }> }) => r.bands.map((b) => `${b.name}${b.full ? '' : ' (part)'}`))).toEqual([
        ['160 m'],
        ['80 m'],
        ['40 m'],
      ]);
    });

    it('should give the nominal and the corrected dial setting for a wanted frequency', async () => {
      const generator = await bySerial('N-1041');
      const runs = await t.http.get(`/api/runs?instrumentId=${generator.id}&kind=as_left`).set(as('tech'));
      const res = await t.http.get(`/api/instruments/${generator.id}/band-plan?wantedHz=3700000`).set(as('tech'));
      expect(res.status).toBe(200);
      const onA = res.body.wanted.settings.find((s: { rangeId: number }) => s.rangeId === generator.ranges[0]!.id);
      expect(onA).toMatchObject({ multiplier: 2, fundamentalHz: 1_850_000, nominalDial: 1850, correctionRunId: runs.body.items[0].id });
      // After adjustment the range is within about 0.02 % of its marks: the correction is under half a kHz.
      expect(Math.abs(onA.correctedDial - 1850)).toBeLessThan(0.5);
      // By hand: the means of the as-left readings at each setting, and the straight line between the two
      // settings whose means bracket 1 850 000 Hz: dial = d₁ + (F − f₁)(d₂ − d₁)/(f₂ − f₁).
      const readings: Array<{ dial: number; frequency_hz: number }> = await t.dataSource.query(
        'SELECT r.dial, r.frequency_hz FROM readings r LEFT JOIN reading_exclusions e ON e.reading_id = r.id WHERE r.run_id = ? AND e.reading_id IS NULL AND r.dial IS NOT NULL',
        [onA.correctionRunId],
      );
      const sums = new Map<number, { sum: number; n: number }>();
      for (const r of readings) {
        const entry = sums.get(Number(r.dial)) ?? { sum: 0, n: 0 };
        sums.set(Number(r.dial), { sum: entry.sum + Number(r.frequency_hz), n: entry.n + 1 });
      }
      const means = [...sums].map(([dial, { sum, n }]) => ({ dial, mean: sum / n })).sort((a, b) => a.dial - b.dial);
      const i = means.findIndex((m) => m.mean >= 1_850_000);
      expect(i).toBeGreaterThan(0);
      const [a, b] = [means[i - 1]!, means[i]!];
      const byHand = a.dial + ((1_850_000 - a.mean) * (b.dial - a.dial)) / (b.mean - a.mean);
      expect(onA.correctedDial).toBeCloseTo(byHand, 6);
      // The correction is real: the uncorrected dial (1850) would miss the interpolation by far more than the check's 5e-7.
      expect(Math.abs(byHand - 1850)).toBeGreaterThan(0.01);
    });

    // Band edges: ITU Radio Regulations, Article 5 (edition 2020, entered from memory; fixtures/radio/amateur_hf_bands_itu_rr_art5.csv).
    // Range A of N-1187 is 1750-2000 kHz at ×1, ×2, ×4: 1.75-2.0, 3.5-4.0 and 7.0-8.0 MHz.
    it.each([
      [1, { '160 m': [1.81e6, 1.85e6], '80 m': [3.5e6, 3.8e6], '40 m': [7.0e6, 7.2e6] }],
      [2, { '160 m': [1.8e6, 2.0e6], '80 m': [3.5e6, 4.0e6], '40 m': [7.0e6, 7.3e6] }],
      [3, { '160 m': [1.8e6, 2.0e6], '80 m': [3.5e6, 3.9e6], '40 m': [7.0e6, 7.2e6] }],
    ] as const)('should plan against the bands of ITU Region %i, with the source and the national note', async (region, edges) => {
      const generator = await bySerial('N-1187');
      const res = await t.http.get(`/api/instruments/${generator.id}/band-plan?region=${region}`).set(as('tech'));
      expect(res.status).toBe(200);
      expect(res.body.region).toBe(region);
      expect(res.body.source).toMatch(/^ITU Radio Regulations, Article 5/);
      expect(res.body.nationalNote).toMatch(/check your licence/);
      type Band = { name: string; lowHz: number; highHz: number; status: string };
      expect(res.body.bands.map((b: Band) => b.name)).toEqual(['160 m', '80 m', '60 m', '40 m', '30 m', '20 m', '17 m', '15 m', '12 m', '10 m']);
      expect(res.body.bands.find((b: Band) => b.name === '60 m')).toMatchObject({ lowHz: 5_351_500, highHz: 5_366_500, status: 'secondary' });
      const rangeA = res.body.rows.filter((r: { rangeId: number }) => r.rangeId === generator.ranges[0]!.id);
      type Covered = { name: string; coveredLowHz: number; coveredHighHz: number; full: boolean };
      expect(rangeA.map((r: { bands: Covered[] }) => r.bands.map((b) => [b.name, b.coveredLowHz, b.coveredHighHz, b.full]))).toEqual([
        [['160 m', ...edges['160 m'], true]],
        [['80 m', ...edges['80 m'], true]],
        [['40 m', ...edges['40 m'], true]],
      ]);
    });

    it('should give a dial setting for a wanted frequency in Region 1, where the demo lab is', async () => {
      const generator = await bySerial('N-1041');
      const res = await t.http.get(`/api/instruments/${generator.id}/band-plan?region=1&wantedHz=3700000`).set(as('tech'));
      expect(res.status).toBe(200);
      expect(res.body.wanted.settings.find((s: { rangeId: number }) => s.rangeId === generator.ranges[0]!.id)).toMatchObject({
        multiplier: 2,
        fundamentalHz: 1_850_000,
      });
    });

    it('should refuse a region that is not an ITU region with a band table, naming the problem', async () => {
      const generator = await bySerial('N-1041');
      for (const region of ['4', '0', 'one']) {
        const res = await t.http.get(`/api/instruments/${generator.id}/band-plan?region=${region}`).set(as('tech'));
        expect(res.status).toBe(400);
        expect(res.body.message).toEqual(['region must be an ITU region with a band table: 1, 2, 3']);
      }
    });
  });
});
