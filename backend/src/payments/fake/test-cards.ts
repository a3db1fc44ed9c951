/**
 * The card numbers the fake's payment page accepts: the payment service's published test numbers, each
 * with the outcome the service gives it. Any other number is refused with a hint to use one of these.
 */
export type CardOutcome =
  | { kind: 'succeeds' }
  | { kind: 'needs-confirmation' }
  | { kind: 'refused'; code: 'card_declined'; declineCode: 'generic_decline' | 'insufficient_funds'; message: string };

export const TEST_CARDS: ReadonlyArray<{ number: string; outcome: CardOutcome; label: string }> = [
  { number: '4242424242424242', outcome: { kind: 'succeeds' }, label: 'succeeds' },
  {
    number: '4000000000000002',
    outcome: { kind: 'refused', code: 'card_declined', declineCode: 'generic_decline', message: 'Your card was declined.' },
    label: 'is declined',
  },
  {
    number: '4000000000009995',
    outcome: { kind: 'refused', code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.' },
    label: 'is declined for insufficient funds',
  },
  { number: '4000002500003155', outcome: { kind: 'needs-confirmation' }, label: 'asks for an extra confirmation step' },
];

/** The message and code when the customer fails the extra confirmation step. */
export const AUTHENTICATION_FAILED = {
  code: 'payment_intent_authentication_failure',
  message: 'We could not confirm this payment with your card issuer. Try again or use another card.',
} as const;

/** Digits only: spaces (and dashes) typed between the groups are allowed. */
export function normaliseCardNumber(typed: string): string {
  return typed.replace(/[\s-]/g, '');
}

export function cardOutcome(typed: string): CardOutcome | null {
  const digits = normaliseCardNumber(typed);
  return TEST_CARDS.find((card) => card.number === digits)?.outcome ?? null;
}

/** Groups of four, as printed on a card. */
export function groupedCardNumber(digits: string): string {
  return digits.replace(/(\d{4})(?=\d)/g, '$1 ');
}
