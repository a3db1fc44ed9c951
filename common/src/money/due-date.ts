import { MetrologyError } from '../math/metrology-error.js';

/**
 * The due date: the issue date plus the net days, in calendar days (YYYY-MM-DD, no time zone involved).
 *
 * @example dueDate('2026-11-20', 30); // => '2026-12-20'
 * @throws {MetrologyError} 'bad_argument' for a date that is not YYYY-MM-DD or days outside 0 … 365
 */
export function dueDate(issueDate: string, netDays: number): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(issueDate);
  const ms = match ? Date.UTC(Number(match[1]), Number(match[2]) - 1, Number(match[3])) : NaN;
  if (!match || Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== issueDate) {
    throw new MetrologyError('bad_argument', `dueDate requires a date as YYYY-MM-DD (got ${JSON.stringify(issueDate)})`);
  }
  if (!Number.isInteger(netDays) || netDays < 0 || netDays > 365) {
    throw new MetrologyError('bad_argument', `dueDate requires net days from 0 to 365 (got ${String(netDays)})`);
  }
  return new Date(ms + netDays * 86_400_000).toISOString().slice(0, 10);
}
