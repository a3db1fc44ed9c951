import type { QuoteStatus } from '@kilocycle/common/types';
import { dateOnly } from '../shared/dto-helpers.js';

/** Today's date in UTC, YYYY-MM-DD (validity is counted in whole UTC days). */
export function utcDay(now: Date): string {
  return now.toISOString().slice(0, 10);
}

/** A quote's status as read now: a sent quote past its last valid day reads as expired (it is stored so when next touched). */
export function effectiveStatus(quote: { status: QuoteStatus; validUntil: string | Date | null }, now: Date): QuoteStatus {
  const last = dateOnly(quote.validUntil);
  if (quote.status === 'sent' && last !== null && last < utcDay(now)) return 'expired';
  return quote.status;
}
