/**
 * A local fake of the hosted payment service, for development, the demo and the tests.
 *
 * Hand-written because the service publishes no local server package on npm that runs offline (its own
 * mock servers are downloaded binaries or hosted sandboxes, and this machine reaches no network). It speaks
 * the small part of the service's REST API that the `stripe` SDK calls for a card payment through a hosted
 * checkout page, in the service's own shapes (the SDK's TypeScript types) and error JSON, so the app's
 * payment code is the same against the fake and the real service:
 *
 *   POST /v1/checkout/sessions, GET /v1/checkout/sessions/:id, GET /v1/payment_intents/:id,
 *   POST /v1/refunds, GET /v1/refunds/:id  (Authorization: Bearer <apiKey>; Idempotency-Key honoured)
 *   GET|POST /pay/:sessionId, GET|POST /pay/:sessionId/confirm  (the hosted card page)
 *
 * Webhooks are signed with the SDK's own `webhooks.generateTestHeaderString`, so the app verifies them with
 * `webhooks.constructEvent` exactly as it would the service's. Where the fake simplifies: only mode=payment
 * with price_data line items; the payment intent is made on the first card try (and the session points to
 * it from then on); the payment intent and its charge carry the session's metadata and payment_intent_data[metadata]; state is in memory.
 */
import { createHash, randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import qs from 'qs';
import Stripe from 'stripe';
import { ApiError, expandList, integer, invalid, isParams, metadata, only, text, webUrl, type Params } from './api-params.js';
import type {
  DeliveryAttempt,
  EventObjects,
  FakeCharge,
  FakeCheckoutSession,
  FakeEvent,
  FakeEventType,
  FakePaymentIntent,
  FakeRefund,
} from './fake-objects.js';
import { confirmPage, messagePage, paymentPage, type CardForm, type FieldName, type PageSession } from './hosted-page.js';
import { AUTHENTICATION_FAILED, cardOutcome, normaliseCardNumber } from './test-cards.js';

export type { DeliveryAttempt, FakeCharge, FakeCheckoutSession, FakeEvent, FakeEventType, FakePaymentIntent, FakeRefund } from './fake-objects.js';

export type PaymentServiceFakeOptions = {
  /** Where webhooks go; a function is asked at every delivery (the app's port may be known only later). */
  webhookUrl: string | (() => string);
  webhookSecret: string;
  /** The secret key the SDK must send as `Authorization: Bearer <apiKey>`. */
  apiKey: string;
  log?: (line: string) => void;
  /** Waits before each retry of a webhook the app did not take (2xx). Default 0.5 s, 2 s, 5 s: four tries. */
  retryDelaysMs?: number[];
};

/** intentMetadata: payment_intent_data[metadata], which the service puts on the payment intent and its charge. */
type SessionRecord = { session: FakeCheckoutSession; lines: PageSession['lines']; intentMetadata: Record<string, string> };
type EventRecord = { event: FakeEvent; payload: string };
type ApiAnswer = { status: number; body: unknown; after?: () => void };

const MAX_BODY = 1024 * 1024;
const MAX_AMOUNT = 99_999_999; // the service's largest charge: eight digits of minor units
const DELIVERY_TIMEOUT_MS = 10_000;
const SESSION_PARAMS = new Set([
  'mode',
  'line_items',
  'currency',
  'success_url',
  'cancel_url',
  'metadata',
  'payment_intent_data',
  'client_reference_id',
  'customer_email',
  'payment_method_types',
  'expand',
  'locale',
]);
const REFUND_PARAMS = new Set(['payment_intent', 'charge', 'amount', 'reason', 'metadata', 'expand']);
const REFUND_REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'] as const;

const newId = (prefix: string) => `${prefix}${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);

export class PaymentServiceFake {
  private server: Server | null = null;
  private base = '';
  private stopped = false;
  private abort = new AbortController();
  private readonly log: (line: string) => void;
  private readonly retryDelaysMs: number[];
  private readonly sessions = new Map<string, SessionRecord>();
  private readonly intents = new Map<string, FakePaymentIntent>();
  private readonly charges = new Map<string, FakeCharge>();
  private readonly refunds = new Map<string, FakeRefund>();
  private readonly cardholders = new Map<string, string>(); // payment intent → the name typed on its last try
  private readonly sent = new Map<string, EventRecord>();
  private readonly attempts: DeliveryAttempt[] = [];
  private readonly idempotent = new Map<string, { fingerprint: string; status: number; body: string }>();
  private readonly pending = new Set<Promise<unknown>>();
  private readonly timers = new Map<NodeJS.Timeout, () => void>();

  constructor(private readonly options: PaymentServiceFakeOptions) {
    this.log = options.log ?? (() => undefined);
    this.retryDelaysMs = options.retryDelaysMs ?? [500, 2000, 5000];
  }

  /** Listens on `port` (0 = any free port) and answers the fake's base URL, e.g. http://127.0.0.1:5191. */
  async start(port: number, host = '127.0.0.1'): Promise<string> {
    if (this.server) throw new Error('the payment service fake is already started');
    const server = createServer((req, res) => void this.handle(req, res));
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, host, () => {
        server.off('error', reject);
        resolve();
      });
    });
    this.server = server;
    this.stopped = false;
    this.abort = new AbortController();
    const address = server.address() as AddressInfo;
    this.base = `http://${address.family === 'IPv6' ? `[${address.address}]` : address.address}:${address.port}`;
    this.log(`payment fake: listening on ${this.base}`);
    return this.base;
  }

  /** Stops listening, cancels webhook retries still waiting and aborts deliveries in flight. */
  async stop(): Promise<void> {
    this.stopped = true;
    this.abort.abort();
    for (const [timer, wake] of this.timers) {
      clearTimeout(timer);
      wake();
    }
    this.timers.clear();
    const server = this.server;
    this.server = null;
    if (server) {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
    await this.idle();
  }

  /** The base URL while started ('' before). */
  get url(): string {
    return this.base;
  }

  /** Every event made so far, oldest first (copies). */
  events(): FakeEvent[] {
    return [...this.sent.values()].map((record) => structuredClone(record.event));
  }

  /** Every delivery try so far, oldest first; only those of one event when `eventId` is given. */
  deliveries(eventId?: string): DeliveryAttempt[] {
    return this.attempts.filter((a) => eventId === undefined || a.eventId === eventId).map((a) => ({ ...a }));
  }

  /** Delivers an event already sent once more, byte for byte, signed afresh (with the usual retries). Answers whether the first try was taken. */
  resend(eventId: string): Promise<boolean> {
    const record = this.sent.get(eventId);
    if (!record) throw new Error(`the payment service fake sent no event ${eventId}`);
    return this.send(record);
  }

  /** Settles when no webhook delivery or retry is pending (tests await it after a refund). */
  async idle(): Promise<void> {
    while (this.pending.size > 0) await Promise.allSettled([...this.pending]);
  }

  // ---------------------------------------------------------------- HTTP

  private async handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://fake.invalid');
    try {
      if (url.pathname.startsWith('/v1/')) await this.api(req, res, url);
      else if (url.pathname.startsWith('/pay/')) await this.page(req, res, url);
      else sendHtml(res, 404, messagePage('Not found', 'The local payment fake has no page here.'));
    } catch (error) {
      this.log(`payment fake: ${req.method} ${url.pathname} failed: ${error instanceof Error ? error.message : String(error)}`);
      if (res.headersSent) res.destroy();
      else if (error instanceof ApiError) sendJson(res, error.status, error);
      else sendJson(res, 500, new ApiError(500, 'api_error', 'The local payment fake failed on this request.'));
    }
  }

  private async api(req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
    res.setHeader('Request-Id', newId('req_'));
    const auth = req.headers.authorization;
    if (auth !== `Bearer ${this.options.apiKey}`) {
      const given = auth?.startsWith('Bearer ') ? auth.slice(7) : '';
      const message = given
        ? `Invalid API Key provided: ${given.slice(0, 8)}${'*'.repeat(Math.max(0, given.length - 12))}${given.slice(-4)}`
        : 'You did not provide an API key. Send it in the Authorization header as a Bearer token.';
      sendJson(res, 401, new ApiError(401, 'invalid_request_error', message));
      return;
    }
    const raw = req.method === 'POST' ? await readBody(req) : url.search.slice(1);
    const key = req.method === 'POST' ? header(req, 'idempotency-key') : undefined;
    const fingerprint = createHash('sha256').update(`${req.method} ${url.pathname}\n${raw}`).digest('hex');
    if (key) {
      res.setHeader('Idempotency-Key', key);
      const seen = this.idempotent.get(key);
      if (seen && seen.fingerprint !== fingerprint) {
        const message = `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`;
        sendJson(res, 400, new ApiError(400, 'idempotency_error', message));
        return;
      }
      if (seen) {
        res.setHeader('Idempotent-Replayed', 'true');
        sendRawJson(res, seen.status, seen.body);
        return;
      }
    }
    let answer: ApiAnswer;
    try {
      answer = this.route(req.method ?? 'GET', url.pathname, qs.parse(raw, { depth: 5, arrayLimit: 100, parameterLimit: 1000 }));
    } catch (error) {
      if (!(error instanceof ApiError)) throw error;
      answer = { status: error.status, body: error };
    }
    const body = JSON.stringify(answer.body, null, 2);
    if (key) this.idempotent.set(key, { fingerprint, status: answer.status, body });
    sendRawJson(res, answer.status, body);
    answer.after?.();
  }

  private route(method: string, path: string, params: Params): ApiAnswer {
    let m: RegExpMatchArray | null;
    if (path === '/v1/checkout/sessions' && method === 'POST') return this.createSession(params);
    if ((m = path.match(/^\/v1\/checkout\/sessions\/([^/]+)$/)) && method === 'GET') {
      only(params, new Set(['expand']));
      return { status: 200, body: this.expandedSession(this.session(m[1]).session, expandList(params, ['payment_intent'])) };
    }
    if ((m = path.match(/^\/v1\/payment_intents\/([^/]+)$/)) && method === 'GET') {
      only(params, new Set(['expand']));
      return { status: 200, body: this.expandedIntent(this.intent(m[1]), expandList(params, ['latest_charge'])) };
    }
    if (path === '/v1/refunds' && method === 'POST') return this.createRefund(params);
    if ((m = path.match(/^\/v1\/refunds\/([^/]+)$/)) && method === 'GET') {
      only(params, new Set(['expand']));
      expandList(params, []);
      const refund = this.refunds.get(m[1]);
      if (!refund) throw invalid(`No such refund: '${m[1]}'`, 'resource_missing', 'id', 404);
      return { status: 200, body: refund };
    }
    throw invalid(`Unrecognized request URL (${method}: ${path}). The local payment fake answers only the calls Kilocycle makes.`, undefined, undefined, 404);
  }

  // ---------------------------------------------------------------- API: checkout sessions

  private createSession(params: Params): ApiAnswer {
    only(params, SESSION_PARAMS);
    const mode = text(params, 'mode', { required: true });
    if (mode !== 'payment') throw invalid('The local payment fake supports only mode=payment.', 'parameter_invalid', 'mode');
    const successUrl = webUrl(params, 'success_url', true);
    const cancelUrl = webUrl(params, 'cancel_url', false);
    const items = params.line_items;
    if (!Array.isArray(items) || items.length === 0) throw invalid('Missing required param: line_items.', 'parameter_missing', 'line_items');
    const lines: SessionRecord['lines'] = [];
    let currency = typeof params.currency === 'string' ? params.currency.toLowerCase() : null;
    let total = 0;
    items.forEach((item, i) => {
      const p = `line_items[${i}]`;
      if (!isParams(item) || !isParams(item.price_data)) {
        throw invalid(`The local payment fake needs ${p}[price_data] (stored prices are not supported).`, 'parameter_missing', `${p}[price_data]`);
      }
      const price = item.price_data;
      const lineCurrency = text(price, 'currency', { required: true, param: `${p}[price_data][currency]` }).toLowerCase();
      if (!/^[a-z]{3}$/.test(lineCurrency)) throw invalid(`Invalid currency: ${lineCurrency}.`, 'parameter_invalid', `${p}[price_data][currency]`);
      if (currency !== null && currency !== lineCurrency) {
        throw invalid('All line items must be in the same currency as the session.', 'parameter_invalid', `${p}[price_data][currency]`);
      }
      currency = lineCurrency;
      const unitAmount = integer(price.unit_amount, `${p}[price_data][unit_amount]`, 0);
      const quantity = integer(item.quantity, `${p}[quantity]`, 1);
      const product = isParams(price.product_data) ? price.product_data : {};
      const name = text(product, 'name', { required: true, param: `${p}[price_data][product_data][name]`, max: 250 });
      const amount = unitAmount * quantity;
      total += amount;
      if (!Number.isSafeInteger(amount) || total > MAX_AMOUNT)
        throw invalid(`The amount may be at most ${MAX_AMOUNT} minor units.`, 'amount_too_large', `${p}`);
      lines.push({ name, quantity, amount });
    });
    const created = now();
    const id = newId('cs_test_');
    const session: FakeCheckoutSession = {
      id,
      object: 'checkout.session',
      amount_subtotal: total,
      amount_total: total,
      cancel_url: cancelUrl,
      client_reference_id: text(params, 'client_reference_id', { max: 200 }) || null,
      created,
      currency,
      customer_email: text(params, 'customer_email', { max: 512 }) || null,
      expires_at: created + 24 * 3600,
      livemode: false,
      metadata: metadata(params),
      mode: 'payment',
      payment_intent: null,
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      status: 'open',
      success_url: successUrl,
      url: `${this.base}/pay/${id}`,
    };
    this.sessions.set(id, { session, lines, intentMetadata: paymentIntentMetadata(params) });
    this.log(`payment fake: checkout session ${id} for ${total} ${currency} opened`);
    return { status: 200, body: this.expandedSession(session, expandList(params, ['payment_intent'])) };
  }

  private session(id: string): SessionRecord {
    const record = this.sessions.get(id);
    if (!record) throw invalid(`No such checkout.session: '${id}'`, 'resource_missing', 'session', 404);
    return record;
  }

  private intent(id: string): FakePaymentIntent {
    const intent = this.intents.get(id);
    if (!intent) throw invalid(`No such payment_intent: '${id}'`, 'resource_missing', 'intent', 404);
    return intent;
  }

  private expandedSession(session: FakeCheckoutSession, expand: string[]): unknown {
    const copy: Record<string, unknown> = structuredClone(session);
    if (expand.includes('payment_intent') && session.payment_intent) copy.payment_intent = this.intents.get(session.payment_intent);
    return copy;
  }

  private expandedIntent(intent: FakePaymentIntent, expand: string[]): unknown {
    const copy: Record<string, unknown> = structuredClone(intent);
    if (expand.includes('latest_charge') && intent.latest_charge) copy.latest_charge = this.charges.get(intent.latest_charge);
    return copy;
  }

  // ---------------------------------------------------------------- API: refunds

  private createRefund(params: Params): ApiAnswer {
    only(params, REFUND_PARAMS);
    expandList(params, []);
    let charge: FakeCharge | undefined;
    if (typeof params.charge === 'string') {
      charge = this.charges.get(params.charge);
      if (!charge) throw invalid(`No such charge: '${params.charge}'`, 'resource_missing', 'charge');
    } else if (typeof params.payment_intent === 'string') {
      const intent = this.intents.get(params.payment_intent);
      if (!intent) throw invalid(`No such payment_intent: '${params.payment_intent}'`, 'resource_missing', 'payment_intent');
      charge = intent.latest_charge ? this.charges.get(intent.latest_charge) : undefined;
      if (!charge) {
        throw invalid(`This PaymentIntent (${intent.id}) does not have a successful charge to refund.`, 'charge_not_refundable', 'payment_intent');
      }
    } else {
      throw invalid('One of the following params should be provided for this request: payment_intent or charge.', 'parameter_missing', 'payment_intent');
    }
    const left = charge.amount - charge.amount_refunded;
    if (left === 0) throw invalid(`Charge ${charge.id} has already been refunded.`, 'charge_already_refunded');
    const amount = params.amount === undefined ? left : integer(params.amount, 'amount', 1);
    if (amount > left) {
      throw invalid(`Refund amount (${amount}) is greater than unrefunded amount on charge (${left}).`, 'amount_too_large', 'amount');
    }
    const reason = params.reason === undefined ? null : text(params, 'reason', { required: true });
    if (reason !== null && !REFUND_REASONS.some((r) => r === reason)) {
      throw invalid(`Invalid reason: must be one of ${REFUND_REASONS.join(', ')}.`, 'parameter_invalid', 'reason');
    }
    const refund: FakeRefund = {
      id: newId('re_'),
      object: 'refund',
      amount,
      charge: charge.id,
      created: now(),
      currency: charge.currency,
      metadata: metadata(params),
      payment_intent: charge.payment_intent,
      reason: reason as FakeRefund['reason'],
      status: 'succeeded',
    };
    this.refunds.set(refund.id, refund);
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded === charge.amount;
    this.log(`payment fake: refund ${refund.id} of ${amount} ${refund.currency} on ${charge.id}`);
    const event = this.newEvent('charge.refunded', structuredClone(charge));
    // As the service does, the webhook follows the API's answer rather than preceding it.
    return { status: 200, body: refund, after: () => void this.send(event) };
  }

  // ---------------------------------------------------------------- the hosted page

  private async page(req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
    const m = url.pathname.match(/^\/pay\/([^/]+)(\/confirm)?$/);
    const record = m ? this.sessions.get(m[1]) : undefined;
    if (!m || !record) {
      sendHtml(res, 404, messagePage('No such payment', 'This payment page does not exist. Go back to Kilocycle and start the payment again.'));
      return;
    }
    const { session } = record;
    const view: PageSession = {
      id: session.id,
      amountTotal: session.amount_total ?? 0,
      currency: session.currency ?? 'eur',
      lines: record.lines,
      cancelUrl: session.cancel_url,
    };
    // Read before the checks below, so that from here to the change of state nothing awaits: two tries at once cannot both pay.
    const form = req.method === 'POST' ? new URLSearchParams(await readBody(req)) : null;
    if (session.status === 'complete') {
      sendHtml(res, 200, messagePage('Payment complete', 'This payment has already been made.', { href: successUrl(session), label: 'Back to Kilocycle' }));
      return;
    }
    const intent = session.payment_intent ? this.intents.get(session.payment_intent) : undefined;
    if (m[2]) {
      if (intent?.status !== 'requires_action') return redirect(res, `/pay/${session.id}`);
      if (!form) return sendHtml(res, 200, confirmPage(view));
      if (form.get('outcome') === 'complete') {
        await this.succeed(record, intent);
        return redirect(res, successUrl(session));
      }
      await this.fail(record, intent, { type: 'card_error', code: AUTHENTICATION_FAILED.code, message: AUTHENTICATION_FAILED.message });
      return sendHtml(res, 200, paymentPage(view, {}, { message: AUTHENTICATION_FAILED.message }));
    }
    if (!form) return sendHtml(res, 200, paymentPage(view));

    const values: CardForm = {
      cardNumber: (form.get('cardNumber') ?? '').trim(),
      expiry: (form.get('expiry') ?? '').trim(),
      cvc: (form.get('cvc') ?? '').trim(),
      name: (form.get('name') ?? '').trim(),
    };
    const problem = checkCardForm(values);
    if (problem) return sendHtml(res, 400, paymentPage(view, values, problem));
    const outcome = cardOutcome(values.cardNumber);
    if (!outcome) {
      const message = 'This is a local test page: use a test card, for example 4242 4242 4242 4242 (the numbers are listed below the form).';
      return sendHtml(res, 400, paymentPage(view, values, { message, field: 'cardNumber' }));
    }
    const tried = this.intentFor(record, values.name);
    if (outcome.kind === 'succeeds') {
      await this.succeed(record, tried);
      return redirect(res, successUrl(session));
    }
    if (outcome.kind === 'needs-confirmation') {
      tried.status = 'requires_action';
      this.log(`payment fake: ${tried.id} waits for the extra confirmation step`);
      return redirect(res, `/pay/${session.id}/confirm`);
    }
    await this.fail(record, tried, { type: 'card_error', code: outcome.code, decline_code: outcome.declineCode, message: outcome.message });
    sendHtml(res, 200, paymentPage(view, values, { message: outcome.message, field: 'cardNumber' }));
  }

  /** The session's payment intent, made on the first card try, with a new payment method for each try. */
  private intentFor(record: SessionRecord, cardholder: string): FakePaymentIntent {
    const { session } = record;
    let intent = session.payment_intent ? this.intents.get(session.payment_intent) : undefined;
    if (!intent) {
      intent = {
        id: newId('pi_'),
        object: 'payment_intent',
        amount: session.amount_total ?? 0,
        amount_capturable: 0,
        amount_received: 0,
        capture_method: 'automatic_async',
        confirmation_method: 'automatic',
        created: now(),
        currency: session.currency ?? 'eur',
        description: record.lines.map((l) => l.name).join('; '),
        last_payment_error: null,
        latest_charge: null,
        livemode: false,
        metadata: { ...(session.metadata ?? {}), ...record.intentMetadata },
        payment_method: null,
        payment_method_types: ['card'],
        status: 'requires_payment_method',
      };
      this.intents.set(intent.id, intent);
      session.payment_intent = intent.id;
    }
    intent.payment_method = newId('pm_');
    this.cardholders.set(intent.id, cardholder);
    return intent;
  }

  private async succeed(record: SessionRecord, intent: FakePaymentIntent): Promise<void> {
    const { session } = record;
    const charge: FakeCharge = {
      id: newId('ch_'),
      object: 'charge',
      amount: intent.amount,
      amount_captured: intent.amount,
      amount_refunded: 0,
      billing_details: { address: null, email: null, name: this.cardholders.get(intent.id) ?? null, phone: null, tax_id: null },
      captured: true,
      created: now(),
      currency: intent.currency,
      description: intent.description,
      failure_code: null,
      failure_message: null,
      livemode: false,
      metadata: { ...intent.metadata },
      paid: true,
      payment_intent: intent.id,
      payment_method: typeof intent.payment_method === 'string' ? intent.payment_method : null,
      refunded: false,
      status: 'succeeded',
    };
    this.charges.set(charge.id, charge);
    Object.assign(intent, { status: 'succeeded', amount_received: intent.amount, latest_charge: charge.id, last_payment_error: null });
    Object.assign(session, { status: 'complete', payment_status: 'paid', url: null });
    this.log(`payment fake: checkout session ${session.id} paid (${intent.id}, ${charge.id})`);
    // The browser is sent back only after the first delivery try, so the app knows of the payment when it shows its page.
    await this.send(this.newEvent('checkout.session.completed', structuredClone(session)));
  }

  private async fail(record: SessionRecord, intent: FakePaymentIntent, error: Stripe.PaymentIntent.LastPaymentError): Promise<void> {
    Object.assign(intent, { status: 'requires_payment_method', last_payment_error: error });
    this.log(`payment fake: ${intent.id} refused: ${error.code}${error.decline_code ? ` (${error.decline_code})` : ''}`);
    await this.send(this.newEvent('payment_intent.payment_failed', structuredClone(intent)));
  }

  // ---------------------------------------------------------------- webhooks

  private newEvent<T extends FakeEventType>(type: T, object: EventObjects[T]): EventRecord {
    const event = {
      id: newId('evt_'),
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: now(),
      data: { object },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
    } as FakeEvent;
    const record = { event, payload: JSON.stringify(event, null, 2) };
    this.sent.set(event.id, record);
    return record;
  }

  /** Starts the delivery of an event (retries go on in the background) and answers whether the first try was taken. */
  private send(record: EventRecord): Promise<boolean> {
    return new Promise<boolean>((resolve) => {
      this.track(this.deliver(record, resolve));
    });
  }

  private async deliver(record: EventRecord, firstTry: (taken: boolean) => void): Promise<void> {
    const tries = this.retryDelaysMs.length + 1;
    for (let attempt = 1; attempt <= tries; attempt++) {
      if (attempt > 1) await this.sleep(this.retryDelaysMs[attempt - 2]);
      const taken = !this.stopped && (await this.attempt(record, attempt, tries));
      if (attempt === 1) firstTry(taken);
      if (taken || this.stopped) return;
    }
    this.log(`payment fake: gave up delivering ${record.event.type} ${record.event.id} after ${tries} tries`);
  }

  private async attempt(record: EventRecord, attempt: number, tries: number): Promise<boolean> {
    const { event, payload } = record;
    const entry: DeliveryAttempt = { eventId: event.id, type: event.type, attempt, url: '', status: null, at: Date.now() };
    this.attempts.push(entry);
    try {
      entry.url = typeof this.options.webhookUrl === 'function' ? this.options.webhookUrl() : this.options.webhookUrl;
      // Signed afresh at each try, as the service does: the app refuses a signature older than its tolerance.
      const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: this.options.webhookSecret });
      const response = await fetch(entry.url, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': signature, 'User-Agent': 'Kilocycle-PaymentFake/1.0' },
        body: payload,
        redirect: 'manual',
        signal: AbortSignal.any([this.abort.signal, AbortSignal.timeout(DELIVERY_TIMEOUT_MS)]),
      });
      await response.arrayBuffer().catch(() => undefined);
      entry.status = response.status;
    } catch (error) {
      entry.error = error instanceof Error ? (error.cause instanceof Error ? error.cause.message : error.message) : String(error);
    }
    const taken = entry.status !== null && entry.status >= 200 && entry.status < 300;
    this.log(
      `payment fake: webhook ${event.type} ${event.id} to ${entry.url || '(no URL)'}, try ${attempt} of ${tries}: ${entry.status ?? `not delivered (${entry.error})`}${taken ? '' : attempt < tries ? ', will retry' : ''}`,
    );
    return taken;
  }

  private sleep(ms: number): Promise<void> {
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        this.timers.delete(timer);
        resolve();
      }, ms);
      this.timers.set(timer, resolve);
    });
  }

  private track(promise: Promise<unknown>): void {
    this.pending.add(promise);
    void promise.finally(() => this.pending.delete(promise));
  }
}

// ---------------------------------------------------------------- helpers

function header(req: IncomingMessage, name: string): string | undefined {
  const value = req.headers[name];
  return Array.isArray(value) ? value[0] : value;
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY) {
        reject(invalid('The request body is too large.', undefined, undefined, 413));
        req.destroy();
      } else chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

function sendRawJson(res: ServerResponse, status: number, body: string): void {
  res.writeHead(status, { 'Content-Type': 'application/json', 'Cache-Control': 'no-store' });
  res.end(body);
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  sendRawJson(res, status, JSON.stringify(body, null, 2));
}

function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, {
    'Content-Type': 'text/html; charset=utf-8',
    'Cache-Control': 'no-store',
    'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; frame-ancestors 'none'",
  });
  res.end(html);
}

function redirect(res: ServerResponse, location: string): void {
  res.writeHead(303, { Location: location, 'Cache-Control': 'no-store' });
  res.end();
}

function successUrl(session: FakeCheckoutSession): string {
  return (session.success_url ?? '/').replace('{CHECKOUT_SESSION_ID}', session.id);
}

/** The card form's own checks, before the number is looked up; the first problem found, with its field. */
function checkCardForm(values: CardForm): { message: string; field: FieldName } | null {
  if (!/^\d{12,19}$/.test(normaliseCardNumber(values.cardNumber))) return { message: 'Enter the card number: 12 to 19 digits.', field: 'cardNumber' };
  const expiry = values.expiry.match(/^(\d{2})\s*\/\s*(\d{2})$/);
  const month = expiry ? Number(expiry[1]) : 0;
  const today = new Date();
  const expired = expiry !== null && (2000 + Number(expiry[2])) * 12 + month < today.getUTCFullYear() * 12 + today.getUTCMonth() + 1;
  if (!expiry || month < 1 || month > 12 || expired) return { message: 'Enter the expiry date as MM/YY, not in the past.', field: 'expiry' };
  if (!/^\d{3,4}$/.test(values.cvc)) return { message: 'Enter the 3 or 4 digit security code.', field: 'cvc' };
  if (!values.name || values.name.length > 100) return { message: 'Enter the name on the card.', field: 'name' };
  return null;
}

/** payment_intent_data may carry metadata only (the one part of it Kilocycle sends). */
function paymentIntentMetadata(params: Params): Record<string, string> {
  const data = params.payment_intent_data;
  if (data === undefined) return {};
  if (!isParams(data)) throw invalid('Invalid object: payment_intent_data.', 'parameter_invalid', 'payment_intent_data');
  only(data, new Set(['metadata']));
  return metadata(data);
}
