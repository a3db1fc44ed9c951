import { parseNumber } from '@kilocycle/common/units';
import { formatMoney, formatQuantityMilli, formatRatePercent, parseMoney, parseQuantityMilli, parseRatePercent } from '@kilocycle/common/money';
import { z } from 'zod';

/** Pieces the feature schemas are built from. Form fields hold strings; these turn them into the request's values. */

const tooLong = (max: number) => `At most ${max} characters`;

/** Text that must be given: trimmed, at least one character, at most `max`. */
export const requiredText = (max: number, emptyMessage: string) => z.string().trim().min(1, emptyMessage).max(max, tooLong(max));

/** Text that may be left empty: trimmed; empty becomes null. */
export const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, tooLong(max))
    .transform((text) => text || null);

/** A choice of a record by id in a select: '' is none (null). */
export const optionalId = z.string().transform((id) => (id === '' ? null : Number(id)));

/** A chosen record's id that must be given. */
export const requiredId = (message: string) =>
  z
    .string()
    .refine((id) => id !== '', message)
    .transform(Number);

type NumberRule = { min?: number; max?: number; integer?: boolean; message: string; /** Accept "21,5" for 21.5. */ decimalComma?: boolean };

const toNumber = (text: string, rule: NumberRule) => Number(rule.decimalComma ? text.replace(',', '.') : text);

function checkNumber(text: string, rule: NumberRule) {
  const value = toNumber(text, rule);
  return (
    Number.isFinite(value) &&
    (rule.integer !== true || Number.isInteger(value)) &&
    (rule.min === undefined || value >= rule.min) &&
    (rule.max === undefined || value <= rule.max)
  );
}

/** A number typed in a text field, within the rule's bounds; `message` when it is not. */
export const requiredNumber = (rule: NumberRule) =>
  z
    .string()
    .trim()
    .refine((text) => text !== '' && checkNumber(text, rule), rule.message)
    .transform((text) => toNumber(text, rule));

/** A number that may be left empty (null). */
export const optionalNumber = (rule: NumberRule) =>
  z
    .string()
    .trim()
    .refine((text) => text === '' || checkNumber(text, rule), rule.message)
    .transform((text) => (text === '' ? null : toNumber(text, rule)));

/**
 * A number as people type it (common's `parseNumber`: spaces, a decimal comma), then `check` (a message or null).
 * The parser's own message is shown when the text is not a number.
 */
export const typedNumber = (check: (value: number) => string | null) =>
  z.string().transform((text, context) => {
    let value: number;
    try {
      value = parseNumber(text);
    } catch (error) {
      context.addIssue({ code: 'custom', message: error instanceof Error ? error.message : 'Not a number' });
      return z.NEVER;
    }
    const problem = check(value);
    if (problem) context.addIssue({ code: 'custom', message: problem });
    return value;
  });

/** A date typed in a date field (yyyy-mm-dd). */
export const isoDate = (message: string) => z.string().regex(/^\d{4}-\d{2}-\d{2}$/, message);

/** A figure read exactly by one of common's money parsers (text, never floating point), then `check`. */
const exactFigure = (parse: (text: string) => number, check: (value: number) => string | null) =>
  z.string().transform((text, context) => {
    let value: number;
    try {
      value = parse(text);
    } catch (error) {
      context.addIssue({ code: 'custom', message: text.trim() === '' ? 'Required' : error instanceof Error ? error.message : 'Not a figure' });
      return z.NEVER;
    }
    const problem = check(value);
    if (problem) context.addIssue({ code: 'custom', message: problem });
    return value;
  });

/** Money as typed ("1,234.50", "85") in the currency's minor units, at most `maxMinor`. */
export const typedMoney = (currency: string, maxMinor: number) =>
  exactFigure(
    (text) => parseMoney(text, currency),
    (minor) => (minor > maxMinor ? `At most ${formatMoney(maxMinor, currency)}` : null),
  );

/** A quantity as typed ("1.5") in thousandths, above zero and at most `maxMilli`. */
export const typedQuantity = (maxMilli: number) =>
  exactFigure(parseQuantityMilli, (milli) => (milli <= 0 ? 'More than zero' : milli > maxMilli ? `At most ${formatQuantityMilli(maxMilli)}` : null));

/** A percentage as typed ("20", "17.5") in basis points, at most `maxBasisPoints`. */
export const typedRate = (maxBasisPoints: number) =>
  exactFigure(parseRatePercent, (bp) => (bp > maxBasisPoints ? `At most ${formatRatePercent(maxBasisPoints)}` : null));
