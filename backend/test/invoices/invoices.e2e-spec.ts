import Papa from 'papaparse';
import { PDFParse } from 'pdf-parse';
import type { CreditNote, Invoice, MailMessageView, Statement } from '@kilocycle/common/types';
import { InvoiceLedger } from '../../src/invoices/invoice-ledger.writer.js';
import { PayableInvoiceReader } from '../../src/invoices/payable-invoice.reader.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

async function pdfText(data: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(data) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, ' ');
  } finally {
    await parser.destroy();
  }
}

/** YYYY-MM-DD of today + days (UTC calendar days). */
function dayFromToday(days: number): string {
  const now = new Date();
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + days)).toISOString().slice(0, 10);
}

const pad = (n: number) => String(n).padStart(6, '0');

describe('invoices (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let northgate: number;
  let rateId: number;

  const one = async <T = Record<string, unknown>>(sql: string, params: unknown[] = []): Promise<T> => ((await t.dataSource.query(sql, params)) as T[])[0]!;
  const binary = (req: import('supertest').Test) =>
    req.buffer(true).parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (c: Buffer) => chunks.push(c));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });
  const ledger = () => t.app.get(InvoiceLedger);
  const pay = (invoiceId: number, amount: number, currency = 'EUR') =>
    t.dataSource.transaction((manager) => ledger().recordPayment(invoiceId, amount, currency, manager));

  /** A new issued job of an organisation's first instrument (a visit signed before billing existed). */
  async function issuedJob(organizationId: number, n: number): Promise<number> {
    const { id: instrumentId } = await one<{ id: number }>('SELECT id FROM instruments WHERE organization_id = ? ORDER BY id LIMIT 1', [organizationId]);
    const result = await t.dataSource.query(
      "INSERT INTO jobs (number, instrument_id, organization_id, status, received_date) VALUES (?, ?, ?, 'issued', CURRENT_DATE())",
      [`JT-${organizationId}-${n}`, instrumentId, organizationId],
    );
    return Number(result.insertId);
  }
  async function draftFor(jobId: number, lines: unknown[]): Promise<Invoice> {
    const made = await t.http.post(`/api/jobs/${jobId}/invoice`).set(as('lead'));
    expect(made.status).toBe(201);
    const edited = await t.http.patch(`/api/invoices/${made.body.id}`).set(as('lead')).send({ lines });
    expect(edited.status).toBe(200);
    return edited.body;
  }

  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    northgate = Number((await one<{ id: number }>("SELECT id FROM organizations WHERE name = 'Northgate Radio Club'")).id);
    // The customer's terms, as the lead would set them in the price list: 20 % tax, pay before release, net 14 days.
    rateId = Number((await t.dataSource.query("INSERT INTO tax_rates (name, rate_basis_points) VALUES ('Invoice test rate', 2000)")).insertId);
    await t.dataSource.query(
      "REPLACE INTO customer_terms (organization_id, tax_rate_id, payment_terms, net_days, requires_quote) VALUES (?, ?, 'pay_before_release', 14, 0)",
      [northgate, rateId],
    );
  });
  afterAll(async () => {
    await t?.close();
  });

  describe('the path: signed → draft from the accepted quote → edited → issued → held → paid → released', () => {
    let jobId: number;
    let invoice: Invoice;
    let certificateId: number;

    it('makes the draft from the accepted quote when the lead signs the job, hidden from the client', async () => {
      ({ id: jobId } = await one<{ id: number }>("SELECT j.id FROM jobs j JOIN instruments i ON i.id = j.instrument_id WHERE i.serial = 'N-1041'"));
      // The customer accepted a quote for this job (written as the quotes module stores one).
      const lead = await one<{ id: number }>("SELECT id FROM users WHERE email = 'lead@kilocycle.test'");
      const quoteId = Number(
        (
          await t.dataSource.query(
            "INSERT INTO quotes (number, job_id, organization_id, status, currency, validity_days, created_by) VALUES ('Q-T00001', ?, ?, 'accepted', 'EUR', 30, ?)",
            [jobId, northgate, lead.id],
          )
        ).insertId,
      );
      await t.dataSource.query(
        "INSERT INTO quote_lines (quote_id, position, code, description, unit, quantity_milli, unit_price_minor, tax_rate_basis_points, net_minor, tax_minor, gross_minor) VALUES (?, 1, 'CAL-RNG', 'Dial calibration, per range', 'per_range', 2000, 4500, 2000, 9000, 1800, 10800)",
        [quoteId],
      );
      const signed = await t.http
        .post(`/api/jobs/${jobId}/sign`)
        .set(as('lead'))
        .send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
      expect(signed.status).toBe(200);
      certificateId = signed.body.id;
      const list = await t.http.get(`/api/invoices?jobId=${jobId}`).set(as('lead'));
      expect(list.body.total).toBe(1);
      invoice = list.body.items[0];
      // 2 ranges × €45.00 = €90.00 net, 20 % tax €18.00, €108.00 gross.
      expect(invoice).toMatchObject({ status: 'draft', number: null, quoteId, taxExempt: false, paymentTerms: 'pay_before_release' });
      expect(invoice.lines).toEqual([
        expect.objectContaining({ code: 'CAL-RNG', quantityMilli: 2000, unitPriceMinor: 4500, netMinor: 9000, taxMinor: 1800, grossMinor: 10800 }),
      ]);
      expect((await t.http.get(`/api/invoices?jobId=${jobId}`).set(as('northgate'))).body.total).toBe(0);
      expect((await t.http.get(`/api/invoices/${invoice.id}`).set(as('northgate'))).status).toBe(404);
      // A draft holds the certificate with the words of the release rule.
      const held = await t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('northgate'));
      expect(held.status).toBe(403);
      expect(held.body.message).toMatch(/preparing the invoice/);
    });

    it('lets the lead change the draft lines, priced per line (rounding halves away from zero)', async () => {
      // By hand, at 20 %:
      //   3 ranges × €49.99 = €149.97 net; tax 29.994 → €29.99; gross €179.96
      //   1.5 h × €49.99 = 74.985 → €74.99 net; tax 14.998 → €15.00; gross €89.99
      //   totals: net €224.96, tax €44.99, gross €269.95
      const res = await t.http
        .patch(`/api/invoices/${invoice.id}`)
        .set(as('lead'))
        .send({
          lines: [
            { code: 'CAL-RNG', description: 'Dial calibration, per range', unit: 'per_range', quantityMilli: 3000, unitPriceMinor: 4999 },
            { code: 'STAB-H', description: 'Stability study, per hour', unit: 'per_hour', quantityMilli: 1500, unitPriceMinor: 4999 },
          ],
        });
      expect(res.status).toBe(200);
      expect(res.body.lines.map((l: Invoice['lines'][number]) => [l.netMinor, l.taxMinor, l.grossMinor])).toEqual([
        [14997, 2999, 17996],
        [7499, 1500, 8999],
      ]);
      expect(res.body.totals).toMatchObject({ netMinor: 22496, taxMinor: 4499, grossMinor: 26995 });
      expect(res.body.balanceMinor).toBe(26995);
    });

    it('issues it: the next number, due date from the terms, the PDF stored and mailed to the customer', async () => {
      const { n } = await one<{ n: number }>('SELECT COUNT(*) AS n FROM invoices WHERE number IS NOT NULL');
      const res = await t.http.post(`/api/invoices/${invoice.id}/issue`).set(as('lead'));
      expect(res.status).toBe(200);
      invoice = res.body;
      expect(invoice).toMatchObject({ number: `INV-${pad(Number(n) + 1)}`, status: 'issued', dueDate: dayFromToday(14), balanceMinor: 26995, overdue: false });
      const pdf = await binary(t.http.get(`/api/invoices/${invoice.id}/pdf`).set(as('northgate')));
      expect(pdf.status).toBe(200);
      const text = await pdfText(pdf.body as Buffer);
      for (const words of [invoice.number!, 'Northgate Radio Club', '€269.95', '€44.99', dayFromToday(14), 'Page 1 of 1']) expect(text).toContain(words);
      const mails = await t.http.get('/api/mail?kind=invoice_issued').set(as('admin'));
      const mail = mails.body.items.find((m: { subject: string }) => m.subject.includes(invoice.number!));
      expect(mail.to).toEqual(['secretary@northgate.test']);
      const detail: MailMessageView = (await t.http.get(`/api/mail/${mail.id}`).set(as('admin'))).body;
      expect(detail.attachments).toEqual([{ filename: `${invoice.number}.pdf`, contentType: 'application/pdf', size: (pdf.body as Buffer).length }]);
      const audit = await one<{ n: number }>("SELECT COUNT(*) AS n FROM audit_events WHERE entity = 'invoice' AND entity_id = ? AND action = 'issue'", [
        String(invoice.id),
      ]);
      expect(Number(audit.n)).toBe(1);
    });

    it('refuses every change of the issued invoice (409) and a second issue', async () => {
      const patch = await t.http.patch(`/api/invoices/${invoice.id}`).set(as('lead')).send({ lines: [] });
      expect(patch.status).toBe(409);
      expect(patch.body.message).toBe('an issued invoice cannot change; raise a credit note');
      expect((await t.http.post(`/api/invoices/${invoice.id}/issue`).set(as('lead'))).status).toBe(409);
      expect((await t.http.post(`/api/jobs/${jobId}/invoice`).set(as('lead'))).status).toBe(409);
    });

    it("shows the client its invoice, never another organisation's, and holds the certificate with the reason", async () => {
      expect((await t.http.get(`/api/invoices/${invoice.id}`).set(as('northgate'))).status).toBe(200);
      expect((await t.http.get(`/api/invoices/${invoice.id}`).set(as('saltmarsh'))).status).toBe(404);
      expect((await t.http.get(`/api/invoices/${invoice.id}/pdf`).set(as('saltmarsh'))).status).toBe(404);
      const held = await t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('northgate'));
      expect(held.status).toBe(403);
      expect(held.body.message).toBe(`Held until invoice ${invoice.number} is paid: it is not paid yet.`);
      const listed = await t.http.get(`/api/certificates?jobId=${jobId}`).set(as('northgate'));
      expect(listed.body.items[0].release).toEqual({ released: false, heldReason: held.body.message, invoiceId: invoice.id });
      // Staff and public verification are never held.
      expect((await binary(t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('lead')))).status).toBe(200);
      expect((await t.http.get(`/api/public/certificates/${listed.body.items[0].number}`)).status).toBe(200);
      // What the payments module reads: the balance to pay, and 404 for the other customer.
      const payable = await t.app.get(PayableInvoiceReader).payable(invoice.id, { role: 'client', organizationId: northgate });
      expect(payable).toEqual({ id: invoice.id, number: invoice.number, organizationId: northgate, currency: 'EUR', balanceMinor: 26995, status: 'issued' });
      await expect(t.app.get(PayableInvoiceReader).payable(invoice.id, { role: 'client', organizationId: northgate + 1 })).rejects.toMatchObject({
        status: 404,
      });
    });

    it('releases the certificate once the ledger records the payment', async () => {
      await expect(pay(invoice.id, 100, 'USD')).rejects.toMatchObject({ status: 409 });
      const part = await pay(invoice.id, 10000);
      expect(part).toMatchObject({ status: 'part_paid', balanceMinor: 16995 });
      expect((await t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('northgate'))).status).toBe(403);
      expect(await pay(invoice.id, 16995)).toMatchObject({ status: 'paid', balanceMinor: 0 });
      const released = await binary(t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('northgate')));
      expect(released.status).toBe(200);
      await expect(t.app.get(PayableInvoiceReader).payable(invoice.id, { role: 'client', organizationId: northgate })).rejects.toMatchObject({ status: 409 });
    });

    it('raises credit notes split in the invoice’s tax proportion, and refunds through the ledger', async () => {
      // By hand: invoice net 22496, tax 4499, gross 26995. A credit of €50.00:
      //   tax = round(4499 × 5000 / 26995) = round(833.30…) = 833; net = 5000 − 833 = 4167.
      const { n } = await one<{ n: number }>('SELECT COUNT(*) AS n FROM credit_notes');
      const res = await t.http
        .post(`/api/invoices/${invoice.id}/credit-notes`)
        .set(as('lead'))
        .send({ amountMinor: 5000, reason: 'Goodwill: delivery delayed' });
      expect(res.status).toBe(201);
      const note: CreditNote = res.body;
      expect(note).toMatchObject({
        number: `CN-${pad(Number(n) + 1)}`,
        netMinor: 4167,
        taxMinor: 833,
        grossMinor: 5000,
        invoiceNumber: invoice.number,
        issuedByName: 'Lena Brandt',
      });
      const after: Invoice = (await t.http.get(`/api/invoices/${invoice.id}`).set(as('northgate'))).body;
      // Paid 26995, credited 5000: the customer is 5000 in credit; the invoice stays paid.
      expect(after).toMatchObject({ status: 'paid', creditedMinor: 5000, balanceMinor: -5000 });
      const pdf = await binary(t.http.get(`/api/credit-notes/${note.id}/pdf`).set(as('northgate')));
      expect(pdf.status).toBe(200);
      expect(await pdfText(pdf.body as Buffer)).toContain('€41.67');
      expect((await t.http.get(`/api/credit-notes/${note.id}/pdf`).set(as('saltmarsh'))).status).toBe(404);
      // More than is left to credit (26995 − 5000 = 21995): refused, nothing written.
      const over = await t.http.post(`/api/invoices/${invoice.id}/credit-notes`).set(as('lead')).send({ amountMinor: 21996, reason: 'Too much' });
      expect(over.status).toBe(422);
      expect(over.body.message).toMatch(/more than the 21995 left/);
      // A card refund of €20.00: refunded and credited both move, the balance stays.
      const refund = await t.dataSource.transaction((m) => ledger().recordRefund(invoice.id, 2000, 'Part refund by card', null, m));
      expect(refund).toMatchObject({ number: `CN-${pad(Number(n) + 2)}`, grossMinor: 2000, taxMinor: 333, netMinor: 1667 }); // round(4499 × 2000 / 26995) = round(333.32) = 333
      const refunded: Invoice = (await t.http.get(`/api/invoices/${invoice.id}`).set(as('lead'))).body;
      expect(refunded).toMatchObject({ paidMinor: 26995, refundedMinor: 2000, creditedMinor: 7000, balanceMinor: -5000, status: 'paid' });
      await expect(t.dataSource.transaction((m) => ledger().recordRefund(invoice.id, 30000, 'Too much', null, m))).rejects.toMatchObject({ status: 409 });
    });
  });

  it('gives invoices issued at the same moment consecutive numbers, none repeated, none skipped', async () => {
    const drafts: Invoice[] = [];
    for (let i = 0; i < 6; i += 1) {
      drafts.push(await draftFor(await issuedJob(northgate, i), [{ description: `Job ${i}`, unit: 'per_job', quantityMilli: 1000, unitPriceMinor: 1000 + i }]));
    }
    const { next_value: before } = await one<{ next_value: number }>("SELECT next_value FROM document_sequences WHERE name = 'invoice'");
    const results = await Promise.all(drafts.map((d) => t.http.post(`/api/invoices/${d.id}/issue`).set(as('lead'))));
    expect(results.map((r) => r.status)).toEqual(drafts.map(() => 200));
    const numbers = results.map((r) => r.body.number as string).sort();
    expect(numbers).toEqual(drafts.map((_, i) => `INV-${pad(Number(before) + i)}`));
    const stored = await t.dataSource.query('SELECT number FROM invoices WHERE number IS NOT NULL ORDER BY number');
    const all = stored.map((r: { number: string }) => Number(r.number.slice(4)));
    expect(all).toEqual(all.map((_: number, i: number) => i + 1));
  });

  it('never shows a draft to a client', async () => {
    const saltmarsh = Number((await one<{ id: number }>("SELECT id FROM organizations WHERE name = 'Saltmarsh Restoration Works'")).id);
    const { id: draftId } = await one<{ id: number }>("SELECT id FROM invoices WHERE organization_id = ? AND status = 'draft' LIMIT 1", [saltmarsh]);
    const list = await t.http.get('/api/invoices?pageSize=500').set(as('saltmarsh'));
    expect(list.status).toBe(200);
    expect(list.body.items.length).toBeGreaterThan(0);
    expect(list.body.items.every((i: Invoice) => i.status !== 'draft' && i.organizationId === saltmarsh)).toBe(true);
    expect((await t.http.get(`/api/invoices/${draftId}`).set(as('saltmarsh'))).status).toBe(404);
    expect((await t.http.get(`/api/invoices?status=draft`).set(as('saltmarsh'))).body.total).toBe(0);
    expect((await t.http.get(`/api/invoices/${draftId}`).set(as('lead'))).body.status).toBe('draft');
  });

  describe('statement, export and reminders of a customer of its own', () => {
    let org: number;
    let first: Invoice;
    let second: Invoice;

    beforeAll(async () => {
      org = Number(
        (
          await t.dataSource.query(
            "INSERT INTO organizations (name, kind, contact_email) VALUES ('Harbour Light Society', 'customer', 'accounts@harbour.test')",
          )
        ).insertId,
      );
      await t.dataSource.query('INSERT INTO instruments (organization_id, make, model, serial) VALUES (?, ?, ?, ?)', [
        org,
        'Plainfield',
        'Signal source',
        'HL-1',
      ]);
      await t.dataSource.query("INSERT INTO customer_terms (organization_id, tax_rate_id, payment_terms, net_days) VALUES (?, ?, 'on_account', 30)", [
        org,
        rateId,
      ]);
      first = await draftFor(await issuedJob(org, 1), [{ description: 'Calibration', unit: 'per_job', quantityMilli: 1000, unitPriceMinor: 10000 }]);
      second = await draftFor(await issuedJob(org, 2), [{ description: 'Calibration', unit: 'per_job', quantityMilli: 1000, unitPriceMinor: 5000 }]);
      first = (await t.http.post(`/api/invoices/${first.id}/issue`).set(as('lead'))).body;
      second = (await t.http.post(`/api/invoices/${second.id}/issue`).set(as('lead'))).body;
      await pay(first.id, 12000);
      expect(
        (await t.http.post(`/api/invoices/${second.id}/credit-notes`).set(as('admin')).send({ amountMinor: 1000, reason: 'Adapter not needed' })).status,
      ).toBe(201);
      // The second fell due yesterday.
      await t.dataSource.query('UPDATE invoices SET due_date = ? WHERE id = ?', [dayFromToday(-1), second.id]);
    });

    it('sums the statement as worked by hand, with a running balance', async () => {
      // By hand, at 20 %: invoice 1 €100.00 + €20.00 = €120.00, paid in full; invoice 2 €50.00 + €10.00 = €60.00,
      // credited €10.00 (tax round(1000 × 1000 / 6000) = 167, net 833), €50.00 open and past due.
      const res = await t.http.get(`/api/organizations/${org}/statement`).set(as('lead'));
      expect(res.status).toBe(200);
      const s: Statement = res.body;
      expect(s).toMatchObject({
        organizationName: 'Harbour Light Society',
        currency: 'EUR',
        openMinor: 5000,
        overdueMinor: 5000,
        paidMinor: 12000,
        creditMinor: 1000,
      });
      expect(s.lines.map((l) => [l.kind, l.amountMinor, l.balanceMinor])).toEqual([
        ['invoice', 12000, 12000],
        ['invoice', 6000, 18000],
        ['payment', -12000, 6000],
        ['credit_note', -1000, 5000],
      ]);
      expect(s.invoices.map((i) => i.number)).toEqual([first.number, second.number]);
      expect((await t.http.get(`/api/organizations/${org}/statement`).set(as('northgate'))).status).toBe(404);
      expect((await t.http.get(`/api/organizations/${northgate}/statement`).set(as('northgate'))).status).toBe(200);
      const overdue = await t.http.get(`/api/invoices?organizationId=${org}&overdue=true`).set(as('lead'));
      expect(overdue.body.items.map((i: Invoice) => i.id)).toEqual([second.id]);
    });

    it('exports invoices, payments and credit notes for the bookkeeper', async () => {
      const res = await t.http.get(`/api/invoices/export.csv?from=${dayFromToday(0)}&to=${dayFromToday(0)}`).set(as('lead'));
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toContain('text/csv');
      const rows = Papa.parse<Record<string, string>>(res.text, { header: true, skipEmptyLines: true }).data.filter(
        (r) => r.customer === 'Harbour Light Society',
      );
      expect(rows.map((r) => [r.type, r.document, r.invoice, r.net, r.tax, r.gross])).toEqual([
        ['invoice', first.number, first.number, '100.00', '20.00', '120.00'],
        ['invoice', second.number, second.number, '50.00', '10.00', '60.00'],
        ['payment', expect.stringMatching(/^payment /), first.number, '', '', '120.00'],
        ['credit_note', expect.stringMatching(/^CN-/), second.number, '8.33', '1.67', '10.00'],
      ]);
      const none = await t.http.get(`/api/invoices/export.csv?from=2001-01-01&to=2001-12-31`).set(as('admin'));
      expect(none.text.trim().split('\r\n')).toHaveLength(1);
      expect((await t.http.get('/api/invoices/export.csv').set(as('northgate'))).status).toBe(403);
      expect((await t.http.get('/api/invoices/export.csv?from=2024-02-30').set(as('lead'))).status).toBe(400);
    });

    it('mails an overdue invoice once, and again only after a week', async () => {
      const run = async () => (await t.http.post('/api/invoices/overdue-reminders/run').set(as('lead'))).body as { invoiceIds: number[] };
      const sent = async () =>
        ((await t.http.get('/api/mail?kind=invoice_overdue&pageSize=500').set(as('admin'))).body.items as Array<{ subject: string; to: string[] }>).filter(
          (m) => m.subject.includes(second.number!),
        );
      expect((await run()).invoiceIds).toContain(second.id);
      expect((await run()).invoiceIds).not.toContain(second.id);
      expect(await sent()).toHaveLength(1);
      expect((await sent())[0]!.to).toEqual(['accounts@harbour.test']);
      expect((await run()).invoiceIds).not.toContain(first.id);
      await t.dataSource.query('UPDATE invoices SET reminded_at = DATE_SUB(reminded_at, INTERVAL 7 DAY) WHERE id = ?', [second.id]);
      expect((await run()).invoiceIds).toContain(second.id);
      expect(await sent()).toHaveLength(2);
      expect((await t.http.post('/api/invoices/overdue-reminders/run').set(as('tech'))).status).toBe(403);
    });
  });

  it('answers bad input with a 4xx naming the problem', async () => {
    const [{ id }] = await t.dataSource.query("SELECT id FROM invoices WHERE status = 'draft' LIMIT 1");
    const line = { description: 'x', unit: 'per_job', quantityMilli: 1000, unitPriceMinor: 100 };
    const cases: Array<[string, () => import('supertest').Test, number, RegExp]> = [
      [
        'negative quantity',
        () =>
          t.http
            .patch(`/api/invoices/${id}`)
            .set(as('lead'))
            .send({ lines: [{ ...line, quantityMilli: -1 }] }),
        400,
        /quantityMilli/,
      ],
      [
        'fractional price',
        () =>
          t.http
            .patch(`/api/invoices/${id}`)
            .set(as('lead'))
            .send({ lines: [{ ...line, unitPriceMinor: 1.5 }] }),
        400,
        /unitPriceMinor/,
      ],
      [
        'unknown unit',
        () =>
          t.http
            .patch(`/api/invoices/${id}`)
            .set(as('lead'))
            .send({ lines: [{ ...line, unit: 'per_week' }] }),
        400,
        /unit must be/,
      ],
      ['no lines', () => t.http.patch(`/api/invoices/${id}`).set(as('lead')).send({}), 400, /lines/],
      ['zero credit', () => t.http.post(`/api/invoices/${id}/credit-notes`).set(as('lead')).send({ amountMinor: 0, reason: 'none' }), 400, /amountMinor/],
      ['credit on a draft', () => t.http.post(`/api/invoices/${id}/credit-notes`).set(as('lead')).send({ amountMinor: 10, reason: 'a draft' }), 409, /draft/],
      ['id in hex', () => t.http.get('/api/invoices/0x10').set(as('lead')), 400, /id must be a whole number/],
      ['bad status filter', () => t.http.get('/api/invoices?status=late').set(as('lead')), 400, /status must be one of/],
      ['missing invoice', () => t.http.get('/api/invoices/999999').set(as('lead')), 404, /not found/],
      ['invoice for a job not issued', () => t.http.post(`/api/jobs/${0 + 1}/invoice`).set(as('lead')), 409, /./],
    ];
    const problems: string[] = [];
    for (const [name, send, status, message] of cases) {
      const res = await send();
      if (res.status !== status || !message.test(JSON.stringify(res.body.message))) problems.push(`${name}: ${res.status} ${JSON.stringify(res.body.message)}`);
    }
    expect(problems).toEqual([]);
  });
});
