import { instrumentWithJob, openRun, organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type ReadingBody = { id: number; seq: number; dial: number | null; frequency: number; source: string; excluded: boolean; excludedReason: string | null };

describe('readings (e2e, MariaDB)', () => {
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
  const count = async (runId: number) => Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM readings WHERE run_id = ?', [runId]))[0].n);
  const freshRun = async (kind = 'as_found') => {
    const { jobId, rangeIds } = await instrumentWithJob(t, as('tech'), { organizationId: orgs['Northgate Radio Club'] });
    return openRun(t, as('tech'), jobId, { rangeId: rangeIds[0], kind });
  };

  describe('POST /api/runs/:id/readings', () => {
    it('should number readings without seq 1..n, accept frequencies as typed and answer the acknowledgement', async () => {
      const runId = await freshRun();
      const res = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({
          readings: [
            { dial: 1735, frequency: '1735 kHz' },
            { dial: '1735', frequency: '1.735 MHz' },
            { dial: 1735, frequency: '1735000' },
            { dial: 1750, frequency: 1749012.5 },
          ],
        });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ accepted: 4, duplicates: 0, rejected: [], lastSeq: 4 });
      expect(res.body.stored.map((r: ReadingBody) => [r.seq, r.dial, r.frequency, r.source])).toEqual([
        [1, 1735, 1_735_000, 'manual'],
        [2, 1735, 1_735_000, 'manual'],
        [3, 1735, 1_735_000, 'manual'],
        [4, 1750, 1_749_012.5, 'manual'],
      ]);
      const next = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({ readings: [{ dial: 1800, frequency: 1_798_400 }] });
      expect(next.body).toMatchObject({ accepted: 1, lastSeq: 5 });
    });

    it('should count a repeated seq as a duplicate and store it once', async () => {
      const runId = await freshRun();
      const batch = {
        readings: [
          { seq: 1, dial: 1200, frequency: 1.2e6 },
          { seq: 2, dial: 1300, frequency: 1.3e6 },
        ],
      };
      expect((await t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send(batch)).body).toMatchObject({ accepted: 2, duplicates: 0 });
      const again = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({ readings: [...batch.readings, { seq: 3, dial: 1400, frequency: 1.4e6 }] });
      expect(again.body).toMatchObject({ accepted: 1, duplicates: 2, lastSeq: 3 });
      expect(await count(runId)).toBe(3);
    });

    it.each([
      ['non-numeric', { dial: 1500, frequency: 'abc' }, 'readings[0].frequency:'],
      ['negative', { dial: 1500, frequency: -1500000 }, 'readings[0].frequency: frequency cannot be negative'],
      ['NaN', { dial: 1500, frequency: 'NaN' }, 'readings[0].frequency:'],
      ['an unknown unit', { dial: 1500, frequency: '1500 kc' }, "readings[0].frequency: unknown unit 'kc'"],
      ['a dial more than 10 % outside the range', { dial: 2200, frequency: 2.2e6 }, 'readings[0].dial: dial 2200 is outside'],
      ['no dial in a calibration run', { frequency: 1.5e6 }, 'readings[0].dial: a dial setting is required'],
      ['an unknown field', { dial: 1500, frequency: 1.5e6, temperature: 21 }, 'readings[0].temperature:'],
    ])('should answer 400 naming the field for %s and write nothing', async (_name, reading, message) => {
      const runId = await freshRun();
      const res = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({ readings: [reading] });
      expect(res.status).toBe(400);
      expect(res.body.message[0]).toContain(message);
      expect(await count(runId)).toBe(0);
    });

    it('should write nothing when one reading of a batch is bad, and name its index', async () => {
      const runId = await freshRun();
      const res = await t.http
        .post(`/api/runs/${runId}/readings`)
        .set(as('tech'))
        .send({
          readings: [
            { dial: 1100, frequency: 1.1e6 },
            { dial: 1200, frequency: 1.2e6 },
            { dial: 'twelve', frequency: 1.3e6 },
          ],
        });
      expect(res.status).toBe(400);
      expect(res.body.message).toEqual([expect.stringContaining('readings[2].dial:')]);
      expect(res.body.rejected).toEqual([expect.objectContaining({ index: 2, field: 'dial' })]);
      expect(await count(runId)).toBe(0);
      // A dial just inside the 10 % margin is taken (range 1000–2000, margin 100).
      expect(
        (
          await t.http
            .post(`/api/runs/${runId}/readings`)
            .set(as('tech'))
            .send({ readings: [{ dial: 2099, frequency: 2.099e6 }] })
        ).status,
      ).toBe(201);
    });

    it('should answer 400 for an empty or oversized batch', async () => {
      const runId = await freshRun();
      expect((await t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send({ readings: [] })).body.message).toEqual([
        'readings must hold at least 1 reading',
      ]);
      const many = Array.from({ length: 1001 }, (_, i) => ({ dial: 1500, frequency: 1.5e6 + i }));
      expect((await t.http.post(`/api/runs/${runId}/readings`).set(as('tech')).send({ readings: many })).status).toBe(400);
    });

    it('should refuse readings for a closed run or a job in review with 409', async () => {
      const closedRun = (await t.http.get('/api/runs?kind=as_left&q=N-1041').set(as('tech'))).body.items[0];
      const res = await t.http
        .post(`/api/runs/${closedRun.id}/readings`)
        .set(as('tech'))
        .send({ readings: [{ dial: 1800, frequency: 1.8e6 }] });
      expect(res.status).toBe(409);
      expect(res.body.message).toBe(`run ${closedRun.id} is closed`);
    });

    it('should answer 403 to a client and to an engineer on a calibration run, 404 for a run that does not exist', async () => {
      const open = (await t.http.get('/api/runs?status=open&q=N-1187').set(as('tech'))).body.items[0];
      const reading = { readings: [{ dial: 1800, frequency: 1.8e6 }] };
      expect((await t.http.post(`/api/runs/${open.id}/readings`).set(as('northgate')).send(reading)).status).toBe(403);
      expect((await t.http.post(`/api/runs/${open.id}/readings`).set(as('engineer')).send(reading)).status).toBe(403);
      expect((await t.http.post('/api/runs/999999/readings').set(as('tech')).send(reading)).status).toBe(404);
    });
  });

  describe('readings are never edited or deleted', () => {
    it('should have no route to change or remove a reading', async () => {
      const runId = await freshRun();
      const stored = (
        await t.http
          .post(`/api/runs/${runId}/readings`)
          .set(as('tech'))
          .send({ readings: [{ dial: 1500, frequency: 1.5e6 }] })
      ).body.stored[0];
      for (const method of ['put', 'patch', 'delete'] as const) {
        const one = await t.http[method](`/api/runs/${runId}/readings/${stored.id}`).set(as('admin')).send({ frequency: 1.6e6 });
        expect([404, 405]).toContain(one.status);
        const all = await t.http[method](`/api/runs/${runId}/readings`).set(as('admin')).send({ frequency: 1.6e6 });
        expect([404, 405]).toContain(all.status);
      }
      const [row] = await t.dataSource.query('SELECT frequency_hz FROM readings WHERE id = ?', [stored.id]);
      expect(row.frequency_hz).toBe(1.5e6);
    });

    it('should be refused by the database itself: UPDATE and DELETE raise the trigger’s error', async () => {
      const [reading] = await t.dataSource.query('SELECT id FROM readings LIMIT 1');
      await expect(t.dataSource.query('UPDATE readings SET frequency_hz = 1 WHERE id = ?', [reading.id])).rejects.toThrow(
        'readings are never changed or removed',
      );
      await expect(t.dataSource.query('DELETE FROM readings WHERE id = ?', [reading.id])).rejects.toThrow('readings are never changed or removed');
    });
  });

  describe('GET /api/runs/:id/readings and exclusions', () => {
    it('should page and sort a run’s readings', async () => {
      const warmup = (await t.http.get('/api/runs?kind=warmup&q=CR7-5520&sort=startedAt').set(as('tech'))).body.items[0];
      const first = await t.http.get(`/api/runs/${warmup.id}/readings?pageSize=5`).set(as('tech'));
      expect(first.body.total).toBe(720);
      expect(first.body.items.map((r: ReadingBody) => r.seq)).toEqual([1, 2, 3, 4, 5]);
      const last = await t.http.get(`/api/runs/${warmup.id}/readings?pageSize=3&sort=-seq`).set(as('tech'));
      expect(last.body.items.map((r: ReadingBody) => r.seq)).toEqual([720, 719, 718]);
      const page = await t.http.get(`/api/runs/${warmup.id}/readings?pageSize=100&page=8`).set(as('tech'));
      expect(page.body.items.map((r: ReadingBody) => r.seq)).toEqual(Array.from({ length: 20 }, (_, i) => 701 + i));
      const byFrequency = await t.http.get(`/api/runs/${warmup.id}/readings?pageSize=1&sort=-frequency`).set(as('tech'));
      expect(byFrequency.body.items[0].seq).toBeLessThan(5);
      expect((await t.http.get(`/api/runs/${warmup.id}/readings?sort=source`).set(as('tech'))).status).toBe(400);
    });

    it('should exclude a reading with a reason, audit it, flag it in the list and refuse a second exclusion', async () => {
      const runId = await freshRun();
      const stored = (
        await t.http
          .post(`/api/runs/${runId}/readings`)
          .set(as('tech'))
          .send({
            readings: [
              { dial: 1500, frequency: 1.5e6 },
              { dial: 1600, frequency: 1.69e6 },
            ],
          })
      ).body.stored;
      const target = stored[1];
      const short = await t.http.post(`/api/runs/${runId}/readings/${target.id}/exclusion`).set(as('tech')).send({ reason: 'no' });
      expect(short.status).toBe(400);
      expect(short.body.message).toEqual(['reason must be at least 3 characters']);
      const missing = await t.http.post(`/api/runs/${runId}/readings/${target.id}/exclusion`).set(as('tech')).send({});
      expect(missing.status).toBe(400);
      const res = await t.http
        .post(`/api/runs/${runId}/readings/${target.id}/exclusion`)
        .set(as('tech'))
        .send({ reason: 'Counter caught the second harmonic' });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ id: target.id, seq: 2, frequency: 1.69e6, excluded: true, excludedReason: 'Counter caught the second harmonic' });
      const list = await t.http.get(`/api/runs/${runId}/readings`).set(as('tech'));
      expect(list.body.items.map((r: ReadingBody) => [r.seq, r.excluded, r.excludedReason])).toEqual([
        [1, false, null],
        [2, true, 'Counter caught the second harmonic'],
      ]);
      const onlyExcluded = await t.http.get(`/api/runs/${runId}/readings?excluded=true`).set(as('tech'));
      expect(onlyExcluded.body.total).toBe(1);
      const [audit] = await t.dataSource.query("SELECT action, changes FROM audit_events WHERE entity = 'reading' AND entity_id = ?", [String(target.id)]);
      expect(audit.action).toBe('exclude');
      expect(parseChanges(audit.changes)).toMatchObject({ runId, seq: 2, reason: 'Counter caught the second harmonic' });
      const again = await t.http.post(`/api/runs/${runId}/readings/${target.id}/exclusion`).set(as('tech')).send({ reason: 'Twice' });
      expect(again.status).toBe(409);
      const otherRun = await freshRun();
      expect((await t.http.post(`/api/runs/${otherRun}/readings/${stored[0].id}/exclusion`).set(as('tech')).send({ reason: 'wrong run' })).status).toBe(404);
      // The exclusion itself is as permanent as the reading.
      await expect(t.dataSource.query('DELETE FROM reading_exclusions WHERE reading_id = ?', [target.id])).rejects.toThrow('never changed or removed');
    });

    it('should refuse an exclusion on a closed run', async () => {
      const closedRun = (await t.http.get('/api/runs?kind=as_found&status=closed&q=N-1041').set(as('tech'))).body.items[0];
      const reading = (await t.http.get(`/api/runs/${closedRun.id}/readings?pageSize=1`).set(as('tech'))).body.items[0];
      expect((await t.http.post(`/api/runs/${closedRun.id}/readings/${reading.id}/exclusion`).set(as('lead')).send({ reason: 'late look' })).status).toBe(409);
    });

    it('should let a client read its own runs’ readings and answer 404 for another organisation’s', async () => {
      const northgateRun = (await t.http.get('/api/runs?kind=as_left&q=N-1041').set(as('admin'))).body.items[0];
      expect((await t.http.get(`/api/runs/${northgateRun.id}/readings`).set(as('northgate'))).body.total).toBe(22);
      expect((await t.http.get(`/api/runs/${northgateRun.id}/readings`).set(as('saltmarsh'))).status).toBe(404);
      const someReading = (await t.http.get(`/api/runs/${northgateRun.id}/readings?pageSize=1`).set(as('admin'))).body.items[0];
      expect(
        (await t.http.post(`/api/runs/${northgateRun.id}/readings/${someReading.id}/exclusion`).set(as('saltmarsh')).send({ reason: 'peek' })).status,
      ).toBe(403);
    });
  });
});
