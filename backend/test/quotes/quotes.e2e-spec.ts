import { parseMessage } from '../../src/mail/read-message.js';
import { ProposedLinesReader } from '../../src/prices/proposed-lines.reader.js';
import { instrumentWithJob, khzRange, openRun, organizationIds, parseChanges } from '../support/lab-fixtures.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

type Line = {
  code: string | null;
  description: string;
  unit: string;
  quantityMilli: number;
  unitPriceMinor: number;
  taxRateBasisPoints: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
};
type QuoteBody = {
  id: number;
  number: string;
  jobId: number;
  status: string;
  organizationName: string;
  taxExempt: boolean;
  taxRegistration: string | null;
  lines: Line[];
  totals: { netMinor: number; taxMinor: number; grossMinor: number; byRate: Array<{ rateBasisPoints: number; netMinor: number; taxMinor: number }> };
  validityDays: number;
  validUntil: string | null;
  sentAt: string | null;
  acceptanceChannel: string | null;
  decisionNote: string | null;
  decidedByName: string | null;
};

describe('quotes (e2e, MariaDB)', () => {
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

  const twoRanges = [khzRange('Band A 1000–2000 kHz', 1000, 2000), khzRange('Band B 2000–4000 kHz', 2000, 4000)];
  const newJob = (organization: string, ranges = twoRanges) => instrumentWithJob(t, as('lead'), { organizationId: orgs[organization]!, ranges });
  const createQuote = async (jobId: number): Promise<QuoteBody> => {
    const res = await t.http.post(`/api/jobs/${jobId}/quote`).set(as('lead'));
    if (res.status !== 201) throw new Error(`quote: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body as QuoteBody;
  };
  const sendQuote = async (id: number): Promise<QuoteBody> => {
    const res = await t.http.post(`/api/quotes/${id}/send`).set(as('lead'));
    if (res.status !== 200) throw new Error(`send: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body as QuoteBody;
  };
  const auditActions = async (id: number) =>
    (
      (await t.dataSource.query("SELECT action FROM audit_events WHERE entity = 'quote' AND entity_id = ? ORDER BY id", [String(id)])) as Array<{
        action: string;
      }>
    ).map((e) => e.action);

  describe('making and pricing a quote', () => {
    it('should propose the list’s lines for the job, priced per line at the customer’s rate', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await createQuote(jobId);
      expect(quote).toMatchObject({ status: 'draft', number: expect.stringMatching(/^Q-\d{6}$/), taxExempt: false, validityDays: 30, validUntil: null });
      expect(quote.number).toBe(`Q-${String(quote.id).padStart(6, '0')}`);
      // The demo list proposes CAL-RNG (85.00 per range) and JOB-ADM (35.00 per job); Saltmarsh pays the 20 % rate.
      //   CAL-RNG 2 ranges × 85.00 = 170.00, tax 34.00;  JOB-ADM 1 × 35.00 = 35.00, tax 7.00
      //   net 205.00, tax 41.00, gross 246.00
      expect(quote.lines.map((l) => [l.code, l.quantityMilli, l.unitPriceMinor, l.netMinor, l.taxMinor, l.grossMinor])).toEqual([
        ['CAL-RNG', 2000, 8500, 17000, 3400, 20400],
        ['JOB-ADM', 1000, 3500, 3500, 700, 4200],
      ]);
      expect(quote.totals).toMatchObject({ netMinor: 20500, taxMinor: 4100, grossMinor: 24600 });
      expect(await auditActions(quote.id)).toEqual(['create']);
      const again = await t.http.post(`/api/jobs/${jobId}/quote`).set(as('lead'));
      expect([again.status, String(again.body.message)]).toEqual([409, expect.stringContaining(`already has quote ${quote.number} (draft)`)]);
    });

    it('should reprice edited lines against a hand-computed example (per-line rounding, halves away from zero)', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await createQuote(jobId);
      const lines = [
        { code: 'CAL-RNG', description: 'Calibration, per range', unit: 'per_range', quantityMilli: 2000, unitPriceMinor: 8500 },
        { code: 'STAB-HR', description: 'Stability study, per hour', unit: 'per_hour', quantityMilli: 1500, unitPriceMinor: 4999 },
        { description: 'Carriage', unit: 'per_job', quantityMilli: 1000, unitPriceMinor: 1234 },
      ];
      const res = await t.http.patch(`/api/quotes/${quote.id}`).set(as('lead')).send({ lines, validityDays: 14, notes: 'Collected by the customer.' });
      expect(res.status).toBe(200);
      // Worked by hand at 20 %:
      //   2 × 85.00  = 170.00            tax 34.00                 gross 204.00
      //   1.5 × 49.99 = 74.985 → 74.99   tax 14.998 → 15.00        gross 89.99
      //   1 × 12.34  = 12.34             tax 2.468 → 2.47          gross 14.81
      //   net 257.33, tax 51.47, gross 308.80 (the sums of the rounded lines)
      const body = res.body as QuoteBody;
      expect(body.lines.map((l) => [l.netMinor, l.taxMinor, l.grossMinor])).toEqual([
        [17000, 3400, 20400],
        [7499, 1500, 8999],
        [1234, 247, 1481],
      ]);
      expect(body.totals).toEqual({ netMinor: 25733, taxMinor: 5147, grossMinor: 30880, byRate: [{ rateBasisPoints: 2000, netMinor: 25733, taxMinor: 5147 }] });
      expect(body).toMatchObject({ validityDays: 14, notes: 'Collected by the customer.' });
      const [row] = await t.dataSource.query('SELECT net_minor, tax_minor, gross_minor FROM quotes WHERE id = ?', [quote.id]);
      expect([Number(row.net_minor), Number(row.tax_minor), Number(row.gross_minor)]).toEqual([25733, 5147, 30880]);
      expect(await auditActions(quote.id)).toEqual(['create', 'update']);
    });

    it('should charge an exempt customer no tax (0 bp) and print its registration number', async () => {
      const { jobId } = await newJob('Fellside Schools Radio Trust', [khzRange('Only band', 1000, 2000)]);
      const quote = await createQuote(jobId);
      // 1 range × 85.00 + 1 × 35.00 = 120.00, no tax.
      expect(quote).toMatchObject({ taxExempt: true, taxRegistration: 'FSRT-40715' });
      expect(quote.lines.map((l) => [l.taxRateBasisPoints, l.taxMinor])).toEqual([
        [0, 0],
        [0, 0],
      ]);
      expect(quote.totals).toMatchObject({ netMinor: 12000, taxMinor: 0, grossMinor: 12000 });
    });

    it('should propose study hours rounded up to the quarter hour, at least one hour', async () => {
      const { jobId, rangeIds } = await newJob('Saltmarsh Restoration Works');
      const item = await t.http
        .post('/api/prices/items')
        .set(as('lead'))
        .send({ code: 'DRIFT-HR', description: 'Drift study, per hour', unit: 'per_hour', unitPriceMinor: 1000, proposeOnQuotes: true });
      expect(item.status).toBe(201);
      try {
        const reader = t.app.get(ProposedLinesReader);
        const hours = async () => (await reader.proposedLines(jobId)).find((l) => l.code === 'DRIFT-HR')!.quantityMilli;
        expect(await hours()).toBe(1000); // no study yet: one hour
        const runId = await openRun(t, as('engineer'), jobId, { rangeId: rangeIds[0], kind: 'warmup' });
        // 1 h 5 min recorded → 1.25 h (the next quarter hour above 65 min is 75 min)
        await t.dataSource.query('UPDATE runs SET started_at = ?, ended_at = ? WHERE id = ?', [
          new Date('2026-01-05T09:00:00Z'),
          new Date('2026-01-05T10:05:00Z'),
          runId,
        ]);
        expect(await hours()).toBe(1250);
      } finally {
        await t.http.patch(`/api/prices/items/${item.body.id}`).set(as('lead')).send({ active: false });
      }
    });

    it('should refuse bad lines with 400 naming the problem, and change nothing', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await createQuote(jobId);
      const line = { description: 'A line', unit: 'per_job', quantityMilli: 1000, unitPriceMinor: 100 };
      const cases: Array<[unknown, string]> = [
        [[{ ...line, unitPriceMinor: -5 }], 'unitPriceMinor must not be negative'],
        [[{ ...line, unitPriceMinor: 12.5 }], 'unitPriceMinor must be a whole number'],
        [[{ ...line, unit: 'per_day' }], 'unit must be one of'],
        [[{ ...line, quantityMilli: 1.5 }], 'quantityMilli must be a whole number'],
        [[{ ...line, quantityMilli: 0 }], 'quantityMilli must be at least 1'],
        [[{ ...line, description: '' }], 'description must not be empty'],
        [Array.from({ length: 201 }, () => line), 'lines must hold at most 200 lines'],
        [[{ ...line, priceItemId: 999_999 }], 'no price item has the id 999999'],
        ['not a list', 'lines must be a list'],
      ];
      for (const [lines, message] of cases) {
        const res = await t.http.patch(`/api/quotes/${quote.id}`).set(as('lead')).send({ lines });
        expect([res.status, String(res.body.message)]).toEqual([400, expect.stringContaining(message)]);
      }
      for (const validityDays of [0, 366, 2.5]) expect((await t.http.patch(`/api/quotes/${quote.id}`).set(as('lead')).send({ validityDays })).status).toBe(400);
      expect(((await t.http.get(`/api/quotes/${quote.id}`).set(as('lead'))).body as QuoteBody).lines).toEqual(quote.lines);
      expect(await auditActions(quote.id)).toEqual(['create']);
    });

    it('should keep technicians, engineers and clients from making, changing and sending quotes', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      for (const who of ['tech', 'engineer', 'saltmarsh'] as const) expect((await t.http.post(`/api/jobs/${jobId}/quote`).set(as(who))).status).toBe(403);
      const quote = await createQuote(jobId);
      for (const who of ['tech', 'engineer', 'saltmarsh'] as const) {
        expect((await t.http.patch(`/api/quotes/${quote.id}`).set(as(who)).send({ notes: 'x' })).status).toBe(403);
        expect((await t.http.post(`/api/quotes/${quote.id}/send`).set(as(who))).status).toBe(403);
      }
      for (const who of ['tech', 'engineer'] as const) {
        expect((await t.http.get(`/api/quotes/${quote.id}`).set(as(who))).status).toBe(200);
        expect((await t.http.post(`/api/quotes/${quote.id}/decline`).set(as(who)).send({})).status).toBe(403);
      }
    });
  });

  describe('sending, and what a client sees', () => {
    it('should store the PDF, mail it to the customer’s contact address with the PDF attached, and lock the lines', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await createQuote(jobId);
      const sent = await sendQuote(quote.id);
      const today = new Date().toISOString().slice(0, 10);
      // valid until: the day sent + 30 days
      const expected = new Date(Date.parse(`${today}T00:00:00Z`) + 30 * 86_400_000).toISOString().slice(0, 10);
      expect(sent).toMatchObject({ status: 'sent', validUntil: expected });
      expect(await auditActions(quote.id)).toEqual(['create', 'send']);

      let raw: string | undefined;
      for (let i = 0; i < 50 && !raw; i += 1) {
        const rows = (await t.dataSource.query("SELECT raw FROM mail_messages WHERE kind = 'quote_sent' AND subject LIKE ?", [
          `Quote ${quote.number} %`,
        ])) as Array<{
          raw: string;
        }>;
        raw = rows[0]?.raw;
        if (!raw) await new Promise((r) => setTimeout(r, 100));
      }
      expect(raw).toBeDefined();
      const mail = await parseMessage(raw!);
      expect(mail.headers.find((h) => h.name.toLowerCase() === 'to')?.value).toContain('workshop@saltmarsh.test');
      expect(mail.text).toContain(`valid until ${expected}`);
      expect(mail.text).toContain('€246.00'); // the gross worked by hand in the first test
      expect(mail.attachments).toHaveLength(1);
      expect(mail.attachments[0]!.filename).toBe(`${quote.number}.pdf`);
      expect(mail.attachments[0]!.body.subarray(0, 5).toString('latin1')).toBe('%PDF-');

      const pdf = await t.http.get(`/api/quotes/${quote.id}/pdf`).set(as('saltmarsh')).buffer(true);
      expect(pdf.status).toBe(200);
      expect(pdf.headers['content-type']).toContain('application/pdf');
      expect(Buffer.compare(Buffer.from(pdf.body as Buffer), mail.attachments[0]!.body)).toBe(0); // the stored copy is the one mailed

      const change = await t.http.patch(`/api/quotes/${quote.id}`).set(as('lead')).send({ notes: 'late' });
      expect([change.status, String(change.body.message)]).toEqual([409, expect.stringContaining('only a draft can change')]);
      expect((await t.http.post(`/api/quotes/${quote.id}/send`).set(as('lead'))).status).toBe(409);
    });

    it('should draw a draft’s PDF for the lab on request', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await createQuote(jobId);
      const pdf = await t.http.get(`/api/quotes/${quote.id}/pdf`).set(as('engineer')).buffer(true);
      expect(pdf.status).toBe(200);
      expect(
        Buffer.from(pdf.body as Buffer)
          .subarray(0, 5)
          .toString('latin1'),
      ).toBe('%PDF-');
    });

    it('should show a client only its own organisation’s quotes once sent, and 404 anything else', async () => {
      const mine = await t.http.get('/api/quotes?pageSize=100').set(as('saltmarsh'));
      expect(mine.status).toBe(200);
      expect(mine.body.total).toBeGreaterThan(0);
      expect(new Set(mine.body.items.map((q: QuoteBody) => q.organizationName))).toEqual(new Set(['Saltmarsh Restoration Works']));
      expect(mine.body.items.some((q: QuoteBody) => q.status === 'draft')).toBe(false);
      const [draft] = await t.dataSource.query("SELECT id FROM quotes WHERE organization_id = ? AND status = 'draft' LIMIT 1", [
        orgs['Saltmarsh Restoration Works'],
      ]);
      expect((await t.http.get(`/api/quotes/${draft.id}`).set(as('saltmarsh'))).status).toBe(404);
      expect((await t.http.get(`/api/quotes/${draft.id}/pdf`).set(as('saltmarsh'))).status).toBe(404);
      const [northgate] = await t.dataSource.query("SELECT id FROM quotes WHERE organization_id = ? AND status = 'sent' LIMIT 1", [
        orgs['Northgate Radio Club'],
      ]);
      for (const path of [`/api/quotes/${northgate.id}`, `/api/quotes/${northgate.id}/pdf`])
        expect((await t.http.get(path).set(as('saltmarsh'))).status).toBe(404);
      expect((await t.http.post(`/api/quotes/${northgate.id}/accept`).set(as('saltmarsh')).send({})).status).toBe(404);
      expect((await t.http.post(`/api/quotes/${northgate.id}/decline`).set(as('saltmarsh')).send({})).status).toBe(404);
      const filtered = await t.http.get(`/api/quotes?organizationId=${orgs['Northgate Radio Club']}`).set(as('saltmarsh'));
      expect(filtered.body.items).toEqual([]);
      const lab = await t.http.get('/api/quotes?status=draft&pageSize=100').set(as('engineer'));
      expect(lab.body.items.length).toBeGreaterThan(0);
      expect(lab.body.items.every((q: QuoteBody) => q.status === 'draft')).toBe(true);
    });
  });

  describe('deciding, and the start gate', () => {
    it('should hold work on a Northgate job until the client accepts its quote in the portal', async () => {
      // The demo's Northgate generator in 'received', with its quote sent.
      const [job] = await t.dataSource.query("SELECT j.id, j.number FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1302'");
      const [row] = await t.dataSource.query("SELECT id, number FROM quotes WHERE job_id = ? AND status = 'sent'", [job.id]);
      const refused = await t.http.patch(`/api/jobs/${job.id}`).set(as('tech')).send({ status: 'in_progress' });
      expect([refused.status, String(refused.body.message)]).toEqual([
        409,
        `job ${job.number}: work on this job waits for the customer to accept quote ${row.number} (sent)`,
      ]);
      const phone = await t.http.post(`/api/quotes/${row.id}/accept`).set(as('northgate')).send({ channel: 'phone' });
      expect([phone.status, String(phone.body.message)]).toEqual([400, expect.stringContaining('channel: a client accepts in the portal')]);
      const accepted = await t.http.post(`/api/quotes/${row.id}/accept`).set(as('northgate')).send({});
      expect(accepted.status).toBe(200);
      expect(accepted.body).toMatchObject({ status: 'accepted', acceptanceChannel: 'portal', decidedByName: 'Nora Quist' });
      expect(await auditActions(row.id)).toEqual(['create', 'send', 'accept']);
      expect((await t.http.post(`/api/quotes/${row.id}/decline`).set(as('northgate')).send({})).status).toBe(409);
      const started = await t.http.patch(`/api/jobs/${job.id}`).set(as('tech')).send({ status: 'in_progress' });
      expect([started.status, started.body.status]).toEqual([200, 'in_progress']);
    });

    it('should refuse to start a job of a customer that requires a quote before one is made', async () => {
      const instrument = await t.http
        .post('/api/instruments')
        .set(as('lead'))
        .send({
          organizationId: orgs['Northgate Radio Club'],
          make: 'Test Works',
          model: 'Gate oscillator',
          serial: `G-${process.pid}`,
          ranges: [khzRange('Main', 1000, 2000)],
        });
      const job = await t.http.post('/api/jobs').set(as('lead')).send({ instrumentId: instrument.body.id, receivedDate: '2026-02-01' });
      const refused = await t.http.patch(`/api/jobs/${job.body.id}`).set(as('tech')).send({ status: 'in_progress' });
      expect([refused.status, String(refused.body.message)]).toEqual([409, expect.stringContaining('waits for a quote')]);
      // Opening a run starts work too: the same gate.
      const run = await t.http.post(`/api/jobs/${job.body.id}/runs`).set(as('engineer')).send({ rangeId: instrument.body.ranges[0].id, kind: 'warmup' });
      expect(run.status).toBe(409);
      // A customer without the term is never held (Saltmarsh: a fresh job starts at once, no quote at all).
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      expect((await t.http.patch(`/api/jobs/${jobId}`).set(as('tech')).send({ status: 'in_progress' })).status).toBe(200);
    });

    it('should let the lead record an acceptance by phone only with a note', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await sendQuote((await createQuote(jobId)).id);
      const cases: Array<[Record<string, unknown>, string]> = [
        [{ channel: 'phone' }, 'note: say who accepted and how'],
        [{ channel: 'phone', note: '  ' }, 'note: say who accepted and how'],
        [{ note: 'Sam Pryce, by phone' }, 'channel: say how the customer accepted'],
        [{ channel: 'portal', note: 'Sam Pryce' }, 'channel: say how the customer accepted'],
        [{ channel: 'fax', note: 'Sam Pryce' }, 'channel must be one of'],
      ];
      for (const [body, message] of cases) {
        const res = await t.http.post(`/api/quotes/${quote.id}/accept`).set(as('lead')).send(body);
        expect([res.status, String(res.body.message)]).toEqual([400, expect.stringContaining(message)]);
      }
      const ok = await t.http.post(`/api/quotes/${quote.id}/accept`).set(as('lead')).send({ channel: 'phone', note: 'Sam Pryce by phone, 14:20' });
      expect(ok.status).toBe(200);
      expect(ok.body).toMatchObject({
        status: 'accepted',
        acceptanceChannel: 'phone',
        decisionNote: 'Sam Pryce by phone, 14:20',
        decidedByName: 'Lena Brandt',
      });
      const [event] = await t.dataSource.query("SELECT changes FROM audit_events WHERE entity = 'quote' AND entity_id = ? AND action = 'accept'", [
        String(quote.id),
      ]);
      expect(parseChanges(event.changes)).toEqual({ channel: 'phone', note: 'Sam Pryce by phone, 14:20' });
      const { jobId: other } = await newJob('Saltmarsh Restoration Works');
      const draft = await createQuote(other);
      const early = await t.http.post(`/api/quotes/${draft.id}/accept`).set(as('lead')).send({ channel: 'phone', note: 'too early' });
      expect([early.status, String(early.body.message)]).toEqual([409, expect.stringContaining('must be sent before it can be accepted')]);
    });

    it('should let the client decline with a note, after which it cannot be accepted', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await sendQuote((await createQuote(jobId)).id);
      const declined = await t.http.post(`/api/quotes/${quote.id}/decline`).set(as('saltmarsh')).send({ note: 'We will send it next spring.' });
      expect(declined.status).toBe(200);
      expect(declined.body).toMatchObject({
        status: 'declined',
        acceptanceChannel: null,
        decisionNote: 'We will send it next spring.',
        decidedByName: 'Sam Pryce',
      });
      const late = await t.http.post(`/api/quotes/${quote.id}/accept`).set(as('saltmarsh')).send({});
      expect([late.status, String(late.body.message)]).toEqual([409, expect.stringContaining('already declined')]);
      // A declined quote leaves room for a new one on the job.
      expect((await t.http.post(`/api/jobs/${jobId}/quote`).set(as('lead'))).status).toBe(201);
    });

    it('should read a sent quote past its validity as expired, store it so when touched, and refuse to accept it (409)', async () => {
      const { jobId } = await newJob('Saltmarsh Restoration Works');
      const quote = await sendQuote((await createQuote(jobId)).id);
      await t.dataSource.query('UPDATE quotes SET valid_until = DATE_SUB(UTC_DATE(), INTERVAL 1 DAY) WHERE id = ?', [quote.id]);
      const read = await t.http.get(`/api/quotes/${quote.id}`).set(as('saltmarsh'));
      expect(read.body.status).toBe('expired');
      expect((await t.http.get('/api/quotes?status=expired&pageSize=100').set(as('lead'))).body.items.map((q: QuoteBody) => q.id)).toContain(quote.id);
      expect((await t.http.get('/api/quotes?status=sent&pageSize=100').set(as('lead'))).body.items.map((q: QuoteBody) => q.id)).not.toContain(quote.id);
      const accept = await t.http.post(`/api/quotes/${quote.id}/accept`).set(as('saltmarsh')).send({});
      expect([accept.status, String(accept.body.message)]).toEqual([409, expect.stringContaining(`quote ${quote.number} expired`)]);
      const [row] = await t.dataSource.query('SELECT status FROM quotes WHERE id = ?', [quote.id]);
      expect(row.status).toBe('expired');
      expect(await auditActions(quote.id)).toEqual(['create', 'send', 'expire']);
      expect((await t.http.post(`/api/quotes/${quote.id}/accept`).set(as('lead')).send({ channel: 'phone', note: 'late call' })).status).toBe(409);
      // An expired quote leaves room for a new one on the job.
      expect((await t.http.post(`/api/jobs/${jobId}/quote`).set(as('lead'))).status).toBe(201);
    });
  });

  describe('the demo', () => {
    it('holds quotes in every state, and an accepted one on the issued Northgate job', async () => {
      const rows = (await t.dataSource.query('SELECT DISTINCT status FROM quotes')) as Array<{ status: string }>;
      expect(rows.map((r) => r.status).sort()).toEqual(expect.arrayContaining(['accepted', 'declined', 'draft', 'expired', 'sent']));
      const [issued] = await t.dataSource.query("SELECT id FROM jobs WHERE status = 'issued' AND organization_id = ?", [orgs['Northgate Radio Club']]);
      const list = await t.http.get(`/api/quotes?jobId=${issued.id}`).set(as('northgate'));
      expect(list.body.items.map((q: QuoteBody) => q.status)).toEqual(['accepted']);
    });
  });
});
