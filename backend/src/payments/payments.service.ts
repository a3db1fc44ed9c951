import { BadRequestException, ConflictException, Inject, Injectable, Logger, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, Repository } from 'typeorm';
import Stripe from 'stripe';
import type { ListResponse, PayInvoiceResponse, Payment as PaymentShape, PaymentStatus } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { InvoiceLedger } from '../invoices/invoice-ledger.writer.js';
import { PayableInvoiceReader } from '../invoices/payable-invoice.reader.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import type { ListQueryDto } from '../shared/list-query.dto.js';
import { paginate } from '../shared/paginate.js';
import { PaymentGateway } from './payment-gateway.js';
import { Payment } from './payment.entity.js';

/** Why a webhook was turned away: answered 400 and logged on one line. */
export class WebhookRefused extends BadRequestException {}

/** How old a signed event may be (the SDK's default tolerance): an older one is a replay from outside. */
const WEBHOOK_TOLERANCE_S = 300;

@Injectable()
export class PaymentsService {
  private readonly logger = new Logger('Payments');

  constructor(
    @InjectRepository(Payment) private readonly payments: Repository<Payment>,
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly gateway: PaymentGateway,
    private readonly ledger: InvoiceLedger,
    private readonly payable: PayableInvoiceReader,
    private readonly audit: AuditService,
  ) {}

  /**
   * Starts a card payment of what is owed on an invoice: a pending payment row, then a checkout session at the
   * payment service for that amount; the browser goes to the session's page. Nothing is owed → 409.
   */
  async pay(user: AuthUser, invoiceId: number): Promise<PayInvoiceResponse> {
    const invoice = await this.payable.payable(invoiceId, user);
    const payment = await this.dataSource.transaction(async (manager) => {
      const row = manager.create(Payment, {
        invoiceId: invoice.id,
        organizationId: invoice.organizationId,
        status: 'pending' as PaymentStatus,
        amountMinor: invoice.balanceMinor,
        refundedMinor: 0,
        currency: invoice.currency,
        providerSessionId: `pending:${invoice.id}:${Date.now()}:${Math.random().toString(36).slice(2)}`,
        providerPaymentId: null,
        failureMessage: null,
        createdBy: user.id,
      });
      const saved = await manager.save(row);
      await this.audit.record(
        { actorId: user.id, entity: 'payment', entityId: saved.id, action: 'started', changes: { invoiceId: invoice.id, amountMinor: invoice.balanceMinor } },
        manager,
      );
      return saved;
    });
    const back = `${this.config.publicUrl}/portal/invoices/${invoice.id}`;
    let session: Stripe.Checkout.Session;
    try {
      session = await this.gateway.stripe.checkout.sessions.create(
        {
          mode: 'payment',
          client_reference_id: `invoice-${invoice.id}`,
          line_items: [
            {
              quantity: 1,
              price_data: { currency: invoice.currency.toLowerCase(), unit_amount: invoice.balanceMinor, product_data: { name: `Invoice ${invoice.number}` } },
            },
          ],
          metadata: { paymentId: String(payment.id), invoiceId: String(invoice.id), invoiceNumber: invoice.number ?? '' },
          payment_intent_data: { metadata: { paymentId: String(payment.id), invoiceId: String(invoice.id) } },
          success_url: `${back}?payment=done`,
          cancel_url: `${back}?payment=cancelled`,
        },
        { idempotencyKey: `kc-pay-${payment.id}` },
      );
    } catch (error) {
      await this.payments.update(payment.id, {
        status: 'failed',
        failureMessage: `the payment service refused to start: ${(error as Error).message}`.slice(0, 500),
      });
      throw new ConflictException(`the payment service could not start a payment: ${(error as Error).message}`);
    }
    await this.payments.update(payment.id, { providerSessionId: session.id });
    if (!session.url) throw new ConflictException('the payment service gave no payment page');
    return { paymentId: payment.id, url: session.url };
  }

  async list(user: AuthUser, query: ListQueryDto & { invoiceId?: number }): Promise<ListResponse<PaymentShape>> {
    const qb = this.payments.createQueryBuilder('p');
    const scope = organizationScope(user);
    if (scope !== null) qb.andWhere('p.organizationId = :scope', { scope });
    if (query.invoiceId !== undefined) qb.andWhere('p.invoiceId = :invoiceId', { invoiceId: query.invoiceId });
    return paginate(qb, query, { createdAt: 'p.createdAt', amountMinor: 'p.amountMinor', status: 'p.status' }, '-createdAt', (p) => this.toShape(p));
  }

  /**
   * Refunds all or part of a card payment through the payment service and records it with a credit note of the
   * same amount, in one transaction that holds the payment's row (so two refunds at once cannot both take the
   * last of it). The service's refund is asked with an idempotency key made of the payment and what it had
   * refunded before, so a retry after a lost answer never refunds twice.
   */
  async refund(user: AuthUser, paymentId: number, amountMinor: number, reason: string): Promise<PaymentShape> {
    return this.dataSource.transaction(async (manager) => {
      const payment = await manager.findOne(Payment, { where: { id: paymentId }, lock: { mode: 'pessimistic_write' } });
      if (!payment) throw new NotFoundException(`payment ${paymentId} not found`);
      if (payment.status !== 'succeeded' && payment.status !== 'part_refunded') {
        throw new ConflictException(`payment ${paymentId} is ${payment.status}: only a payment taken can be refunded`);
      }
      const left = payment.amountMinor - payment.refundedMinor;
      if (amountMinor > left) throw new ConflictException(`a refund of ${amountMinor} is more than the ${left} left on payment ${paymentId}`);
      let refund: Stripe.Refund;
      try {
        refund = await this.gateway.stripe.refunds.create(
          {
            payment_intent: payment.providerPaymentId ?? undefined,
            amount: amountMinor,
            reason: 'requested_by_customer',
            metadata: { paymentId: String(payment.id) },
          },
          { idempotencyKey: `kc-refund-${payment.id}-${payment.refundedMinor}-${amountMinor}` },
        );
      } catch (error) {
        throw new ConflictException(`the payment service refused the refund: ${(error as Error).message}`);
      }
      if (refund.status === 'failed' || refund.status === 'canceled') throw new ConflictException(`the payment service did not refund: ${refund.status}`);
      await this.applyRefund(manager, payment, amountMinor, reason, user.id, refund.id);
      return this.toShape(payment);
    });
  }

  /**
   * A webhook from the payment service: the signature is checked on the exact bytes received (forged or older
   * than five minutes → 400 and one log line), then the event is applied once, in one transaction with its id's
   * row in payment_events (a replay finds the row and changes nothing).
   */
  async webhook(rawBody: Buffer | undefined, signature: string | undefined): Promise<{ received: true; applied: boolean }> {
    if (!rawBody || !signature) return this.refuse('no body or no Stripe-Signature header');
    let event: Stripe.Event;
    try {
      event = this.gateway.stripe.webhooks.constructEvent(rawBody, signature, this.gateway.webhookSecret, WEBHOOK_TOLERANCE_S);
    } catch (error) {
      return this.refuse(`signature not valid (${(error as Error).message.split('\n')[0]})`);
    }
    return this.dataSource.transaction(async (manager) => {
      const inserted = await manager.query('INSERT IGNORE INTO payment_events (event_id, type, outcome) VALUES (?, ?, ?)', [event.id, event.type, 'received']);
      if ((inserted as { affectedRows: number }).affectedRows === 0) {
        this.logger.log(`payment webhook ${event.id} (${event.type}) seen before: nothing changed`);
        return { received: true as const, applied: false };
      }
      const { paymentId, outcome } = await this.apply(manager, event);
      await manager.query('UPDATE payment_events SET payment_id = ?, outcome = ? WHERE event_id = ?', [paymentId, outcome.slice(0, 500), event.id]);
      this.logger.log(`payment webhook ${event.id} (${event.type}): ${outcome}`);
      return { received: true as const, applied: true };
    });
  }

  private refuse(why: string): never {
    this.logger.warn(`payment webhook refused: ${why}`);
    throw new WebhookRefused(`payment webhook refused: ${why}`);
  }

  private async apply(manager: EntityManager, event: Stripe.Event): Promise<{ paymentId: number | null; outcome: string }> {
    switch (event.type) {
      case 'checkout.session.completed':
        return this.sessionCompleted(manager, event.data.object);
      case 'payment_intent.payment_failed':
        return this.paymentFailed(manager, event.data.object);
      case 'charge.refunded':
        return this.chargeRefunded(manager, event.data.object);
      default:
        return { paymentId: null, outcome: `ignored: Kilocycle does not act on ${event.type}` };
    }
  }

  private async sessionCompleted(manager: EntityManager, session: Stripe.Checkout.Session): Promise<{ paymentId: number | null; outcome: string }> {
    const payment = await manager.findOne(Payment, { where: { providerSessionId: session.id }, lock: { mode: 'pessimistic_write' } });
    if (!payment) return this.setAside(`no payment of ours has session ${session.id}`);
    if (session.payment_status !== 'paid') return { paymentId: payment.id, outcome: `session completed unpaid (${session.payment_status}): nothing recorded` };
    if (payment.status === 'succeeded' || payment.status === 'part_refunded' || payment.status === 'refunded') {
      return { paymentId: payment.id, outcome: 'already recorded as paid' };
    }
    // The amount and currency must be the ones we asked for: a mismatch is never booked against the invoice.
    if (session.amount_total !== payment.amountMinor || (session.currency ?? '').toUpperCase() !== payment.currency) {
      const why = `amount or currency differ from payment ${payment.id}: got ${session.amount_total} ${session.currency}, asked ${payment.amountMinor} ${payment.currency}`;
      this.logger.error(`payment webhook set aside: ${why}`);
      return { paymentId: payment.id, outcome: `set aside: ${why}` };
    }
    payment.status = 'succeeded';
    payment.providerPaymentId = typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null);
    payment.failureMessage = null;
    await manager.save(payment);
    await this.ledger.recordPayment(payment.invoiceId, payment.amountMinor, payment.currency, manager, { paymentId: payment.id });
    await this.audit.record(
      {
        actorId: null,
        entity: 'payment',
        entityId: payment.id,
        action: 'succeeded',
        changes: { amountMinor: payment.amountMinor, providerPaymentId: payment.providerPaymentId },
      },
      manager,
    );
    return { paymentId: payment.id, outcome: `payment ${payment.id} of ${payment.amountMinor} recorded on invoice ${payment.invoiceId}` };
  }

  private async paymentFailed(manager: EntityManager, intent: Stripe.PaymentIntent): Promise<{ paymentId: number | null; outcome: string }> {
    const paymentId = Number(intent.metadata?.paymentId);
    const payment = Number.isInteger(paymentId) ? await manager.findOne(Payment, { where: { id: paymentId }, lock: { mode: 'pessimistic_write' } }) : null;
    if (!payment) return this.setAside(`no payment of ours for payment intent ${intent.id}`);
    if (payment.status !== 'pending' && payment.status !== 'failed')
      return { paymentId: payment.id, outcome: `payment already ${payment.status}: failure ignored` };
    const error = intent.last_payment_error;
    payment.status = 'failed';
    payment.failureMessage = (error?.message ?? error?.decline_code ?? error?.code ?? 'the card was refused').slice(0, 500);
    await manager.save(payment);
    await this.audit.record(
      {
        actorId: null,
        entity: 'payment',
        entityId: payment.id,
        action: 'failed',
        changes: { code: error?.code ?? null, declineCode: error?.decline_code ?? null },
      },
      manager,
    );
    return { paymentId: payment.id, outcome: `card refused on payment ${payment.id} (${error?.decline_code ?? error?.code ?? 'no code'}): invoice unchanged` };
  }

  /** A refund made at the service (or the echo of ours): only what our records lack is booked, with its credit note. */
  private async chargeRefunded(manager: EntityManager, charge: Stripe.Charge): Promise<{ paymentId: number | null; outcome: string }> {
    const intentId = typeof charge.payment_intent === 'string' ? charge.payment_intent : (charge.payment_intent?.id ?? null);
    const payment = intentId ? await manager.findOne(Payment, { where: { providerPaymentId: intentId }, lock: { mode: 'pessimistic_write' } }) : null;
    if (!payment) return this.setAside(`no payment of ours for charge ${charge.id}`);
    const missing = charge.amount_refunded - payment.refundedMinor;
    if (missing <= 0) return { paymentId: payment.id, outcome: `refunds already recorded (${payment.refundedMinor})` };
    if (missing > payment.amountMinor - payment.refundedMinor) return this.setAside(`charge ${charge.id} refunded more than payment ${payment.id} holds`);
    await this.applyRefund(manager, payment, missing, 'Refund made at the payment service', null, null);
    return { paymentId: payment.id, outcome: `refund of ${missing} made at the service recorded on payment ${payment.id}` };
  }

  private async applyRefund(
    manager: EntityManager,
    payment: Payment,
    amountMinor: number,
    reason: string,
    actorId: number | null,
    refundId: string | null,
  ): Promise<void> {
    payment.refundedMinor += amountMinor;
    payment.status = payment.refundedMinor >= payment.amountMinor ? 'refunded' : 'part_refunded';
    await manager.save(payment);
    const creditNote = await this.ledger.recordRefund(payment.invoiceId, amountMinor, reason, payment.id, manager, { actorId });
    await this.audit.record(
      { actorId, entity: 'payment', entityId: payment.id, action: 'refunded', changes: { amountMinor, reason, refundId, creditNote: creditNote.number } },
      manager,
    );
  }

  private setAside(why: string): { paymentId: null; outcome: string } {
    this.logger.warn(`payment webhook set aside: ${why}`);
    return { paymentId: null, outcome: `set aside: ${why}` };
  }

  async one(user: AuthUser, id: number): Promise<PaymentShape> {
    const scope = organizationScope(user);
    const payment = await this.payments.findOne({ where: scope === null ? { id } : { id, organizationId: scope } });
    if (!payment) throw new NotFoundException(`payment ${id} not found`);
    return this.toShape(payment);
  }

  private toShape(p: Payment): PaymentShape {
    return {
      id: p.id,
      invoiceId: p.invoiceId,
      invoiceNumber: null,
      organizationId: p.organizationId,
      status: p.status,
      amountMinor: p.amountMinor,
      refundedMinor: p.refundedMinor,
      currency: p.currency,
      providerSessionId: p.providerSessionId,
      providerPaymentId: p.providerPaymentId,
      failureMessage: p.failureMessage,
      createdAt: p.createdAt.toISOString(),
      updatedAt: p.updatedAt.toISOString(),
    };
  }
}
