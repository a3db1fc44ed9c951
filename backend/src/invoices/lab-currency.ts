import type { AppConfig } from '../config/config.module.js';

/**
 * The lab's one currency: AppConfig's `currency` (KC_CURRENCY, ISO 4217, default EUR, declared with the price
 * list's settings); EUR while the running config has none.
 */
export function labCurrency(config: AppConfig): string {
  return (config as AppConfig & { currency?: string }).currency ?? 'EUR';
}
