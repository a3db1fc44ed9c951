import type { ListQuery, ListResponse } from './list.js';

// Money is always an integer number of minor units (cents, pence) of the lab's one currency
// (KC_CURRENCY, an ISO 4217 code). Quantities are integer thousandths (1.5 h = 1500), tax rates
// integer basis points (20 % = 2000). The arithmetic is in common/src/money.

// ---- Price list ----

export const PRICE_UNITS = ['per_range', 'per_hour', 'per_job'] as const;
/** per range calibrated, per hour of study, or once per job. */
export type PriceUnit = (typeof PRICE_UNITS)[number];

export type PriceItem = {
  id: number;
  /** The lab's own service code, e.g. "CAL-RNG". Unique. */
  code: string;
  description: string;
  unit: PriceUnit;
  unitPriceMinor: number;
  /** Proposed on every new quote (per range: one per range of the instrument; per hour: the job's study hours, at least 1; per job: 1). */
  proposeOnQuotes: boolean;
  active: boolean;
  updatedAt: string;
};
export type CreatePriceItemRequest = Pick<PriceItem, 'code' | 'description' | 'unit' | 'unitPriceMinor'> & { proposeOnQuotes?: boolean };
export type UpdatePriceItemRequest = Partial<CreatePriceItemRequest> & { active?: boolean };
export type ListPriceItemsQuery = ListQuery & { active?: boolean };
/** GET /prices/items: the page of items, and the lab's currency (KC_CURRENCY) their prices are in, even when there are none yet. */
export type PriceItemsResponse = ListResponse<PriceItem> & { currency: string };

export type TaxRate = {
  id: number;
  /** e.g. "Standard rate". */
  name: string;
  rateBasisPoints: number;
  active: boolean;
};
export type CreateTaxRateRequest = Pick<TaxRate, 'name' | 'rateBasisPoints'>;
export type UpdateTaxRateRequest = Partial<CreateTaxRateRequest> & { active?: boolean };

export const PAYMENT_TERMS = ['pay_before_release', 'on_account'] as const;
/** Pay before the certificate is released to the customer, or on account with net days. */
export type PaymentTerms = (typeof PAYMENT_TERMS)[number];

/** A customer organisation's commercial terms. Organisations without a row get CUSTOMER_TERMS_DEFAULT. */
export type CustomerTerms = {
  organizationId: number;
  organizationName: string;
  /** The tax rate charged, or null when the customer is exempt. */
  taxRateId: number | null;
  taxRateName: string | null;
  taxRateBasisPoints: number | null;
  /** The customer's tax registration number, required when exempt. */
  taxRegistration: string | null;
  paymentTerms: PaymentTerms;
  /** Days from the invoice date to its due date (0 for pay before release). */
  netDays: number;
  /** Work on this customer's jobs starts only once a quote is accepted. */
  requiresQuote: boolean;
  updatedAt: string | null;
};
export type UpdateCustomerTermsRequest = {
  taxRateId: number | null;
  taxRegistration?: string | null;
  paymentTerms: PaymentTerms;
  netDays: number;
  requiresQuote: boolean;
};

// ---- Lines shared by quotes, invoices and credit notes ----

/** A line as the lead edits it. */
export type BillingLineInput = {
  priceItemId?: number | null;
  code?: string | null;
  description: string;
  unit: PriceUnit;
  quantityMilli: number;
  unitPriceMinor: number;
};
/** A stored line, with its amounts computed per line (common/src/money/line-amounts.ts). */
export type BillingLine = Required<BillingLineInput> & {
  position: number;
  taxRateBasisPoints: number;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
};
export type DocumentTotals = {
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  /** Net and tax per tax rate, as printed under the lines. */
  byRate: { rateBasisPoints: number; netMinor: number; taxMinor: number }[];
};

// ---- Quotes ----

export const QUOTE_STATUSES = ['draft', 'sent', 'accepted', 'declined', 'expired'] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];
export const ACCEPTANCE_CHANNELS = ['portal', 'phone', 'email', 'in_person'] as const;
export type AcceptanceChannel = (typeof ACCEPTANCE_CHANNELS)[number];

export type Quote = {
  id: number;
  /** "Q-000123", given when the quote is created. */
  number: string;
  jobId: number;
  jobNumber: string;
  organizationId: number;
  organizationName: string;
  status: QuoteStatus;
  currency: string;
  /** The customer's tax treatment when the lines were last priced. */
  taxExempt: boolean;
  taxRegistration: string | null;
  lines: BillingLine[];
  totals: DocumentTotals;
  validityDays: number;
  notes: string | null;
  sentAt: string | null;
  /** Last day the customer may accept (sent date + validity days). */
  validUntil: string | null;
  decidedAt: string | null;
  decidedByName: string | null;
  acceptanceChannel: AcceptanceChannel | null;
  decisionNote: string | null;
  createdAt: string;
  updatedAt: string;
};
export type UpdateQuoteRequest = { lines?: BillingLineInput[]; validityDays?: number; notes?: string | null };
/** A client accepts in the portal (no channel); the lab records an acceptance given another way, with a note. */
export type AcceptQuoteRequest = { channel?: AcceptanceChannel; note?: string | null };
export type DeclineQuoteRequest = { note?: string | null };
export type ListQuotesQuery = ListQuery & { jobId?: number; organizationId?: number; status?: QuoteStatus };

// ---- Invoices and credit notes ----

export const INVOICE_STATUSES = ['draft', 'issued', 'part_paid', 'paid', 'credited'] as const;
/** Stored state; "overdue" is issued or part paid past the due date with a balance left (Invoice.overdue). */
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number];

export type CreditNote = {
  id: number;
  /** "CN-000012", from its own gap-free sequence. */
  number: string;
  invoiceId: number;
  invoiceNumber: string | null;
  organizationId: number;
  reason: string;
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  /** The refund it records, when it came from a card refund. */
  paymentId: number | null;
  issuedAt: string;
  issuedByName: string | null;
};
export type CreateCreditNoteRequest = { amountMinor: number; reason: string };

export type Invoice = {
  id: number;
  /** Null while draft; "INV-000123" from the gap-free sequence when issued. */
  number: string | null;
  jobId: number;
  jobNumber: string;
  organizationId: number;
  organizationName: string;
  quoteId: number | null;
  status: InvoiceStatus;
  currency: string;
  taxExempt: boolean;
  taxRegistration: string | null;
  paymentTerms: PaymentTerms;
  lines: BillingLine[];
  totals: DocumentTotals;
  issuedAt: string | null;
  /** Issue date + net days (YYYY-MM-DD). */
  dueDate: string | null;
  paidMinor: number;
  refundedMinor: number;
  creditedMinor: number;
  /** gross − credited − (paid − refunded). */
  balanceMinor: number;
  overdue: boolean;
  creditNotes: CreditNote[];
  createdAt: string;
  updatedAt: string;
};
export type UpdateInvoiceRequest = { lines: BillingLineInput[] };
export type ListInvoicesQuery = ListQuery & { jobId?: number; organizationId?: number; status?: InvoiceStatus; overdue?: boolean };

export type StatementLine = {
  date: string;
  kind: 'invoice' | 'payment' | 'refund' | 'credit_note';
  reference: string;
  invoiceNumber: string | null;
  /** Positive raises what the customer owes, negative lowers it. */
  amountMinor: number;
  balanceMinor: number;
};
export type Statement = {
  organizationId: number;
  organizationName: string;
  currency: string;
  asOf: string;
  openMinor: number;
  overdueMinor: number;
  paidMinor: number;
  creditMinor: number;
  invoices: Invoice[];
  lines: StatementLine[];
};

// ---- Payments ----

export const PAYMENT_STATUSES = ['pending', 'succeeded', 'failed', 'refunded', 'part_refunded'] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

export type Payment = {
  id: number;
  invoiceId: number;
  invoiceNumber: string | null;
  organizationId: number;
  status: PaymentStatus;
  amountMinor: number;
  refundedMinor: number;
  currency: string;
  /** The payment service's ids (checkout session, payment intent). */
  providerSessionId: string;
  providerPaymentId: string | null;
  /** Why a card was refused, in the service's words. */
  failureMessage: string | null;
  createdAt: string;
  updatedAt: string;
};
export type PayInvoiceResponse = { paymentId: number; url: string };
export type RefundPaymentRequest = { amountMinor: number; reason: string };

// ---- Certificate release ----

/** Whether a client may download a job's certificate now, and if not why (shown in the portal). */
export type CertificateRelease = {
  released: boolean;
  /** Null when released. */
  heldReason: string | null;
  /** The invoice that releases it when paid. */
  invoiceId: number | null;
};
