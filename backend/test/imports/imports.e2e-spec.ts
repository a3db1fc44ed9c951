// Before the app module loads: a 1 MB limit so the size refusal can be tested with a small upload.
process.env.KC_IMPORT_MAX_MB = '1';
import type { ImportProgress, ImportReport } from '@kilocycle/common/types';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createRun, organizationId, readingCount, type RunFixture } from '../ingest/ingest-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

const BOM = '\uFEFF';
// Header in another order and naming, mixed units (cell units, a unit column, bare Hz), a blank line,
// Windows line endings, and three bad rows: line 5 (frequency), line 8 (dial out of the range), line 10 (time).
const MIXED_LINES = [
  'Counter,Unit,Dial setting,Elapsed (s)',
  '7001.25,kHz,7000,0',
  '7.00130 MHz,,7000,10',
  '7001350,Hz,7000,20',
  'abc,kHz,7000,30',
  '7001.40,kHz,7000,40',
  '',
  '7001.45,kHz,99999,50',
  '"7 001,50",kHz,7000,60',
  '7001.55,kHz,7000,x',
  '7001.60,kHz,7000,80',
];
const MIXED = Buffer.from(BOM + MIXED_LINES.join('\r\n') + '\r\n', 'utf8');
const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0]);

describe('CSV import (e2e, MariaDB)', () => {
  let t: TestApp;
  let org: number;
  const tokens: Partial<Record<keyof typeof DEMO, string>> = {};
  const auth = (who: keyof typeof DEMO) => ({ Authorization: `Bearer ${tokens[who]}` });
  const upload = (who: keyof typeof DEMO, runId: number, file: Buffer, name: string, query: Record<string, string> = {}) =>
    t.http.post(`/api/runs/${runId}/imports`).query(query).set(auth(who)).attach('file', file, { filename: name, contentType: 'text/csv' });
  const readings = (runId: number) =>
    t.dataSource.query('SELECT seq, t_s, dial, frequency_hz, source FROM readings WHERE run_id = ? ORDER BY seq', [runId]) as Promise<
      Array<Record<string, number | string>>
    >;
  type RunOptions = Parameters<typeof createRun>[1];
  const newRun = (kind: RunOptions['kind'] = 'warmup', extra: Partial<RunOptions> = {}): Promise<RunFixture> =>
    createRun(t.dataSource, { organizationId: org, benchId: null, kind, ...extra });

  beforeAll(async () => {
    t = await createTestApp();
    org = await organizationId(t.dataSource, DEMO_CUSTOMERS.saltmarsh);
    for (const who of ['tech', 'engineer', 'saltmarsh', 'lead'] as const) tokens[who] = await tokenFor(t.http, DEMO[who]);
  });
  afterAll(async () => {
    await t.close();
  });

  it('mode=all: refuses the whole file, reports exactly the three bad rows with line and column, and writes nothing', async () => {
    const run = await newRun();
    const res = await upload('tech', run.runId, MIXED, 'bench log.csv');
    expect(res.status).toBe(400);
    const body = res.body as ImportReport & { message: string };
    expect(body.message).toContain('3 rows are not valid: nothing was imported');
    expect(body.imported).toBe(0);
    expect(body.rejectedCount).toBe(3);
    expect(body.rejected.map((r) => [r.line, r.column])).toEqual([
      [5, 'Counter'],
      [8, 'Dial setting'],
      [10, 'Elapsed (s)'],
    ]);
    expect(body.rejected[0]!.reason).toContain("'abc'");
    expect(body.rejected[1]!.reason).toContain('outside the range');
    expect(body.rowCount).toBe(9);
    expect(body.columns).toEqual({ time: 'Elapsed (s)', dial: 'Dial setting', frequency: 'Counter', unit: 'Unit', aux: null });
    expect(await readingCount(t.dataSource, run.runId)).toBe(0);
  });

  it('mode=valid: writes the valid rows in Hz, lists the skipped ones in the run notes, and audits the import', async () => {
    const run = await newRun();
    await t.dataSource.query('UPDATE runs SET notes = ? WHERE id = ?', ['Cold start.', run.runId]);
    const res = await upload('tech', run.runId, MIXED, 'bench log.csv', { mode: 'valid' });
    expect(res.status).toBe(201);
    const body = res.body as ImportReport;
    expect(body).toMatchObject({ runId: run.runId, mode: 'valid', imported: 6, rejectedCount: 3, rowCount: 9, delimiter: ',', notesAppended: true });
    expect(body.rejected.map((r) => r.line)).toEqual([5, 8, 10]);
    const stored = await readings(run.runId);
    expect(stored.map((r) => Number(r.frequency_hz))).toEqual([7_001_250, 7_001_300, 7_001_350, 7_001_400, 7_001_500, 7_001_600]);
    expect(stored.map((r) => Number(r.t_s))).toEqual([0, 10, 20, 40, 60, 80]);
    expect(stored.map((r) => Number(r.seq))).toEqual([1, 2, 3, 4, 5, 6]);
    expect(new Set(stored.map((r) => r.source))).toEqual(new Set(['import']));
    const [{ notes }] = await t.dataSource.query('SELECT notes FROM runs WHERE id = ?', [run.runId]);
    expect(notes).toMatch(/^Cold start\.\n\nImport of "bench log.csv" on .* by Tomas Reyes: 6 readings imported, 3 rows skipped:/);
    expect(notes).toContain('- line 5, Counter: ');
    expect(notes).toContain('- line 8, Dial setting: ');
    expect(notes).toContain('- line 10, Elapsed (s): ');
    const [audit] = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'run' AND entity_id = ? AND action = 'import'", [
      String(run.runId),
    ]);
    expect(typeof audit.changes === 'string' ? JSON.parse(audit.changes) : audit.changes).toMatchObject({ mode: 'valid', imported: 6, skipped: 3 });
  });

  it('mode=all with good rows writes them all; a TSV with a mapping and clock times works too', async () => {
    const run = await newRun();
    const good = Buffer.from(MIXED_LINES.filter((_l, i) => ![4, 7, 9].includes(i)).join('\n'));
    const res = await upload('engineer', run.runId, good, 'good.csv');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ imported: 6, rejected: [], rejectedCount: 0, notesAppended: false });

    const tsvRun = await newRun();
    const tsv = Buffer.from('A\tB\tC\n0:00:00\t7001.25\tkHz\n0:01:00\t7001.5\tkHz\n1:00:00\t7.002\tMHz\n');
    const mapped = await t.http
      .post(`/api/runs/${tsvRun.runId}/imports`)
      .set(auth('tech'))
      .field('mapping', JSON.stringify({ time: 'A', frequency: 'B', unit: 3 }))
      .attach('file', tsv, { filename: 'log.tsv', contentType: 'text/tab-separated-values' });
    expect(mapped.status).toBe(201);
    expect(mapped.body).toMatchObject({ imported: 3, delimiter: '\t', columns: { time: 'A', frequency: 'B', unit: 'C', dial: null } });
    expect((await readings(tsvRun.runId)).map((r) => [Number(r.t_s), Number(r.frequency_hz)])).toEqual([
      [0, 7_001_250],
      [60, 7_001_500],
      [3600, 7_002_000],
    ]);
  });

  it('counts lines right after a quoted cell that holds a line break, and reads semicolon files with comma decimals', async () => {
    const run = await newRun();
    const file = Buffer.from('time;frequency (kHz);remark\n0;7001,25;"cold start,\nlid off"\n10;oops;\n20;7001,5;\n');
    const res = await upload('tech', run.runId, file, 'log.csv');
    expect(res.status).toBe(400);
    expect(res.body.delimiter).toBe(';');
    expect(res.body.rejected).toEqual([{ line: 4, column: 'frequency (kHz)', reason: expect.stringContaining("'oops'") }]);
  });

  it('refuses a file that is really a PNG image, whatever its name says (415)', async () => {
    const run = await newRun();
    const res = await upload('tech', run.runId, PNG, 'readings.csv');
    expect(res.status).toBe(415);
    expect(res.body.message).toBe('the file is not CSV or TSV text (it looks like a PNG image)');
    expect(await readingCount(t.dataSource, run.runId)).toBe(0);
  });

  it('refuses a file over the size limit (413), a file without a frequency column (400) and an upload without a file (400)', async () => {
    const run = await newRun();
    const big = Buffer.alloc(1.2 * 1024 * 1024, 'time,frequency\n1,7000000\n');
    const tooBig = await upload('tech', run.runId, big, 'big.csv');
    expect(tooBig.status).toBe(413);
    expect(tooBig.body.message).toBe('the file is larger than the 1 MB limit');
    const noFrequency = await upload('tech', run.runId, Buffer.from('time,dial\n0,7000\n'), 'x.csv');
    expect(noFrequency.status).toBe(400);
    expect(noFrequency.body.rejected).toEqual([{ line: 1, column: 'header', reason: expect.stringContaining('no frequency column') }]);
    const noFile = await t.http.post(`/api/runs/${run.runId}/imports`).set(auth('tech')).send({});
    expect(noFile.status).toBe(400);
    expect(noFile.body.message).toContain('multipart/form-data');
    expect(await readingCount(t.dataSource, run.runId)).toBe(0);
  });

  it('a client cannot upload, even into its own organisation’s run (403); an engineer cannot import into a calibration run', async () => {
    const run = await newRun();
    const client = await upload('saltmarsh', run.runId, MIXED, 'x.csv');
    expect(client.status).toBe(403);
    const calibration = await newRun('as_found');
    const engineer = await upload('engineer', calibration.runId, Buffer.from('dial,frequency\n7000,7000 kHz\n'), 'x.csv');
    expect(engineer.status).toBe(403);
    const tech = await upload('tech', calibration.runId, Buffer.from('dial,frequency\n7000,7000 kHz\n'), 'x.csv');
    expect(tech.status).toBe(201);
    expect(await readingCount(t.dataSource, run.runId)).toBe(0);
  });

  it('a calibration file with no time column stores no invented elapsed time (t = 0, not the time since the run started)', async () => {
    const started = new Date(Date.now() - (30 * 3600 + 26 * 60) * 1000);
    const calibration = await newRun('as_found', { startedAt: started });
    const res = await upload('tech', calibration.runId, Buffer.from('dial,frequency\n7000,7000 kHz\n7100,7100.5 kHz\n'), 'untimed.csv');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ imported: 2, columns: { time: null } });
    expect((await readings(calibration.runId)).map((r) => [Number(r.t_s), Number(r.dial), Number(r.frequency_hz)])).toEqual([
      [0, 7000, 7_000_000],
      [0, 7100, 7_100_500],
    ]);
  });

  it('a run that takes no readings answers 409: closed, or its job signed', async () => {
    const closed = await newRun('warmup', { status: 'closed' });
    expect((await upload('tech', closed.runId, MIXED, 'x.csv', { mode: 'valid' })).status).toBe(409);
    const signed = await newRun('warmup', { jobStatus: 'approved' });
    const res = await upload('tech', signed.runId, MIXED, 'x.csv', { mode: 'valid' });
    expect(res.status).toBe(409);
    expect(res.body.message).toContain('approved');
    expect(await upload('tech', 999_999, MIXED, 'x.csv').then((r) => r.status)).toBe(404);
  });

  it('reports progress under the id the page chose, to that user only', async () => {
    const run = await newRun();
    const importId = 'page-upload-0001';
    const res = await upload('tech', run.runId, MIXED, 'x.csv', { mode: 'valid', importId });
    expect(res.status).toBe(201);
    expect(res.body.importId).toBe(importId);
    const progress = await t.http.get(`/api/imports/${importId}/progress`).set(auth('tech'));
    expect(progress.status).toBe(200);
    expect(progress.body as ImportProgress).toMatchObject({
      importId,
      runId: run.runId,
      phase: 'done',
      fraction: 1,
      rowsDone: 9,
      rowsRejected: 3,
      imported: 6,
      bytesTotal: MIXED.length,
      bytesDone: MIXED.length,
    });
    expect((await t.http.get(`/api/imports/${importId}/progress`).set(auth('engineer'))).status).toBe(404);
    const failed = await upload('tech', run.runId, PNG, 'x.csv', { importId: 'page-upload-0002' });
    expect(failed.status).toBe(415);
    expect((await t.http.get('/api/imports/page-upload-0002/progress').set(auth('tech'))).body).toMatchObject({
      phase: 'failed',
      message: expect.stringContaining('PNG'),
    });
  });
});
