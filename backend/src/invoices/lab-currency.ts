import type { AppConfig } from '../config/config.module.js';

/** The lab's one currency (KC_CURRENCY, ISO 4217). */
export function labCurrency(config: AppConfig): string {
  return config.currency;
}
