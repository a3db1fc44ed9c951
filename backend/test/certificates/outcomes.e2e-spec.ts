// The job's two outcomes (ISO/IEC 17025:2017 7.8.4.1: results before and after adjustment) end to end:
// results, certificate list, the customer's e-mail and the PDF. Every expected figure is worked out here
// by hand from the readings the test posts (closed forms), never taken from the server's answer.
import { PDFParse } from 'pdf-parse';
import type { Certificate, CertificateDetail, JobResults, MailMessageView } from '@kilocycle/common/types';
import { instrumentWithJob, khzRange, openRun, organizationIds, postReadings } from '../support/lab-fixtures.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

type Who = keyof typeof DEMO;

async function pdfPages(data: Buffer): Promise<string[]> {
  const parser = new PDFParse({ data: new Uint8Array(data) });
  try {
    return (await parser.getText()).pages.map((p) => p.text.replace(/\s+/g, ' '));
  } finally {
    await parser.destroy();
  }
}

// Range 1 000–2 000 kHz, tolerance ±0.5 % of setting. Ten settings; as found, three of them are 1 % high
// (twice the tolerance: out of tolerance whatever the rule), the others 0.1 % high; as left, all +200 Hz.
const DIALS = [1000, 1100, 1200, 1300, 1400, 1500, 1600, 1700, 1800, 1900];
const FOUND_OUT = new Set([1000, 1500, 1900]);
const foundError = (dial: number) => dial * 1e3 * (FOUND_OUT.has(dial) ? 0.01 : 0.001);
const LEFT_ERROR = 200;
// Half a dial division of 1.5 kHz (rectangular) through 1 000 Hz/kHz dominates the budget: u = 1 500/√3 Hz,
// U = 2u = 1 732 Hz, stated as 1 700 Hz (two significant digits, GUM 7.2.6). The other lines (time base,
// counter, the standard's calibration, repeatability of ±0.5 Hz) move U by well under 0.1 Hz.
const U_BY_HAND = 2 * (1500 / Math.sqrt(3));
const tolerance = (dial: number) => dial * 1e3 * 0.005;
// TUR = tolerance / U below 4:1 (common practice): 0.005 f < 4 × 1 732 Hz, i.e. f below 1 386 kHz.
const LOW_TUR = DIALS.filter((d) => tolerance(d) / U_BY_HAND < 4);

describe('as-found and as-left outcomes (e2e, MariaDB)', () => {
  let t: TestApp;
  const tokens = {} as Record<Who, string>;
  const as = (who: Who) => ({ Authorization: `Bearer ${tokens[who]}` });
  let jobId: number;
  let certificate: CertificateDetail;

  beforeAll(async () => {
    t = await createTestApp();
    // Northgate on account: its certificates are released at once (the hold until an invoice is paid is test/invoices').
    await t.dataSource.query(
      "REPLACE INTO customer_terms (organization_id, payment_terms, net_days) SELECT id, 'on_account', 30 FROM organizations WHERE name = 'Northgate Radio Club'",
    );
    for (const key of Object.keys(DEMO) as Who[]) tokens[key] = await tokenFor(t.http, DEMO[key]);
  });
  afterAll(async () => {
    await t.close();
  });

  it('should state both outcomes in the results of a job found out of tolerance and adjusted', async () => {
    const orgs = await organizationIds(t, as('lead'));
    const created = await instrumentWithJob(t, as('tech'), {
      organizationId: orgs['Northgate Radio Club']!,
      ranges: [khzRange('Band A 1000–2000 kHz', 1000, 2000)],
    });
    jobId = created.jobId;
    const [standard] = await t.dataSource.query('SELECT id FROM standards WHERE due_date > CURRENT_DATE ORDER BY id LIMIT 1');
    for (const [kind, error] of [
      ['as_found', foundError],
      ['as_left', () => LEFT_ERROR],
    ] as const) {
      const runId = await openRun(t, as('tech'), jobId, { rangeId: created.rangeIds[0], kind, standardId: Number(standard.id) });
      // Two readings ±0.5 Hz about the target: their mean is the target itself.
      await postReadings(
        t,
        as('tech'),
        runId,
        DIALS.flatMap((dial) => [-0.5, 0.5].map((d) => ({ dial, frequency: dial * 1e3 + error(dial) + d }))),
      );
      const budget = await t.http
        .put(`/api/runs/${runId}/budget`)
        .set(as('tech'))
        .send({ dialHalfDivision: 1.5, driftPpm: 0, driftHz: 0, extraComponents: [] });
      expect(budget.status).toBe(200);
    }
    const results: JobResults = (await t.http.get(`/api/jobs/${jobId}/results`).set(as('tech'))).body;
    expect(results.outcomes.asFound).toEqual({
      decision: 'fail',
      settings: 10,
      pass: 7,
      conditionalPass: 0,
      conditionalFail: 0,
      fail: 3,
      outOfTolerance: 3,
      conditional: 0,
      undecided: 0,
      words: 'out of tolerance at 3 of 10 settings',
    });
    expect(results.outcomes.asLeft).toMatchObject({ decision: 'pass', settings: 10, pass: 10, outOfTolerance: 0, words: 'within tolerance' });
    expect(results.outcomes.summary).toBe('As found: out of tolerance at 3 of 10 settings; as left: within tolerance.');
    // The points behind them, as worked out above.
    const points = results.ranges[0]!.points;
    expect(points.map((p) => p.asFound!.decision)).toEqual(DIALS.map((d) => (FOUND_OUT.has(d) ? 'fail' : 'pass')));
    for (const p of points) {
      expect(p.asFound!.errorHz).toBeCloseTo(foundError(p.dial), 6);
      expect(p.asLeft!.budget!.U).toBe(Number(U_BY_HAND.toPrecision(2)));
    }
    expect((await t.http.post(`/api/jobs/${jobId}/submit`).set(as('tech')).send({ comment: 'adjusted; see as-found' })).status).toBe(200);
  });

  it('should keep the as-found outcome on the certificate row, for the lab and the customer', async () => {
    const signed = await t.http
      .post(`/api/jobs/${jobId}/sign`)
      .set(as('lead'))
      .send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
    expect(signed.status).toBe(200);
    certificate = signed.body;
    expect(certificate).toMatchObject({ status: 'issued', decision: 'pass', asFoundDecision: 'fail' });
    expect(certificate.results!.outcomes.summary).toBe('As found: out of tolerance at 3 of 10 settings; as left: within tolerance.');
    for (const who of ['lead', 'northgate'] as const) {
      const list = await t.http.get(`/api/certificates?jobId=${jobId}`).set(as(who));
      expect(list.status).toBe(200);
      expect(list.body.items.map((c: Certificate) => [c.id, c.decision, c.asFoundDecision])).toEqual([[certificate.id, 'pass', 'fail']]);
    }
    const [row] = await t.dataSource.query('SELECT as_found_decision FROM certificates WHERE id = ?', [certificate.id]);
    expect(row.as_found_decision).toBe('fail');
  });

  it('should tell the customer both outcomes, and plainly that it was found out of tolerance', async () => {
    const mails = await t.http.get('/api/mail?kind=certificate_issued').set(as('admin'));
    const summary = mails.body.items.find((m: { subject: string }) => m.subject.includes(certificate.number));
    const mail: MailMessageView = (await t.http.get(`/api/mail/${summary.id}`).set(as('admin'))).body;
    const text = mail.text!.replace(/\s+/g, ' ');
    expect(text).toContain('Results: As found: out of tolerance at 3 of 10 settings; as left: within tolerance.');
    expect(text).toContain(
      'The instrument was found out of tolerance at 3 of 10 settings before adjustment. Please consider the effect on work done with it since its last calibration.',
    );
  });

  it('should print both outcomes on page 1, per setting the as-found and as-left error, U, k and decision, and the low-TUR settings', async () => {
    const res = await t.http
      .get(`/api/certificates/${certificate.id}/pdf`)
      .set(as('northgate'))
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    const pages = await pdfPages(res.body as Buffer);
    expect(pages[0]).toContain('As found (before adjustment) Out of tolerance at 3 of 10 settings');
    expect(pages[0]).toContain('As left (after adjustment) Within tolerance');
    const all = pages.join(' ');
    for (const words of [
      'As found (before adjustment) As left (after adjustment)',
      'Measured (kHz) Error (Hz) U (Hz) k Decision Measured (kHz) Error (Hz) U (Hz) k Decision',
    ]) {
      expect(all).toContain(words);
    }
    const U = '1 700'; // U_BY_HAND to two significant digits
    const grouped = (v: number) =>
      Math.round(v)
        .toString()
        .replace(/\B(?=(\d{3})+$)/g, ' ');
    for (const dial of DIALS) {
      // Errors rounded to U's last digit (hundreds of Hz); frequencies in kHz to a tenth (the same place).
      const found = `${((dial * 1e3 + foundError(dial)) / 1e3).toFixed(1).replace(/\B(?=(\d{3})+\.)/g, ' ')} +${grouped(Math.round(foundError(dial) / 100) * 100)} ${U} 2.00 ${FOUND_OUT.has(dial) ? 'fail' : 'pass'}`;
      const left = `${((dial * 1e3 + LEFT_ERROR) / 1e3).toFixed(1).replace(/\B(?=(\d{3})+\.)/g, ' ')} +${LEFT_ERROR} ${U} 2.00 pass`;
      expect(all).toContain(`${found} ${left}`);
    }
    expect(all).toContain(
      'As found, before adjustment, the instrument was out of tolerance at 3 of 10 settings: Band A 1000–2000 kHz at 1000, 1500, 1900 kHz.',
    );
    // The TUR sentence lists what it announces: range, setting and ratio, as found and as left.
    expect(LOW_TUR).toEqual([1000, 1100, 1200, 1300]);
    const entries = LOW_TUR.map((d) => {
      const tur = (tolerance(d) / U_BY_HAND).toFixed(1);
      return `${d} kHz (${tur}:1 as found, ${tur}:1 as left)`;
    });
    expect(all).toContain(`below 4:1 at ${LOW_TUR.length} settings — range 1, Band A 1000–2000 kHz: ${entries.join('; ')}.`);
    expect(all).not.toContain('1400 kHz (');
    expect(all).not.toContain('reported below');
  });

  it('should derive the outcomes of results stored before they were kept', async () => {
    await t.dataSource.query(
      "UPDATE certificates SET results = JSON_REMOVE(results, '$.outcomes'), record = IF(record IS NULL, NULL, JSON_REMOVE(record, '$.results.outcomes')) WHERE id = ?",
      [certificate.id],
    );
    const [stored] = await t.dataSource.query(
      "SELECT JSON_CONTAINS_PATH(results, 'one', '$.outcomes') AS r, JSON_CONTAINS_PATH(record, 'one', '$.results.outcomes') AS s FROM certificates WHERE id = ?",
      [certificate.id],
    );
    expect([Number(stored.r), Number(stored.s ?? 0)]).toEqual([0, 0]);
    const detail: CertificateDetail = (await t.http.get(`/api/certificates/${certificate.id}`).set(as('northgate'))).body;
    expect(detail.results!.outcomes.summary).toBe('As found: out of tolerance at 3 of 10 settings; as left: within tolerance.');
    expect(detail.results!.outcomes.asFound).toMatchObject({ settings: 10, outOfTolerance: 3 });
    // The signed job's results are read from its stored record too.
    const results: JobResults = (await t.http.get(`/api/jobs/${jobId}/results`).set(as('lead'))).body;
    expect(results.outcomes.summary).toBe('As found: out of tolerance at 3 of 10 settings; as left: within tolerance.');
  });
});
