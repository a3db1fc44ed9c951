import { Transform } from 'class-transformer';
import { applyDecorators } from '@nestjs/common';
import { IsISO8601, Matches } from 'class-validator';

/** Trims text fields; leaves anything else for the validators to refuse. */
export const Trim = () => Transform(({ value }) => (typeof value === 'string' ? value.trim() : value));

/** Query strings carry booleans as text. */
export const QueryBoolean = () => Transform(({ value }) => (value === 'true' || value === '1' ? true : value === 'false' || value === '0' ? false : value));

/** Today's date (UTC) as YYYY-MM-DD, the form `date` columns come back in. */
export function todayIso(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** A `date` column as YYYY-MM-DD whatever the driver hands back. */
export function dateOnly(value: string | Date | null): string | null {
  if (value === null) return null;
  return typeof value === 'string' ? value.slice(0, 10) : value.toISOString().slice(0, 10);
}

/** A calendar date, YYYY-MM-DD, that exists. */
export const IsDateOnly = (field: string) =>
  applyDecorators(
    Matches(/^\d{4}-\d{2}-\d{2}$/, { message: `${field} must be a date (YYYY-MM-DD)` }),
    IsISO8601({ strict: true }, { message: `${field} must be a date (YYYY-MM-DD)` }),
  );
