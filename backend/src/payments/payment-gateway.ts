import { randomBytes } from 'node:crypto';
import { Inject, Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { HttpAdapterHost } from '@nestjs/core';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { PaymentServiceFake } from './fake/payment-service-fake.js';

/** The key our fake expects: any test-mode key works against it; a real key never reaches it. */
const FAKE_API_KEY = 'sk_test_kilocycle_local_fake';

/**
 * The payment service as the rest of the module sees it: the `stripe` SDK client and the secret its webhooks are
 * signed with. Without KC_STRIPE_SECRET_KEY it starts the local fake on 127.0.0.1 (KC_PAYMENT_FAKE_PORT; another
 * free port if that one is taken, as the mail catcher does) and points the SDK at it through the SDK's own
 * host/port/protocol options; the fake signs its webhooks with a secret made for this start.
 */
@Injectable()
export class PaymentGateway implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Payments');
  private fake: PaymentServiceFake | null = null;
  private client: Stripe | null = null;
  private secret = '';
  /** The fake's base URL (its hosted payment page lives under it); null with the real service. */
  fakeUrl: string | null = null;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly http: HttpAdapterHost,
  ) {}

  async onModuleInit(): Promise<void> {
    const payments = this.config.billing.payments;
    if (payments.kind === 'service') {
      this.client = new Stripe(payments.secretKey, { maxNetworkRetries: 2, timeout: 20_000 });
      this.secret = payments.webhookSecret;
      return;
    }
    this.secret = `whsec_${randomBytes(24).toString('base64url').replace(/[-_]/g, 'x')}`;
    this.fake = new PaymentServiceFake({
      apiKey: FAKE_API_KEY,
      webhookSecret: this.secret,
      webhookUrl: () => this.webhookUrl(),
      log: (line) => this.logger.log(line),
    });
    this.fakeUrl = await this.startFake(this.fake, payments.fakePort);
    this.logger.log(`Payment service fake on ${this.fakeUrl}: card payments use its test page, no real card is charged`);
    const { port } = new URL(this.fakeUrl);
    this.client = new Stripe(FAKE_API_KEY, { host: '127.0.0.1', port: Number(port), protocol: 'http', maxNetworkRetries: 1, timeout: 10_000 });
  }

  async onModuleDestroy(): Promise<void> {
    await this.fake?.stop();
    this.fake = null;
  }

  get stripe(): Stripe {
    if (!this.client) throw new Error('the payment service is not ready');
    return this.client;
  }

  get webhookSecret(): string {
    return this.secret;
  }

  /** The fake itself, for tests that replay its events; null with the real service. */
  get localFake(): PaymentServiceFake | null {
    return this.fake;
  }

  private async startFake(fake: PaymentServiceFake, port: number): Promise<string> {
    try {
      return await fake.start(port);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE' || port === 0) throw error;
      const url = await fake.start(0);
      this.logger.warn(`Payment fake: port ${port} is in use, listening on ${url} instead`);
      return url;
    }
  }

  /** This process's own webhook route, on the address it listens on (tests listen on a free port). */
  private webhookUrl(): string {
    const address = this.http.httpAdapter?.getHttpServer()?.address() as AddressInfo | string | null;
    const port = address && typeof address === 'object' ? address.port : this.config.port;
    return `http://127.0.0.1:${port}/api/payments/webhook`;
  }
}
