import type { BillingLine, Certificate, DocumentTotals, Invoice, PriceItem, Quote } from '@kilocycle/common/types';

// Figures here are whatever the server is pretended to have computed; tests compare the page with them, worked
// by hand where a test depends on the arithmetic.

let sequence = 500;
const nextId = () => ++sequence;

/** Two ranges at 85.00 and 20 % tax: net 170.00, tax 34.00, total 204.00. */
export function createBillingLine(overrides: Partial<BillingLine> = {}): BillingLine {
  return {
    position: 1,
    priceItemId: 1,
    code: 'CAL-RANGE',
    description: 'Calibration of one range',
    unit: 'per_range',
    quantityMilli: 2000,
    unitPriceMinor: 8500,
    taxRateBasisPoints: 2000,
    netMinor: 17000,
    taxMinor: 3400,
    grossMinor: 20400,
    ...overrides,
  };
}

export function createTotals(overrides: Partial<DocumentTotals> = {}): DocumentTotals {
  return { netMinor: 17000, taxMinor: 3400, grossMinor: 20400, byRate: [{ rateBasisPoints: 2000, netMinor: 17000, taxMinor: 3400 }], ...overrides };
}

export function createQuote(overrides: Partial<Quote> = {}): Quote {
  const id = overrides.id ?? nextId();
  return {
    id,
    number: `Q-${String(id).padStart(6, '0')}`,
    jobId: 11,
    jobNumber: 'J-2025-0011',
    organizationId: 2,
    organizationName: 'Northgate Radio Club',
    status: 'draft',
    currency: 'EUR',
    taxExempt: false,
    taxRegistration: null,
    lines: [createBillingLine()],
    totals: createTotals(),
    validityDays: 30,
    notes: null,
    sentAt: null,
    validUntil: null,
    decidedAt: null,
    decidedByName: null,
    acceptanceChannel: null,
    decisionNote: null,
    createdAt: '2025-03-03T09:00:00.000Z',
    updatedAt: '2025-03-03T09:00:00.000Z',
    ...overrides,
  };
}

export function createInvoice(overrides: Partial<Invoice> = {}): Invoice {
  const id = overrides.id ?? nextId();
  return {
    id,
    number: `INV-${String(id).padStart(6, '0')}`,
    jobId: 11,
    jobNumber: 'J-2025-0011',
    organizationId: 2,
    organizationName: 'Northgate Radio Club',
    quoteId: null,
    status: 'issued',
    currency: 'EUR',
    taxExempt: false,
    taxRegistration: null,
    paymentTerms: 'pay_before_release',
    lines: [createBillingLine()],
    totals: createTotals(),
    issuedAt: '2025-03-10T10:00:00.000Z',
    dueDate: '2025-03-10',
    paidMinor: 0,
    refundedMinor: 0,
    creditedMinor: 0,
    balanceMinor: 20400,
    overdue: false,
    creditNotes: [],
    createdAt: '2025-03-10T09:00:00.000Z',
    updatedAt: '2025-03-10T10:00:00.000Z',
    ...overrides,
  };
}

export function createPriceItem(overrides: Partial<PriceItem> = {}): PriceItem {
  const id = overrides.id ?? nextId();
  return {
    id,
    code: `SVC-${id}`,
    description: 'Calibration of one range',
    unit: 'per_range',
    unitPriceMinor: 8500,
    proposeOnQuotes: true,
    active: true,
    updatedAt: '2025-02-01T09:00:00.000Z',
    ...overrides,
  };
}

export function createCertificate(overrides: Partial<Certificate> = {}): Certificate {
  const id = overrides.id ?? nextId();
  return {
    id,
    number: `KC-2025-${String(id).padStart(4, '0')}`,
    revision: 1,
    status: 'issued',
    jobId: 11,
    jobNumber: 'J-2025-0011',
    organizationId: 2,
    organizationName: 'Northgate Radio Club',
    instrumentId: 4,
    instrumentLabel: 'Heathmere GD-2 dip meter',
    signedById: 3,
    signedByName: 'Rowan Vale',
    signedAt: '2025-03-10T09:30:00.000Z',
    signingMeaning: 'Approved and issued',
    issuedAt: '2025-03-10T09:30:00.000Z',
    sha256: 'ab'.repeat(32),
    pdfUrl: `/api/certificates/${id}/pdf`,
    verifyUrl: `/verify/KC-2025-${String(id).padStart(4, '0')}`,
    replacesRevision: null,
    amendmentReason: null,
    withdrawnReason: null,
    withdrawnAt: null,
    supersededAt: null,
    decision: 'pass',
    asFoundDecision: 'pass',
    ...overrides,
  };
}
