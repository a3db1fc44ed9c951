import Stripe from 'stripe';
import type { CreditNote, Invoice, ListResponse, PayInvoiceResponse, Payment } from '@kilocycle/common/types';
import { PaymentGateway } from '../../src/payments/payment-gateway.js';
import { binary } from '../support/binary-body.js';
import { createTestApp, signInDemo, type AsDemo, type TestApp } from '../support/test-app.js';

// Card payment end to end: the app's payments module talks to the payment service fake through the `stripe` SDK,
// a client pays on the fake's page with the service's published test cards, and the fake's signed webhooks come
// back to the app listening on a free port. Amounts are checked against the demo invoice's own figures and
// hand-worked credit splits.

/** Posts the card form on the fake's payment page as a browser would (no redirects followed). */
async function payOnPage(url: string, cardNumber: string): Promise<Response> {
  return fetch(url, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ cardNumber, expiry: '12/34', cvc: '123', name: 'Nora Quist' }).toString(),
  });
}

/** A webhook body signed with the given secret, as the service would send it (`created` n seconds ago). */
function signed(payload: unknown, secret: string, ageSeconds = 0): { body: string; header: string } {
  const body = JSON.stringify(payload);
  const header = Stripe.webhooks.generateTestHeaderString({ payload: body, secret, timestamp: Math.floor(Date.now() / 1000) - ageSeconds });
  return { body, header };
}

describe('card payment through the payment service (e2e, MariaDB, the local fake)', () => {
  let t: TestApp;
  let as: AsDemo;
  let invoice: Invoice;
  let certificateId: number;

  const getInvoice = async (id: number, who: Parameters<AsDemo>[0] = 'lead'): Promise<Invoice> =>
    (await t.http.get(`/api/invoices/${id}`).set(as(who))).body as Invoice;
  const payments = async (invoiceId: number): Promise<Payment[]> =>
    ((await t.http.get(`/api/payments?invoiceId=${invoiceId}`).set(as('lead'))).body as ListResponse<Payment>).items;
  const gateway = () => t.app.get(PaymentGateway);
  const startPayment = async (): Promise<PayInvoiceResponse> => {
    const res = await t.http.post(`/api/invoices/${invoice.id}/pay`).set(as('northgate'));
    if (res.status !== 201) throw new Error(`pay answered ${res.status}: ${JSON.stringify(res.body)}`);
    return res.body as PayInvoiceResponse;
  };

  beforeAll(async () => {
    t = await createTestApp();
    await t.app.listen(0, '127.0.0.1'); // the fake delivers its webhooks to this address
    as = await signInDemo(t.http);
    const open = (await t.http.get('/api/invoices?status=issued').set(as('northgate'))).body as ListResponse<Invoice>;
    invoice = open.items.find((i) => i.paymentTerms === 'pay_before_release')!;
    expect(invoice).toBeDefined();
    const [cert] = (await t.dataSource.query("SELECT id FROM certificates WHERE job_id = ? AND status = 'issued' ORDER BY id DESC LIMIT 1", [
      invoice.jobId,
    ])) as {
      id: number;
    }[];
    certificateId = cert!.id;
  }, 120_000);

  afterAll(async () => {
    await t?.close();
  });

  it('should leave the invoice unchanged when the card is declined or has insufficient funds, saying why', async () => {
    for (const [card, expected] of [
      ['4000 0000 0000 0002', /declined/i],
      ['4000000000009995', /insufficient funds/i],
    ] as const) {
      const { paymentId, url } = await startPayment();
      expect(new URL(url).hostname).toBe('127.0.0.1');
      const page = await payOnPage(url, card);
      expect(page.status).toBe(200); // the page shows the refusal; no redirect back
      expect(await page.text()).toMatch(expected);
      await gateway().localFake!.idle();
      const payment = (await payments(invoice.id)).find((p) => p.id === paymentId)!;
      expect(payment.status).toBe('failed');
      expect(payment.failureMessage).toMatch(expected);
      const after = await getInvoice(invoice.id);
      expect(after).toMatchObject({ status: 'issued', paidMinor: 0, balanceMinor: invoice.balanceMinor });
    }
    expect((await t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('northgate'))).status).toBe(403);
  });

  it('should refuse another organisation’s invoice (404) and a technician (403)', async () => {
    expect((await t.http.post(`/api/invoices/${invoice.id}/pay`).set(as('saltmarsh'))).status).toBe(404);
    expect((await t.http.post(`/api/invoices/${invoice.id}/pay`).set(as('tech'))).status).toBe(403);
  });

  it('should take the success card, record the payment from the signed webhook once, and release the certificate', async () => {
    const { paymentId, url } = await startPayment();
    const page = await payOnPage(url, '4242 4242 4242 4242');
    expect(page.status).toBe(303);
    expect(page.headers.get('location')).toMatch(new RegExp(`/portal/invoices/${invoice.id}\\?payment=done$`));
    await gateway().localFake!.idle();
    const paid = await getInvoice(invoice.id, 'northgate');
    expect(paid).toMatchObject({ status: 'paid', paidMinor: invoice.balanceMinor, balanceMinor: 0 });
    const payment = (await payments(invoice.id)).find((p) => p.id === paymentId)!;
    expect(payment).toMatchObject({ status: 'succeeded', amountMinor: invoice.balanceMinor, currency: 'EUR' });
    expect(payment.providerPaymentId).toMatch(/^pi_/);
    const pdf = await binary(t.http.get(`/api/certificates/${certificateId}/pdf`).set(as('northgate')));
    expect(pdf.status).toBe(200);
    expect((pdf.body as Buffer).subarray(0, 4).toString()).toBe('%PDF');

    // The same event delivered again (the service retries; an attacker replays) changes nothing.
    const completed = gateway()
      .localFake!.events()
      .filter((e) => e.type === 'checkout.session.completed')
      .at(-1)!;
    expect(await gateway().localFake!.resend(completed.id)).toBe(true);
    const [{ n }] = (await t.dataSource.query("SELECT COUNT(*) AS n FROM invoice_ledger_entries WHERE invoice_id = ? AND kind = 'payment'", [invoice.id])) as {
      n: number;
    }[];
    expect(Number(n)).toBe(1);
    expect((await getInvoice(invoice.id)).paidMinor).toBe(invoice.balanceMinor);
    const audit = (await t.dataSource.query("SELECT action FROM audit_events WHERE entity = 'payment' AND entity_id = ? ORDER BY id", [String(paymentId)])) as {
      action: string;
    }[];
    expect(audit.map((a) => a.action)).toEqual(['started', 'succeeded']);
  });

  it('should ask for the extra confirmation step with the card that needs one', async () => {
    const other = (await t.http.get('/api/invoices?status=issued').set(as('lead'))).body as ListResponse<Invoice>;
    const target = other.items.find((i) => i.id !== invoice.id && i.balanceMinor > 0)!;
    const res = await t.http.post(`/api/invoices/${target.id}/pay`).set(as('lead'));
    expect(res.status).toBe(201);
    const { url } = res.body as PayInvoiceResponse;
    const first = await payOnPage(url, '4000 0025 0000 3155');
    expect(first.status).toBe(303);
    expect(first.headers.get('location')).toBe(`${new URL(url).pathname}/confirm`);
    expect(await (await fetch(`${url}/confirm`)).text()).toMatch(/Complete/);
    expect((await getInvoice(target.id)).paidMinor).toBe(target.paidMinor); // nothing yet
    const confirmed = await fetch(`${url}/confirm`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: 'outcome=complete',
    });
    expect(confirmed.status).toBe(303);
    await gateway().localFake!.idle();
    expect(await getInvoice(target.id)).toMatchObject({ balanceMinor: 0, paidMinor: target.paidMinor + target.balanceMinor });
  });

  it('should refuse a forged signature, a stale event and a body without a signature, changing nothing', async () => {
    const before = await getInvoice(invoice.id);
    const event = {
      id: 'evt_forged_1',
      object: 'event',
      type: 'checkout.session.completed',
      created: Math.floor(Date.now() / 1000),
      data: { object: { id: 'cs_test_forged', object: 'checkout.session', payment_status: 'paid', amount_total: 1, currency: 'eur', metadata: {} } },
    };
    const forged = signed(event, 'whsec_not_the_right_secret_at_all');
    const res = await t.http.post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', forged.header).send(forged.body);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/payment webhook refused: signature not valid/);
    const stale = signed(event, gateway().webhookSecret, 3600);
    const old = await t.http.post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', stale.header).send(stale.body);
    expect(old.status).toBe(400);
    expect(old.body.message).toMatch(/tolerance|timestamp/i);
    const none = await t.http.post('/api/payments/webhook').set('content-type', 'application/json').send(event);
    expect(none.status).toBe(400);
    const [{ n }] = (await t.dataSource.query("SELECT COUNT(*) AS n FROM payment_events WHERE event_id = 'evt_forged_1'")) as { n: number }[];
    expect(Number(n)).toBe(0);
    expect(await getInvoice(invoice.id)).toEqual(before);
  });

  it('should set aside a correctly signed event whose amount differs from the payment', async () => {
    const [payment] = (await payments(invoice.id)).filter((p) => p.status === 'succeeded');
    const fresh = await t.dataSource.query(
      "INSERT INTO payments (invoice_id, organization_id, status, amount_minor, currency, provider_session_id) VALUES (?, ?, 'pending', 5000, 'EUR', 'cs_test_tampered')",
      [payment!.invoiceId, payment!.organizationId],
    );
    const event = {
      id: 'evt_tampered_1',
      object: 'event',
      type: 'checkout.session.completed',
      created: Math.floor(Date.now() / 1000),
      data: {
        object: { id: 'cs_test_tampered', object: 'checkout.session', payment_status: 'paid', amount_total: 1, currency: 'eur', payment_intent: 'pi_x' },
      },
    };
    const { body, header } = signed(event, gateway().webhookSecret);
    const res = await t.http.post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', header).send(body);
    expect(res.status).toBe(200);
    const [row] = (await t.dataSource.query('SELECT status FROM payments WHERE id = ?', [(fresh as { insertId: number }).insertId])) as { status: string }[];
    expect(row!.status).toBe('pending');
    const [seen] = (await t.dataSource.query("SELECT outcome FROM payment_events WHERE event_id = 'evt_tampered_1'")) as { outcome: string }[];
    expect(seen!.outcome).toMatch(/^set aside: amount or currency differ/);
  });

  it('should refund part of a payment through the service with a credit note of the same amount, and refuse more than is left', async () => {
    const [payment] = (await payments(invoice.id)).filter((p) => p.status === 'succeeded');
    expect((await t.http.post(`/api/payments/${payment!.id}/refund`).set(as('tech')).send({ amountMinor: 100, reason: 'goodwill' })).status).toBe(403);
    const tooMuch = await t.http
      .post(`/api/payments/${payment!.id}/refund`)
      .set(as('lead'))
      .send({ amountMinor: payment!.amountMinor + 1, reason: 'too much' });
    expect(tooMuch.status).toBe(409);
    expect(tooMuch.body.message).toMatch(/more than the \d+ left/);
    const res = await t.http.post(`/api/payments/${payment!.id}/refund`).set(as('lead')).send({ amountMinor: 2000, reason: 'One range not needed after all' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'part_refunded', refundedMinor: 2000 });
    await gateway().localFake!.idle(); // the service's charge.refunded echo must not book the refund twice
    const after = await getInvoice(invoice.id);
    expect(after).toMatchObject({ refundedMinor: 2000, creditedMinor: 2000, balanceMinor: 0, status: 'paid' });
    const note = after.creditNotes.at(-1) as CreditNote;
    // The credit note takes tax back in the invoice's proportion: tax = round(invoice tax × 2000 / invoice gross).
    const expectedTax = Math.round((after.totals.taxMinor * 2000) / after.totals.grossMinor);
    expect(note).toMatchObject({ grossMinor: 2000, taxMinor: expectedTax, netMinor: 2000 - expectedTax, paymentId: payment!.id });
    // The service holds the same refund.
    const intent = await gateway().stripe.paymentIntents.retrieve(payment!.providerPaymentId!, { expand: ['latest_charge'] });
    expect((intent.latest_charge as Stripe.Charge).amount_refunded).toBe(2000);
    const echoes = (await t.dataSource.query("SELECT outcome FROM payment_events WHERE type = 'charge.refunded'")) as { outcome: string }[];
    expect(echoes.map((e) => e.outcome)).toEqual(['refunds already recorded (2000)']);
  });

  it('should refuse to start a payment when nothing is owed, or on a draft', async () => {
    const res = await t.http.post(`/api/invoices/${invoice.id}/pay`).set(as('northgate'));
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/nothing is owed/);
    const drafts = (await t.http.get('/api/invoices?status=draft').set(as('lead'))).body as ListResponse<Invoice>;
    expect((await t.http.post(`/api/invoices/${drafts.items[0]!.id}/pay`).set(as('lead'))).status).toBe(409);
  });
});
