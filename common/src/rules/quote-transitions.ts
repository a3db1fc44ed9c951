import type { QuoteStatus } from '../types/billing.js';

/**
 * Why a quote in `from` cannot move to `to`, or null when it can. Draft → sent (by the lab); sent → accepted or
 * declined (by the client in the portal, or recorded by the lab); sent → expired (past its validity). Accepted,
 * declined and expired are final: a new quote is made instead.
 *
 * @example quoteTransitionRefusal('draft', 'accepted'); // => 'a draft quote must be sent before it can be accepted'
 */
export function quoteTransitionRefusal(from: QuoteStatus, to: QuoteStatus): string | null {
  if (from === 'draft' && to === 'sent') return null;
  if (from === 'sent' && (to === 'accepted' || to === 'declined' || to === 'expired')) return null;
  if (from === 'draft') return `a draft quote must be sent before it can be ${to}`;
  if (from === 'sent') return `a sent quote cannot go back to ${to}`;
  return `the quote is already ${from}; make a new quote instead`;
}
