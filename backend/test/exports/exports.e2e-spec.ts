import { READINGS_CSV_COLUMNS, RESULTS_CSV_COLUMNS } from '@kilocycle/common/types';
import Papa from 'papaparse';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createRun, organizationId, readingCount } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

const parse = (text: string) => Papa.parse<string[]>(text.trim(), { header: false }).data;

describe('CSV exports (e2e, MariaDB)', () => {
  let t: TestApp;
  let saltmarsh: number;
  const tokens: Partial<Record<keyof typeof DEMO, string>> = {};
  const auth = (who: keyof typeof DEMO) => ({ Authorization: `Bearer ${tokens[who]}` });
  const insertReadings = async (runId: number, rows: Array<[number, number | null, number]>) => {
    for (let from = 0; from < rows.length; from += 1000) {
      const values = rows.slice(from, from + 1000).map(([t, dial, f], i) => [runId, from + i + 1, t, dial, f, null, 'manual']);
      await t.dataSource.query('INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source) VALUES ?', [values]);
    }
  };
  const exclude = async (runId: number, seq: number, reason: string) => {
    const [row] = await t.dataSource.query('SELECT id FROM readings WHERE run_id = ? AND seq = ?', [runId, seq]);
    const [user] = await t.dataSource.query("SELECT id FROM users WHERE role = 'technician' LIMIT 1");
    await t.dataSource.query('INSERT INTO reading_exclusions (reading_id, run_id, reason, excluded_by) VALUES (?, ?, ?, ?)', [row.id, runId, reason, user.id]);
  };

  beforeAll(async () => {
    t = await createTestApp();
    saltmarsh = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    for (const who of ['tech', 'saltmarsh', 'northgate'] as const) tokens[who] = await tokenFor(t.http, DEMO[who]);
  });
  afterAll(async () => {
    await t.close();
  });

  it('streams every reading of a run with the excluded flag and reason, escaped for spreadsheets', async () => {
    const run = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: null, kind: 'warmup' });
    const rows = Array.from({ length: 25_000 }, (_, i): [number, number | null, number] => [i * 0.5, null, 7_000_000 + i / 1000]);
    await insertReadings(run.runId, rows);
    await exclude(run.runId, 3, '=HYPERLINK("x"), counter glitch');
    const res = await t.http
      .get(`/api/runs/${run.runId}/readings.csv`)
      .set(auth('tech'))
      .buffer(true)
      .parse((r, cb) => {
        let text = '';
        r.setEncoding('utf8');
        r.on('data', (c: string) => (text += c));
        r.on('end', () => cb(null, text));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="T-.*-run-\d+-readings.csv"/);
    const lines = parse(res.body as string);
    expect(lines[0]).toEqual([...READINGS_CSV_COLUMNS]);
    expect(lines).toHaveLength(25_001);
    expect(lines[1]!.slice(0, 6)).toEqual(['1', '0', '', '7000000', '', 'manual']);
    expect(lines[3]!.slice(7)).toEqual(['true', `'=HYPERLINK("x"), counter glitch`]);
    expect(lines[4]!.slice(7)).toEqual(['false', '']);
    expect(Number(lines[25_000]![3])).toBe(7_000_000 + 24_999 / 1000);
    expect(new Date(lines[1]![6]!).toISOString()).toBe(lines[1]![6]);
  });

  it('writes each number as entered, without the float noise of unit arithmetic', async () => {
    const run = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: null, kind: 'as_found' });
    // "1820.7497 kHz" in hertz is 1820749.7000000002 as a double; 0.1 + 0.2 s is 0.30000000000000004.
    await insertReadings(run.runId, [
      [0.1 + 0.2, 1820.7, 1820.7497 * 1000],
      [12.5, 1850, 1_850_003.125],
      [60, 1900.05, 1_900_049.999_999],
    ]);
    const res = await t.http.get(`/api/runs/${run.runId}/readings.csv`).set(auth('tech'));
    expect(res.status).toBe(200);
    const lines = parse(res.text);
    expect(lines.slice(1).map((line) => line.slice(1, 4))).toEqual([
      ['0.3', '1820.7', '1820749.7'],
      ['12.5', '1850', '1850003.125'],
      ['60', '1900.05', '1900049.999999'],
    ]);
    expect(res.text).not.toMatch(/\d{16}/);
  });

  it('an exported file imports again into another run as it was', async () => {
    const source = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: null, kind: 'warmup' });
    await insertReadings(source.runId, [
      [0, 7000, 7_000_010.25],
      [10, 7000, 7_000_005.5],
      [20, 7000, 7_000_003.125],
    ]);
    const exported = await t.http.get(`/api/runs/${source.runId}/readings.csv`).set(auth('tech'));
    const target = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: null, kind: 'warmup' });
    const imported = await t.http.post(`/api/runs/${target.runId}/imports`).set(auth('tech')).attach('file', Buffer.from(exported.text), 'export.csv');
    expect(imported.status).toBe(201);
    expect(imported.body).toMatchObject({ imported: 3, columns: { time: 't_s', dial: 'dial', frequency: 'frequency_hz', aux: 'aux', unit: null } });
    const back = await t.dataSource.query('SELECT t_s, dial, frequency_hz FROM readings WHERE run_id = ? ORDER BY seq', [target.runId]);
    expect(back.map((r: Record<string, number>) => [Number(r.t_s), Number(r.dial), Number(r.frequency_hz)])).toEqual([
      [0, 7000, 7_000_010.25],
      [10, 7000, 7_000_005.5],
      [20, 7000, 7_000_003.125],
    ]);
  });

  it("gives a client its own organisation's exports and answers 404 for another's", async () => {
    const run = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: null, kind: 'as_found' });
    await insertReadings(run.runId, [[0, 7000, 7_001_000]]);
    expect((await t.http.get(`/api/runs/${run.runId}/readings.csv`).set(auth('saltmarsh'))).status).toBe(200);
    expect((await t.http.get(`/api/jobs/${run.jobId}/results.csv`).set(auth('saltmarsh'))).status).toBe(200);
    const foreign = await t.http.get(`/api/runs/${run.runId}/readings.csv`).set(auth('northgate'));
    expect(foreign.status).toBe(404);
    expect(foreign.headers['content-type']).toContain('application/json');
    expect((await t.http.get(`/api/jobs/${run.jobId}/results.csv`).set(auth('northgate'))).status).toBe(404);
    expect((await t.http.get(`/api/runs/${run.runId}/readings.csv`)).status).toBe(401);
    expect((await t.http.get('/api/runs/999999/readings.csv').set(auth('tech'))).status).toBe(404);
  });

  it("lists a job's results per calibration run and dial setting: nominal, mean, n, errors and tolerance", async () => {
    const run = await createRun(t.dataSource, { organizationId: saltmarsh, benchId: null, kind: 'as_found' });
    await insertReadings(run.runId, [
      [0, 4000, 4_000_400],
      [60, 4000, 4_000_600],
      [120, 7000, 7_001_000],
      [180, 7000, 7_001_100],
      [240, 7000, 9_999_999],
    ]);
    await exclude(run.runId, 5, 'wrong range');
    const res = await t.http.get(`/api/jobs/${run.jobId}/results.csv`).set(auth('tech'));
    expect(res.status).toBe(200);
    const [header, ...rows] = parse(res.text);
    expect(header).toEqual([...RESULTS_CSV_COLUMNS]);
    const named = rows.map((row) => Object.fromEntries(header!.map((h, i) => [h, row[i]])));
    expect(named).toHaveLength(2);
    expect(named[0]).toMatchObject({
      run_id: String(run.runId),
      run_kind: 'as_found',
      range: 'Band A',
      dial: '4000',
      dial_unit: 'kHz',
      nominal_hz: '4000000',
      measured_mean_hz: '4000500',
      n: '2',
      error_hz: '500',
      tolerance_hz: '20000',
      outlier: 'false',
      note: '',
    });
    expect(Number(named[0]!.error_ppm)).toBeCloseTo(125, 9);
    expect(Number(named[0]!.error_percent)).toBeCloseTo(0.0125, 12);
    expect(Number(named[0]!.sd_hz)).toBeCloseTo(Math.sqrt(20_000), 9);
    expect(named[1]).toMatchObject({ dial: '7000', measured_mean_hz: '7001050', n: '2', error_hz: '1050', tolerance_hz: '35000' });
    expect(await readingCount(t.dataSource, run.runId)).toBe(5);
  });
});
