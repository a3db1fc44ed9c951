/**
 * The objects the payment service fake keeps and sends. Each holds a subset of the fields of the `stripe`
 * SDK's type of the same name, every field typed as the SDK declares it; ids of related objects are kept
 * as ids (the API expands them on request).
 */
import type Stripe from 'stripe';

export type FakeCheckoutSession = Pick<
  Stripe.Checkout.Session,
  | 'id'
  | 'object'
  | 'amount_subtotal'
  | 'amount_total'
  | 'cancel_url'
  | 'client_reference_id'
  | 'created'
  | 'currency'
  | 'customer_email'
  | 'expires_at'
  | 'livemode'
  | 'metadata'
  | 'mode'
  | 'payment_method_types'
  | 'payment_status'
  | 'status'
  | 'success_url'
  | 'url'
> & { payment_intent: string | null };

export type FakePaymentIntent = Pick<
  Stripe.PaymentIntent,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_capturable'
  | 'amount_received'
  | 'capture_method'
  | 'confirmation_method'
  | 'created'
  | 'currency'
  | 'description'
  | 'last_payment_error'
  | 'livemode'
  | 'metadata'
  | 'payment_method'
  | 'payment_method_types'
  | 'status'
> & { latest_charge: string | null };

export type FakeCharge = Pick<
  Stripe.Charge,
  | 'id'
  | 'object'
  | 'amount'
  | 'amount_captured'
  | 'amount_refunded'
  | 'billing_details'
  | 'captured'
  | 'created'
  | 'currency'
  | 'description'
  | 'failure_code'
  | 'failure_message'
  | 'livemode'
  | 'metadata'
  | 'paid'
  | 'payment_method'
  | 'refunded'
  | 'status'
> & { payment_intent: string };

export type FakeRefund = Pick<Stripe.Refund, 'id' | 'object' | 'amount' | 'created' | 'currency' | 'metadata' | 'reason' | 'status'> & {
  charge: string;
  payment_intent: string;
};

export type EventObjects = {
  'checkout.session.completed': FakeCheckoutSession;
  'payment_intent.payment_failed': FakePaymentIntent;
  'charge.refunded': FakeCharge;
};
export type FakeEventType = keyof EventObjects;
export type FakeEvent = {
  [T in FakeEventType]: Pick<Stripe.EventBase, 'id' | 'object' | 'api_version' | 'created' | 'livemode' | 'pending_webhooks' | 'request'> & {
    type: T;
    data: { object: EventObjects[T] };
  };
}[FakeEventType];

/** One try at delivering one event: the app's HTTP status, or null and the error when it could not be reached. */
export type DeliveryAttempt = { eventId: string; type: FakeEventType; attempt: number; url: string; status: number | null; error?: string; at: number };
