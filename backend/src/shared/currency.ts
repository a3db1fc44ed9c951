import { checkEnvironment } from '../config/env-schema.js';

/** The lab's one currency (KC_CURRENCY, default EUR): every amount is integer minor units of it. */
export function labCurrency(env: NodeJS.ProcessEnv = process.env): string {
  return checkEnvironment(env).values.KC_CURRENCY ?? 'EUR';
}
