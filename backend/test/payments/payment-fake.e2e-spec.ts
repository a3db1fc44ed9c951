// The local payment service fake, driven through the real `stripe` SDK (the same calls the payments module
// makes) and a plain HTTP client standing in for the browser on its card page. Webhooks land on a small local
// server and are checked with the SDK's own `webhooks.constructEvent`. No database.
import { createServer, request as httpRequest, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { PaymentServiceFake, type FakeEvent } from '../../src/payments/fake/payment-service-fake.js';

const API_KEY = 'sk_test_kilocycle_fake_0001';
const SECRET = 'whsec_kilocycle_fake_0001';
const SUCCESS_URL = 'http://127.0.0.1:5180/portal/invoices/7?payment=done&session={CHECKOUT_SESSION_ID}';
const CANCEL_URL = 'http://127.0.0.1:5180/portal/invoices/7?payment=cancelled';

// Invoice INV-000007 of the demo scenario, worked by hand: 3 ranges × €45.00 = €135.00, plus one report
// fee of €12.50: €147.50, that is 14,750 cents.
const INVOICE_LINES = [
  { name: 'Frequency counter calibration, per range', unitAmount: 4500, quantity: 3 },
  { name: 'Certificate and report', unitAmount: 1250, quantity: 1 },
];
const TOTAL = 14_750;

type Received = { raw: string; signature: string };

function listen(server: Server): Promise<number> {
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve((server.address() as AddressInfo).port)));
}
function close(server: Server): Promise<void> {
  server.closeAllConnections();
  return new Promise((resolve) => server.close(() => resolve()));
}

describe('payment service fake: the stripe SDK, the card page and signed webhooks (no database)', () => {
  let fake: PaymentServiceFake;
  let stripe: Stripe;
  let sdkConfig: Stripe.StripeConfig;
  let receiver: Server;
  let webhookUrl = '';
  const received: Received[] = [];
  const answers: number[] = []; // statuses the app answers next; 200 when empty
  const logs: string[] = [];

  beforeAll(async () => {
    receiver = createServer((req, res) => {
      const chunks: Buffer[] = [];
      req.on('data', (c: Buffer) => chunks.push(c));
      req.on('end', () => {
        received.push({ raw: Buffer.concat(chunks).toString('utf8'), signature: String(req.headers['stripe-signature'] ?? '') });
        res.writeHead(answers.shift() ?? 200).end();
      });
    });
    webhookUrl = `http://127.0.0.1:${await listen(receiver)}/api/payments/webhook`;
    fake = new PaymentServiceFake({
      webhookUrl: () => webhookUrl,
      webhookSecret: SECRET,
      apiKey: API_KEY,
      log: (line) => logs.push(line),
      retryDelaysMs: [20, 40, 80],
    });
    const base = await fake.start(0);
    sdkConfig = { host: '127.0.0.1', port: Number(new URL(base).port), protocol: 'http', telemetry: false };
    stripe = new Stripe(API_KEY, sdkConfig);
  });
  afterAll(async () => {
    await fake.stop();
    await close(receiver);
  });

  const createSession = (metadata: Record<string, string> = { invoiceId: '7', paymentId: '31' }) =>
    stripe.checkout.sessions.create({
      mode: 'payment',
      currency: 'eur',
      line_items: INVOICE_LINES.map((l) => ({
        quantity: l.quantity,
        price_data: { currency: 'eur', unit_amount: l.unitAmount, product_data: { name: l.name } },
      })),
      success_url: SUCCESS_URL,
      cancel_url: CANCEL_URL,
      client_reference_id: 'INV-000007',
      metadata,
    });

  const postCard = (url: string, card: Partial<Record<'cardNumber' | 'expiry' | 'cvc' | 'name', string>>) =>
    fetch(url, {
      method: 'POST',
      body: new URLSearchParams({ cardNumber: '', expiry: '12/39', cvc: '123', name: 'Nell Northgate', ...card }),
      redirect: 'manual',
    });

  /** The webhooks received since `from`, each verified with the SDK against the right secret. */
  const verifiedSince = (from: number): Stripe.Event[] => received.slice(from).map((w) => stripe.webhooks.constructEvent(w.raw, w.signature, SECRET));

  async function paidSession() {
    const session = await createSession();
    const res = await postCard(session.url!, { cardNumber: '4242424242424242' });
    expect(res.status).toBe(303);
    return stripe.checkout.sessions.retrieve(session.id);
  }

  it('creates a checkout session shaped as the SDK declares and serves it back', async () => {
    const session = await createSession();
    expect(session.id).toMatch(/^cs_test_[0-9a-f]+$/);
    expect(session.object).toBe('checkout.session');
    expect(session.url).toBe(`${fake.url}/pay/${session.id}`);
    expect(session).toMatchObject({
      amount_total: TOTAL,
      currency: 'eur',
      status: 'open',
      payment_status: 'unpaid',
      payment_intent: null,
      mode: 'payment',
      client_reference_id: 'INV-000007',
      metadata: { invoiceId: '7', paymentId: '31' },
      success_url: SUCCESS_URL,
      cancel_url: CANCEL_URL,
    });
    expect(await stripe.checkout.sessions.retrieve(session.id)).toEqual(session);
  });

  it('serves a plain, labelled card page that says no real card is charged, with the amount and what it is for', async () => {
    const session = await createSession();
    const res = await fetch(session.url!);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/html');
    const html = await res.text();
    expect(html).toContain('Local test payment page — no real card is charged');
    expect(html).toContain('€147.50');
    expect(html).toContain('Frequency counter calibration, per range × 3');
    for (const [id, label] of [
      ['card-number', 'Card number'],
      ['expiry', 'Expiry date (MM/YY)'],
      ['cvc', 'Security code (CVC)'],
      ['name', 'Name on card'],
    ]) {
      expect(html).toContain(`<label for="${id}">${label}</label>`);
      expect(html).toMatch(new RegExp(`<input id="${id}" `));
    }
    expect(html).toContain(`href="${CANCEL_URL}"`);
  });

  it('the success card (typed with spaces) pays: signed checkout.session.completed, then a 303 to success_url', async () => {
    const session = await createSession();
    const from = received.length;
    const res = await postCard(session.url!, { cardNumber: '4242 4242 4242 4242' });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`http://127.0.0.1:5180/portal/invoices/7?payment=done&session=${session.id}`);

    // Delivered before the browser was sent back.
    const [event] = verifiedSince(from);
    expect(event.type).toBe('checkout.session.completed');
    const paid = event.data.object as Stripe.Checkout.Session;
    expect(paid).toMatchObject({
      id: session.id,
      status: 'complete',
      payment_status: 'paid',
      amount_total: TOTAL,
      currency: 'eur',
      metadata: { invoiceId: '7', paymentId: '31' },
    });
    expect(paid.payment_intent).toMatch(/^pi_/);

    const intent = await stripe.paymentIntents.retrieve(paid.payment_intent as string);
    expect(intent).toMatchObject({ object: 'payment_intent', status: 'succeeded', amount: TOTAL, amount_received: TOTAL, currency: 'eur' });
    expect(intent.latest_charge).toMatch(/^ch_/);
    const retrieved = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(retrieved.status).toBe('complete');
    expect((retrieved.payment_intent as Stripe.PaymentIntent).latest_charge).toBe(intent.latest_charge);

    // Paying a paid session again charges nothing and sends nothing.
    const again = await postCard(session.url!, { cardNumber: '4242424242424242' });
    expect(await again.text()).toContain('This payment has already been made.');
    expect(received.length).toBe(from + 1);
  });

  it('the signature check can fail: a wrong secret or a changed body is refused by the SDK', async () => {
    const session = await createSession();
    const from = received.length;
    await postCard(session.url!, { cardNumber: '4242424242424242' });
    const { raw, signature } = received[from];
    expect(() => stripe.webhooks.constructEvent(raw, signature, 'whsec_someone_else')).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => stripe.webhooks.constructEvent(raw.replace(String(TOTAL), '1'), signature, SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(stripe.webhooks.constructEvent(raw, signature, SECRET).id).toMatch(/^evt_/);
  });

  it.each([
    ['declining', '4000000000000002', 'generic_decline', 'Your card was declined.'],
    ['insufficient-funds', '4000 0000 0000 9995', 'insufficient_funds', 'Your card has insufficient funds.'],
  ])(
    'the %s card re-shows the form with the refusal, keeps the session unpaid and sends payment_intent.payment_failed',
    async (_, card, declineCode, message) => {
      const session = await createSession({ invoiceId: '8', paymentId: '32' });
      const from = received.length;
      const res = await postCard(session.url!, { cardNumber: card });
      expect(res.status).toBe(200);
      const html = await res.text();
      expect(html).toContain(`role="alert">${message}</p>`);
      expect(html).toContain('Card number</label>');

      const [event] = verifiedSince(from);
      expect(event.type).toBe('payment_intent.payment_failed');
      const intent = event.data.object as Stripe.PaymentIntent;
      expect(intent.last_payment_error).toMatchObject({ type: 'card_error', code: 'card_declined', decline_code: declineCode, message });
      expect(intent.metadata).toEqual({ invoiceId: '8', paymentId: '32' });
      expect(intent.status).toBe('requires_payment_method');

      const after = await stripe.checkout.sessions.retrieve(session.id);
      expect(after).toMatchObject({ status: 'open', payment_status: 'unpaid', payment_intent: intent.id });
      expect((await stripe.paymentIntents.retrieve(intent.id)).amount_received).toBe(0);
    },
  );

  it('the confirmation card needs the second step: Fail refuses the payment, Complete pays', async () => {
    const session = await createSession();
    const from = received.length;
    const res = await postCard(session.url!, { cardNumber: '4000 0025 0000 3155' });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`/pay/${session.id}/confirm`);
    expect(received.length).toBe(from);
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ status: 'open', payment_status: 'unpaid' });

    const page = await (await fetch(`${fake.url}/pay/${session.id}/confirm`)).text();
    expect(page).toContain('value="complete">Complete</button>');
    expect(page).toContain('value="fail" class="secondary">Fail</button>');

    const confirm = (outcome: string) =>
      fetch(`${fake.url}/pay/${session.id}/confirm`, { method: 'POST', body: new URLSearchParams({ outcome }), redirect: 'manual' });
    const failed = await confirm('fail');
    expect(await failed.text()).toContain('We could not confirm this payment');
    const [refusal] = verifiedSince(from);
    expect(refusal.type).toBe('payment_intent.payment_failed');
    expect((refusal.data.object as Stripe.PaymentIntent).last_payment_error?.code).toBe('payment_intent_authentication_failure');
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ payment_status: 'unpaid' });

    // Without a card waiting for confirmation, the confirm page sends the browser back to the form.
    expect((await confirm('complete')).headers.get('location')).toBe(`/pay/${session.id}`);

    await postCard(session.url!, { cardNumber: '4000002500003155' });
    const completed = await confirm('complete');
    expect(completed.status).toBe(303);
    expect(completed.headers.get('location')).toContain('payment=done');
    const [, paid] = verifiedSince(from);
    expect(paid.type).toBe('checkout.session.completed');
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ status: 'complete', payment_status: 'paid' });
  });

  it('any other card number, or a bad expiry, asks again and charges nothing', async () => {
    const session = await createSession();
    const from = received.length;
    const other = await postCard(session.url!, { cardNumber: '4111 1111 1111 1111' });
    expect(other.status).toBe(400);
    const html = await other.text();
    expect(html).toContain('use a test card');
    expect(html).toMatch(/<input id="card-number" [^>]*aria-invalid="true"/);
    const expired = await postCard(session.url!, { cardNumber: '4242424242424242', expiry: '01/20' });
    expect(await expired.text()).toMatch(/<input id="expiry" [^>]*aria-invalid="true"/);
    expect(received.length).toBe(from);
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ status: 'open', payment_status: 'unpaid', payment_intent: null });
  });

  it('refunds part, then the rest; refunding more than is left throws StripeInvalidRequestError; each sends charge.refunded', async () => {
    const session = await paidSession();
    const pi = session.payment_intent as string;
    const from = received.length;

    const part = await stripe.refunds.create({ payment_intent: pi, amount: 5000, reason: 'requested_by_customer', metadata: { creditNote: 'CN-000001' } });
    expect(part).toMatchObject({
      object: 'refund',
      amount: 5000,
      currency: 'eur',
      status: 'succeeded',
      payment_intent: pi,
      metadata: { creditNote: 'CN-000001' },
    });
    expect(part.id).toMatch(/^re_/);
    expect(await stripe.refunds.retrieve(part.id)).toEqual(part);

    // 14,750 − 5,000 = 9,750 left; 9,751 is one cent too many.
    const tooMuch = await stripe.refunds.create({ payment_intent: pi, amount: 9751 }).catch((e: unknown) => e);
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(tooMuch).toMatchObject({ statusCode: 400, code: 'amount_too_large', param: 'amount' });

    const rest = await stripe.refunds.create({ payment_intent: pi });
    expect(rest.amount).toBe(9750);
    const nothingLeft = await stripe.refunds.create({ payment_intent: pi, amount: 1 }).catch((e: unknown) => e);
    expect(nothingLeft).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(nothingLeft).toMatchObject({ code: 'charge_already_refunded' });

    await fake.idle();
    const events = verifiedSince(from);
    expect(events.map((e) => e.type)).toEqual(['charge.refunded', 'charge.refunded']);
    const charges = events.map((e) => e.data.object as Stripe.Charge);
    expect(charges.map((c) => [c.amount, c.amount_refunded, c.refunded])).toEqual([
      [TOTAL, 5000, false],
      [TOTAL, TOTAL, true],
    ]);
    expect(charges[0].payment_intent).toBe(pi);
    expect(charges[0].metadata).toEqual({ invoiceId: '7', paymentId: '31' });
  });

  it('a payment intent without a successful charge cannot be refunded; unknown ids answer resource_missing', async () => {
    const session = await createSession();
    await postCard(session.url!, { cardNumber: '4000000000000002' });
    const { payment_intent } = await stripe.checkout.sessions.retrieve(session.id);
    await expect(stripe.refunds.create({ payment_intent: payment_intent as string })).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    const missing = await stripe.checkout.sessions.retrieve('cs_test_nothing').catch((e: unknown) => e);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 404, code: 'resource_missing' });
  });

  it('two card tries at the same moment pay once', async () => {
    const session = await createSession();
    const from = received.length;
    // Both requests' headers reach the fake before either body does, so both are inside the page at once.
    const body = new URLSearchParams({ cardNumber: '4242424242424242', expiry: '12/39', cvc: '123', name: 'Nell Northgate' }).toString();
    const tries = [1, 2].map(() => {
      const req = httpRequest(session.url!, {
        method: 'POST',
        headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'Content-Length': Buffer.byteLength(body) },
      });
      const status = new Promise<number>((resolve, reject) => req.on('response', (res) => (res.resume(), resolve(res.statusCode ?? 0))).on('error', reject));
      req.flushHeaders();
      return { req, status };
    });
    await new Promise((resolve) => setTimeout(resolve, 100));
    tries.forEach((t) => t.req.end(body));
    expect((await Promise.all(tries.map((t) => t.status))).sort()).toEqual([200, 303]);
    expect(verifiedSince(from).map((e) => e.type)).toEqual(['checkout.session.completed']);
  });

  it('refuses parameters it does not know or that are missing, naming them, as the service does', async () => {
    const base = { mode: 'payment' as const, success_url: SUCCESS_URL };
    const item = { quantity: 1, price_data: { currency: 'eur', unit_amount: 100, product_data: { name: 'Adapter hire' } } };
    const cases: Array<[Stripe.Checkout.SessionCreateParams, string]> = [
      [{ ...base }, 'line_items'],
      [{ mode: 'payment', line_items: [item] }, 'success_url'],
      [{ ...base, line_items: [{ ...item, quantity: 0 }] }, 'line_items[0][quantity]'],
      [{ ...base, line_items: [item], allow_promotion_codes: true }, 'allow_promotion_codes'],
      [{ ...base, line_items: [item], success_url: 'javascript:alert(1)' }, 'success_url'],
    ];
    for (const [params, param] of cases) {
      const error = await stripe.checkout.sessions.create(params).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
      expect(error).toMatchObject({ statusCode: 400, param });
    }
  });

  it('a wrong API key makes the SDK throw StripeAuthenticationError', async () => {
    const wrong = new Stripe('sk_test_not_the_right_key', sdkConfig);
    const error = await wrong.checkout.sessions.create({ mode: 'payment', success_url: SUCCESS_URL }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    expect(error).toMatchObject({ statusCode: 401 });
  });

  it('honours Idempotency-Key: the same key answers the same object, another body under it is refused', async () => {
    const params = {
      mode: 'payment' as const,
      line_items: [{ quantity: 1, price_data: { currency: 'eur', unit_amount: 999, product_data: { name: 'Re-issue of a certificate' } } }],
      success_url: SUCCESS_URL,
    };
    const first = await stripe.checkout.sessions.create(params, { idempotencyKey: 'pay-invoice-7-attempt-1' });
    const second = await stripe.checkout.sessions.create(params, { idempotencyKey: 'pay-invoice-7-attempt-1' });
    expect(second.id).toBe(first.id);
    expect((await stripe.checkout.sessions.create(params)).id).not.toBe(first.id);
    await expect(stripe.checkout.sessions.create({ ...params, cancel_url: CANCEL_URL }, { idempotencyKey: 'pay-invoice-7-attempt-1' })).rejects.toBeInstanceOf(
      Stripe.errors.StripeIdempotencyError,
    );

    const session = await paidSession();
    const pi = session.payment_intent as string;
    const refundA = await stripe.refunds.create({ payment_intent: pi, amount: 100 }, { idempotencyKey: 'refund-31-1' });
    const refundB = await stripe.refunds.create({ payment_intent: pi, amount: 100 }, { idempotencyKey: 'refund-31-1' });
    expect(refundB.id).toBe(refundA.id);
    const intent = await stripe.paymentIntents.retrieve(pi, { expand: ['latest_charge'] });
    expect((intent.latest_charge as Stripe.Charge).amount_refunded).toBe(100);
    await fake.idle();
  });

  it('retries a webhook the app refuses, logging each try, and resend() delivers the same event again', async () => {
    const session = await createSession();
    const from = received.length;
    answers.push(500, 503);
    const res = await postCard(session.url!, { cardNumber: '4242424242424242' });
    expect(res.status).toBe(303);
    await fake.idle();
    const events = verifiedSince(from);
    expect(events.map((e) => e.id)).toEqual([events[0].id, events[0].id, events[0].id]);
    expect(fake.deliveries(events[0].id).map((d) => d.status)).toEqual([500, 503, 200]);
    expect(logs.filter((l) => l.includes(events[0].id) && l.includes('try '))).toEqual([
      expect.stringContaining('try 1 of 4: 500, will retry'),
      expect.stringContaining('try 2 of 4: 503, will retry'),
      expect.stringContaining('try 3 of 4: 200'),
    ]);

    expect(await fake.resend(events[0].id)).toBe(true);
    const [replayed] = verifiedSince(from + 3);
    expect(replayed.id).toBe(events[0].id);
    expect(received[from + 3].raw).toBe(received[from].raw);
    expect(fake.events().filter((e: FakeEvent) => e.id === events[0].id)).toHaveLength(1);
    expect(() => fake.resend('evt_never_sent')).toThrow('evt_never_sent');
  });

  it('gives up after the last retry when the app cannot be reached, and the payment stands', async () => {
    const closed = createServer();
    const port = await listen(closed);
    await close(closed);
    const lonely: string[] = [];
    const other = new PaymentServiceFake({
      webhookUrl: `http://127.0.0.1:${port}/api/payments/webhook`,
      webhookSecret: SECRET,
      apiKey: API_KEY,
      log: (l) => lonely.push(l),
      retryDelaysMs: [10, 10],
    });
    const base = await other.start(0);
    try {
      const client = new Stripe(API_KEY, { ...sdkConfig, port: Number(new URL(base).port) });
      const session = await client.checkout.sessions.create({
        mode: 'payment',
        line_items: [{ quantity: 1, price_data: { currency: 'eur', unit_amount: 500, product_data: { name: 'Adapter hire' } } }],
        success_url: SUCCESS_URL,
      });
      expect((await postCard(session.url!, { cardNumber: '4242424242424242' })).status).toBe(303);
      await other.idle();
      const [event] = other.events();
      expect(other.deliveries(event.id).map((d) => [d.attempt, d.status])).toEqual([
        [1, null],
        [2, null],
        [3, null],
      ]);
      expect(lonely.some((l) => l.includes(`gave up delivering checkout.session.completed ${event.id} after 3 tries`))).toBe(true);
      expect((await client.checkout.sessions.retrieve(session.id)).payment_status).toBe('paid');
    } finally {
      await other.stop();
    }
  });

  it('gives every event its own evt_ id and a created time', () => {
    const events = fake.events();
    expect(events.length).toBeGreaterThan(10);
    expect(new Set(events.map((e) => e.id)).size).toBe(events.length);
    const startedAt = Math.floor(Date.now() / 1000) - 600;
    for (const e of events) {
      expect(e.id).toMatch(/^evt_[0-9a-f]+$/);
      expect(e.created).toBeGreaterThan(startedAt);
      expect(e.object).toBe('event');
    }
  });
});
