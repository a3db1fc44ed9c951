import type { Certificate, Invoice, ListResponse, PayInvoiceResponse, Quote } from '@kilocycle/common/types';
import { PaymentGateway } from '../../src/payments/payment-gateway.js';
import { binary } from '../support/binary-body.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// The commercial path end to end through the API, against MariaDB and the payment service fake reached through
// the `stripe` SDK: Northgate (pay before release, a quote required) accepts a quote and work may start; the lead
// signs a job whose quote was accepted, which drafts the invoice from the quote's lines; the lead issues it; the
// client pays by card on the service's page; the signed webhook books it; the certificate is released.
describe('quote → accept → certificate → invoice → pay → release (e2e, MariaDB, the payment fake)', () => {
  let t: TestApp;
  let as: AsDemo;

  beforeAll(async () => {
    t = await createTestApp();
    await t.app.listen(0, '127.0.0.1'); // the fake delivers its webhooks here
    as = await signInDemo(t.http);
  }, 120_000);

  afterAll(async () => {
    await t?.close();
  });

  it('should let work start only once the client has accepted the quote', async () => {
    const sent = ((await t.http.get('/api/quotes?status=sent').set(as('northgate'))).body as ListResponse<Quote>).items[0]!;
    const early = await t.http.patch(`/api/jobs/${sent.jobId}`).set(as('tech')).send({ status: 'in_progress' });
    expect(early.status).toBe(409);
    expect(early.body.message).toContain(sent.number);
    const accepted = await t.http.post(`/api/quotes/${sent.id}/accept`).set(as('northgate')).send({});
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ status: 'accepted', acceptanceChannel: 'portal' });
    const started = await t.http.patch(`/api/jobs/${sent.jobId}`).set(as('tech')).send({ status: 'in_progress' });
    expect(started.status).toBe(200);
  });

  it('should draft the invoice from the accepted quote at signing, hold the certificate until the card payment, then release it', async () => {
    const jobs = (await t.http.get('/api/jobs?status=in_review').set(as('lead'))).body as ListResponse<{ id: number; organizationName: string }>;
    const job = jobs.items.find((j) => j.organizationName === 'Northgate Radio Club')!;
    const [quote] = ((await t.http.get(`/api/quotes?jobId=${job.id}&status=accepted`).set(as('lead'))).body as ListResponse<Quote>).items;
    expect(quote).toBeDefined();

    const signed = await t.http
      .post(`/api/jobs/${job.id}/sign`)
      .set(as('lead'))
      .send({ password: 'kilocycle-demo', meaning: 'reviewed and approved for issue' });
    expect(signed.status).toBe(200);
    const certificate = signed.body as Certificate;

    const [draft] = ((await t.http.get(`/api/invoices?jobId=${job.id}`).set(as('lead'))).body as ListResponse<Invoice>).items;
    expect(draft).toMatchObject({ status: 'draft', quoteId: quote!.id, number: null });
    // The invoice's lines are the quote's lines, with the same per-line figures.
    expect(draft!.lines.map((l) => [l.code, l.quantityMilli, l.unitPriceMinor, l.netMinor, l.taxMinor])).toEqual(
      quote!.lines.map((l) => [l.code, l.quantityMilli, l.unitPriceMinor, l.netMinor, l.taxMinor]),
    );
    expect(draft!.totals.grossMinor).toBe(quote!.totals.grossMinor);

    const held = await t.http.get(`/api/certificates/${certificate.id}/pdf`).set(as('northgate'));
    expect(held.status).toBe(403);
    expect((await t.http.post(`/api/invoices/${draft!.id}/pay`).set(as('lead'))).status).toBe(409); // a draft cannot be paid

    const issued = await t.http.post(`/api/invoices/${draft!.id}/issue`).set(as('lead'));
    expect(issued.status).toBe(200);
    const invoice = issued.body as Invoice;
    expect(invoice.number).toMatch(/^INV-\d{6}$/);

    const pay = await t.http.post(`/api/invoices/${invoice.id}/pay`).set(as('northgate'));
    expect(pay.status).toBe(201);
    const { url } = pay.body as PayInvoiceResponse;
    const page = await fetch(url, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ cardNumber: '4242424242424242', expiry: '12/34', cvc: '123', name: 'Nora Quist' }).toString(),
    });
    expect(page.status).toBe(303);
    await t.app.get(PaymentGateway).localFake!.idle();

    const paid = (await t.http.get(`/api/invoices/${invoice.id}`).set(as('northgate'))).body as Invoice;
    expect(paid).toMatchObject({ status: 'paid', paidMinor: invoice.totals.grossMinor, balanceMinor: 0 });
    const released = await binary(t.http.get(`/api/certificates/${certificate.id}/pdf`).set(as('northgate')));
    expect(released.status).toBe(200);
    expect((released.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });
});
