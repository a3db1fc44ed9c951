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
