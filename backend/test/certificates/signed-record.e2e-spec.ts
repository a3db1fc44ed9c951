import type { JobResults, Procedure, ReferenceStandard } from '@kilocycle/common/types';
import { instrumentWithJob, khzRange, openRun, organizationIds, postReadings } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// Signed means frozen: after signing, edits of the procedure, the standard, the instrument and the customer
// change nothing a signed job shows (results, CSV, review, certificate list, public page), while an open job
// using the same procedure and standard follows every edit.
describe('the signed record (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let procedure: Procedure;
  let standard: ReferenceStandard;
  let customerId: number;
  let signed: { jobId: number; instrumentId: number; rangeId: number; number: string };
  let open: { jobId: number };

  // Ten settings on 1000–2000 kHz, ±0.5 % of setting; the error at 1500 kHz lies 2 Hz inside the tolerance,
  // so any change of U or of the rule moves its decision.
  const dials = [1000, 1100, 1200, 1300, 1400, 1500, 1600, 1700, 1800, 1900];
  const errorsHz = [120, 310, -80, 450, 900, 7498, 1500, -2200, 640, 15];
  const readings = dials.flatMap((dial, i) => [0, 1, 2].map((rep) => ({ dial, frequency: dial * 1e3 + errorsHz[i]! + (rep - 1) * 0.4 })));

  const text = async (path: string, who: Parameters<AsDemo>[0] = 'lead'): Promise<string> => {
    const res = await t.http
      .get(path)
      .set(as(who))
      .buffer(true)
      .parse((response, done) => {
        let body = '';
        response.setEncoding('utf8');
        response.on('data', (c: string) => (body += c));
        response.on('end', () => done(null, body));
      });
    expect({ path, status: res.status }).toEqual({ path, status: 200 });
    return res.body as string;
  };

  async function calibratedJob(name: string): Promise<{ jobId: number; instrumentId: number; rangeId: number }> {
    const made = await instrumentWithJob(t, as('admin'), { organizationId: customerId, make: name, ranges: [khzRange('Band A 1000–2000 kHz', 1000, 2000)] });
    expect((await t.http.put(`/api/jobs/${made.jobId}/procedure`).set(as('lead')).send({ procedureId: procedure.id })).status).toBe(200);
    const runId = await openRun(t, as('tech'), made.jobId, { rangeId: made.rangeIds[0], kind: 'as_found', standardId: standard.id });
    await postReadings(t, as('tech'), runId, readings);
    return { jobId: made.jobId, instrumentId: made.instrumentId, rangeId: made.rangeIds[0]! };
  }

  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    customerId = (await organizationIds(t, as('admin')))['Saltmarsh Restoration Works']!;
    const created = await t.http.post('/api/procedures').set(as('lead')).send({
      name: 'Frozen-record test procedure',
      method: 'Counter reading at each marked setting, three readings a setting.',
      decisionRule: 'guarded',
      dialHalfDivisionPercentOfSpan: 0.001,
      driftPpm: 0.1,
      driftHz: 0,
      extraComponents: [],
    });
    expect(created.status).toBe(201);
    procedure = created.body;
    const standards = await t.http.get('/api/standards?overdue=false&active=true').set(as('lead'));
    standard = standards.body.items[0];
    const made = await calibratedJob('Frozen Works');
    expect((await t.http.post(`/api/jobs/${made.jobId}/submit`).set(as('tech')).send({})).status).toBe(200);
    const sign = await t.http
      .post(`/api/jobs/${made.jobId}/sign`)
      .set(as('lead'))
      .send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
    expect(sign.status).toBe(200);
    signed = { ...made, number: sign.body.number };
    open = await calibratedJob('Open Works');
  });
  afterAll(async () => {
    await t.close();
  });

  it('should keep the versions it was signed with: procedure, standards (stamped on the runs) and the instrument', async () => {
    const [row] = await t.dataSource.query('SELECT record FROM certificates WHERE number = ?', [signed.number]);
    const record = typeof row.record === 'string' ? JSON.parse(row.record) : row.record;
    expect(record.procedure).toMatchObject({ id: procedure.id, version: 1, decisionRule: 'guarded', driftPpm: 0.1 });
    expect(record.standards).toEqual([
      expect.objectContaining({ id: standard.id, version: standard.version, timebaseAccuracyPpm: standard.timebaseAccuracyPpm }),
    ]);
    expect(record.instrument).toMatchObject({ make: 'Frozen Works', ranges: [expect.objectContaining({ label: 'Band A 1000–2000 kHz' })] });
    expect(record.customer.name).toBe('Saltmarsh Restoration Works');
    const runs = await t.dataSource.query('SELECT standard_version FROM runs WHERE job_id = ?', [signed.jobId]);
    expect(runs.map((r: { standard_version: number }) => Number(r.standard_version))).toEqual([standard.version]);
    const openRuns = await t.dataSource.query('SELECT standard_version FROM runs WHERE job_id = ?', [open.jobId]);
    expect(openRuns.map((r: { standard_version: number | null }) => r.standard_version)).toEqual([null]);
  });

  it('should show the same results, CSV, review, list and public page after every edit, while the open job follows them', async () => {
    const resultsPath = `/api/jobs/${signed.jobId}/results`;
    const csvPath = `/api/jobs/${signed.jobId}/results.csv`;
    const publicPath = `/api/public/certificates/${encodeURIComponent(signed.number)}`;
    const before = {
      results: await text(resultsPath),
      clientResults: await text(resultsPath, 'saltmarsh'),
      csv: await text(csvPath),
      publicPage: (await t.http.get(publicPath)).text,
      review: (await t.http.get(`/api/reviews/${signed.jobId}`).set(as('lead'))).body,
      listed: (await t.http.get(`/api/certificates?jobId=${signed.jobId}`).set(as('saltmarsh'))).body.items[0],
      open: (await t.http.get(`/api/jobs/${open.jobId}/results`).set(as('lead'))).body as JobResults,
    };
    expect(JSON.parse(before.publicPage)).toMatchObject({ customer: 'Saltmarsh Restoration Works', instrument: expect.stringContaining('Frozen Works') });
    expect(before.open.ranges[0]!.points[5]!.asFound!.decision).toBe(before.open.ranges[0]!.points[5]!.asFound!.decision);

    const edits: Array<[string, () => Promise<{ status: number }>]> = [
      [
        'procedure drift allowance and decision rule',
        () => t.http.patch(`/api/procedures/${procedure.id}`).set(as('lead')).send({ driftPpm: 40, decisionRule: 'simple' }),
      ],
      [
        'standard time-base accuracy and due date',
        () => t.http.patch(`/api/standards/${standard.id}`).set(as('lead')).send({ timebaseAccuracyPpm: 2, dueDate: '2031-01-31' }),
      ],
      [
        'instrument make, serial and range label',
        async () => {
          const instrument = (await t.http.get(`/api/instruments/${signed.instrumentId}`).set(as('admin'))).body;
          return t.http
            .patch(`/api/instruments/${signed.instrumentId}`)
            .set(as('admin'))
            .send({
              make: 'Renamed Works',
              serial: 'CHANGED-1',
              ranges: instrument.ranges.map((r: Record<string, unknown>) => ({ ...r, position: undefined, label: 'Band A (relabelled)' })),
            });
        },
      ],
      ['customer name', () => t.http.patch(`/api/organizations/${customerId}`).set(as('admin')).send({ name: 'Saltmarsh Works (renamed)' })],
    ];
    for (const [what, edit] of edits) {
      const res = await edit();
      expect({ what, status: res.status }).toEqual({ what, status: 200 });
    }

    expect(await text(resultsPath)).toBe(before.results);
    expect(await text(resultsPath, 'saltmarsh')).toBe(before.clientResults);
    expect(await text(csvPath)).toBe(before.csv);
    expect((await t.http.get(publicPath)).text).toBe(before.publicPage);
    const review = (await t.http.get(`/api/reviews/${signed.jobId}`).set(as('lead'))).body;
    expect(review.results).toEqual(before.review.results);
    expect(review.job).toEqual(before.review.job);
    expect(
      review.runs.map((r: { rangeLabel: string; standardName: string; standardDueDate: string }) => [r.rangeLabel, r.standardName, r.standardDueDate]),
    ).toEqual(
      before.review.runs.map((r: { rangeLabel: string; standardName: string; standardDueDate: string }) => [r.rangeLabel, r.standardName, r.standardDueDate]),
    );
    const listed = (await t.http.get(`/api/certificates?jobId=${signed.jobId}`).set(as('lead'))).body.items[0];
    expect({ instrument: listed.instrumentLabel, customer: listed.organizationName }).toEqual({
      instrument: before.listed.instrumentLabel,
      customer: before.listed.organizationName,
    });
    expect(listed.instrumentLabel).toContain('Frozen Works');

    // The open job computes with the newest versions: the rule, U and the decision at 1500 kHz all moved.
    const after: JobResults = (await t.http.get(`/api/jobs/${open.jobId}/results`).set(as('lead'))).body;
    expect(before.open.decisionRule).toBe('guarded');
    expect(after.decisionRule).toBe('simple');
    const u = (r: JobResults) => r.ranges[0]!.points[5]!.asFound!.budget!.U;
    expect(u(after)).toBeGreaterThan(u(before.open) * 5);
    expect(before.open.ranges[0]!.points[5]!.asFound!.decision).toBe('conditional_pass');
    expect(after.ranges[0]!.points[5]!.asFound!.decision).toBe('pass');
    expect(after.standards[0]).toMatchObject({ timebaseAccuracyPpm: 2, dueDate: '2031-01-31' });
  });

  it('should make a new version at each edit and keep every version', async () => {
    const p = (await t.http.get(`/api/procedures/${procedure.id}`).set(as('lead'))).body as Procedure;
    expect(p.version).toBe(2);
    const versions = await t.dataSource.query('SELECT version, figures FROM procedure_versions WHERE procedure_id = ? ORDER BY version', [procedure.id]);
    const figures = versions.map((v: { figures: unknown }) => (typeof v.figures === 'string' ? JSON.parse(v.figures) : v.figures));
    expect(figures.map((f: { version: number; driftPpm: number; decisionRule: string }) => [f.version, f.driftPpm, f.decisionRule])).toEqual([
      [1, 0.1, 'guarded'],
      [2, 40, 'simple'],
    ]);
    const s = (await t.http.get(`/api/standards/${standard.id}`).set(as('lead'))).body as ReferenceStandard;
    expect(s.version).toBe(standard.version + 1);
    const sv = await t.dataSource.query('SELECT version FROM standard_versions WHERE standard_id = ? ORDER BY version', [standard.id]);
    expect(sv.map((v: { version: number }) => Number(v.version))).toEqual([...Array(standard.version + 1).keys()].map((i) => i + 1));
    // Making another procedure the default is not a new version of this one.
    expect((await t.http.patch(`/api/procedures/${procedure.id}`).set(as('lead')).send({ isDefault: true })).body.version).toBe(2);
  });

  it('should read live rows again once an amendment reopens the job', async () => {
    const [cert] = await t.dataSource.query("SELECT id FROM certificates WHERE number = ? AND status = 'issued'", [signed.number]);
    const amend = await t.http.post(`/api/certificates/${cert.id}/amend`).set(as('lead')).send({ reason: 'customer renamed', rework: false });
    expect(amend.status).toBe(200);
    const results: JobResults = (await t.http.get(`/api/jobs/${signed.jobId}/results`).set(as('lead'))).body;
    expect(results.decisionRule).toBe('simple');
    const review = (await t.http.get(`/api/reviews/${signed.jobId}`).set(as('lead'))).body;
    expect(review.job.organizationName).toBe('Saltmarsh Works (renamed)');
    expect(review.job.instrumentLabel).toContain('Renamed Works');
    // The superseded revision still says what it said.
    const publicPage = (await t.http.get(`/api/public/certificates/${encodeURIComponent(signed.number)}`)).body;
    expect(publicPage).toMatchObject({ status: 'superseded', customer: 'Saltmarsh Restoration Works' });
    expect(publicPage).not.toHaveProperty('amendmentPending');
  });
});
