import type { Role } from '../types/auth.js';

/** Roles that set prices, tax rates and customer terms, and make, send, issue, credit and refund quotes and invoices. */
export const BILLING_ROLES: readonly Role[] = ['admin', 'lead'];
