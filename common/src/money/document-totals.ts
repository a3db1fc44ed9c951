import type { DocumentTotals } from '../types/billing.js';
import { MetrologyError } from '../math/metrology-error.js';
import { MONEY_LIMITS } from './money-limits.js';

/**
 * A document's totals: the sums of its lines' already rounded net and tax (no second rounding), and net and
 * tax per rate in ascending rate order, as printed under the lines.
 *
 * @example documentTotals([{ netMinor: 100, taxMinor: 20, rateBasisPoints: 2000 }]).grossMinor; // => 120
 * @throws {MetrologyError} 'bad_argument' for more than MONEY_LIMITS.maxLines lines or an amount that is not a whole number
 */
export function documentTotals(lines: readonly { netMinor: number; taxMinor: number; rateBasisPoints: number }[]): DocumentTotals {
  if (lines.length > MONEY_LIMITS.maxLines) {
    throw new MetrologyError('bad_argument', `documentTotals requires at most ${MONEY_LIMITS.maxLines} lines (got ${lines.length})`);
  }
  let netMinor = 0;
  let taxMinor = 0;
  const byRate = new Map<number, { rateBasisPoints: number; netMinor: number; taxMinor: number }>();
  for (const line of lines) {
    if (!Number.isSafeInteger(line.netMinor) || !Number.isSafeInteger(line.taxMinor) || !Number.isInteger(line.rateBasisPoints)) {
      throw new MetrologyError('bad_argument', 'documentTotals requires whole minor units and basis points on every line');
    }
    netMinor += line.netMinor;
    taxMinor += line.taxMinor;
    const group = byRate.get(line.rateBasisPoints) ?? { rateBasisPoints: line.rateBasisPoints, netMinor: 0, taxMinor: 0 };
    group.netMinor += line.netMinor;
    group.taxMinor += line.taxMinor;
    byRate.set(line.rateBasisPoints, group);
  }
  return { netMinor, taxMinor, grossMinor: netMinor + taxMinor, byRate: [...byRate.values()].sort((a, b) => a.rateBasisPoints - b.rateBasisPoints) };
}
