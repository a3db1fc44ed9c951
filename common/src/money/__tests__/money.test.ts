import { MetrologyError } from '../../math/metrology-error.js';
import { creditSplit, divideRounded, documentTotals, dueDate, formatMoney, invoiceBalance, issuedInvoiceStatus, lineAmounts, parseMoney } from '../index.js';

// Every expected figure below is worked by hand in the comment beside it (pen-and-paper arithmetic, not the
// code under test). Rounding rule: per line, halves away from zero (common practice for invoices, no
// published source; the rule is ours and printed in the README).

describe('divideRounded', () => {
  it('should round halves away from zero and everything else to the nearest integer', () => {
    expect(divideRounded(5, 2)).toBe(3); // 2.5 → 3
    expect(divideRounded(-5, 2)).toBe(-3); // −2.5 → −3
    expect(divideRounded(7, 3)).toBe(2); // 2.33 → 2
    expect(divideRounded(8, 3)).toBe(3); // 2.67 → 3
    expect(divideRounded(10n ** 17n, 1000)).toBe(10 ** 14); // exact beyond 2^53 in the product
  });
  it('should refuse a zero divisor', () => {
    expect(() => divideRounded(1, 0)).toThrow(MetrologyError);
  });
});

describe('lineAmounts', () => {
  it('should price 1.5 hours at 49.99 with 20 % tax, rounding each figure once', () => {
    // net = 1.5 × 49.99 = 74.985 → 74.99 (7499); tax = 20 % × 74.99 = 14.998 → 15.00 (1500); gross 89.99
    expect(lineAmounts(1500, 4999, 2000)).toEqual({ netMinor: 7499, taxMinor: 1500, grossMinor: 8999 });
  });
  it('should price three ranges at 85.00 with 17.5 % tax', () => {
    // net = 3 × 85.00 = 255.00; tax = 17.5 % × 255.00 = 44.625 → 44.63; gross 299.63
    expect(lineAmounts(3000, 8500, 1750)).toEqual({ netMinor: 25500, taxMinor: 4463, grossMinor: 29963 });
  });
  it('should charge no tax to an exempt customer', () => {
    expect(lineAmounts(1000, 12000, 0)).toEqual({ netMinor: 12000, taxMinor: 0, grossMinor: 12000 });
  });
  it('should round a half minor unit of net up before taxing it', () => {
    // net = 0.5 × 0.05 = 0.025 → 0.03 (3); tax = 20 % × 0.03 = 0.006 → 0.01 (1)
    expect(lineAmounts(500, 5, 2000)).toEqual({ netMinor: 3, taxMinor: 1, grossMinor: 4 });
  });
  it('should refuse negative, fractional and oversized inputs with the field named', () => {
    expect(() => lineAmounts(-1000, 100, 2000)).toThrow(/quantityMilli/);
    expect(() => lineAmounts(1000, 10.5, 2000)).toThrow(/unitPriceMinor/);
    expect(() => lineAmounts(1000, 100, 10_001)).toThrow(/rateBasisPoints/);
  });
});

describe('documentTotals', () => {
  it('should add the rounded lines, so per-line rounding can differ from rounding the total', () => {
    // three lines of 3.33 at 20 %: each tax 0.666 → 0.67, so the tax is 2.01 (on the total 9.99 it would be 1.998 → 2.00)
    const line = { ...lineAmounts(1000, 333, 2000), rateBasisPoints: 2000 };
    const totals = documentTotals([line, line, line]);
    expect(totals).toEqual({ netMinor: 999, taxMinor: 201, grossMinor: 1200, byRate: [{ rateBasisPoints: 2000, netMinor: 999, taxMinor: 201 }] });
  });
  it('should group net and tax by rate in ascending order', () => {
    // 100.00 at 20 % (tax 20.00), 50.00 at 5 % (tax 2.50), 10.00 exempt
    const totals = documentTotals([
      { netMinor: 10000, taxMinor: 2000, rateBasisPoints: 2000 },
      { netMinor: 5000, taxMinor: 250, rateBasisPoints: 500 },
      { netMinor: 1000, taxMinor: 0, rateBasisPoints: 0 },
    ]);
    expect(totals.grossMinor).toBe(18250); // 160.00 + 22.50
    expect(totals.byRate.map((r) => r.rateBasisPoints)).toEqual([0, 500, 2000]);
  });
});

describe('creditSplit', () => {
  const invoice = { netMinor: 10000, taxMinor: 2000, grossMinor: 12000 };
  it('should take tax back in the invoice’s proportion', () => {
    // 50.00 of 120.00: tax = 20.00 × 50/120 = 8.333 → 8.33; net = 50.00 − 8.33 = 41.67
    expect(creditSplit(invoice, 5000)).toEqual({ netMinor: 4167, taxMinor: 833, grossMinor: 5000 });
    // the remaining 70.00: tax = 20.00 × 70/120 = 11.667 → 11.67; the two credits' tax adds to the invoice's 20.00
    expect(creditSplit(invoice, 7000, 5000)).toEqual({ netMinor: 5833, taxMinor: 1167, grossMinor: 7000 });
  });
  it('should give back exactly the invoice on a whole credit', () => {
    expect(creditSplit(invoice, 12000)).toEqual(invoice);
  });
  it('should refuse more than is left, zero and fractions', () => {
    expect(() => creditSplit(invoice, 7001, 5000)).toThrow(/more than the 7000 left/);
    expect(() => creditSplit(invoice, 0)).toThrow(/above zero/);
    expect(() => creditSplit(invoice, 1.5)).toThrow(MetrologyError);
  });
});

describe('invoiceBalance and issuedInvoiceStatus', () => {
  it('should follow an invoice from issued to paid and through a part refund', () => {
    const issued = { grossMinor: 12000, paidMinor: 0, refundedMinor: 0, creditedMinor: 0 };
    expect(invoiceBalance(issued)).toBe(12000);
    expect(issuedInvoiceStatus(issued)).toBe('issued');
    expect(issuedInvoiceStatus({ ...issued, paidMinor: 5000 })).toBe('part_paid');
    const paid = { ...issued, paidMinor: 12000 };
    expect(invoiceBalance(paid)).toBe(0);
    expect(issuedInvoiceStatus(paid)).toBe('paid');
    // a refund of 20.00 is recorded with a credit note of 20.00: 120 − 20 − (120 − 20) = 0, still paid
    expect(invoiceBalance({ ...paid, refundedMinor: 2000, creditedMinor: 2000 })).toBe(0);
    expect(issuedInvoiceStatus({ ...paid, refundedMinor: 12000, creditedMinor: 12000 })).toBe('credited');
    expect(issuedInvoiceStatus({ ...issued, creditedMinor: 12000 })).toBe('credited');
  });
});

describe('dueDate', () => {
  it('should add calendar days across a year end and a leap day', () => {
    expect(dueDate('2026-12-15', 30)).toBe('2027-01-14'); // 16 days to 31 Dec, 14 more
    expect(dueDate('2028-02-14', 30)).toBe('2028-03-15'); // 15 days to 29 Feb (a leap year), 15 more
    expect(dueDate('2026-12-04', 0)).toBe('2026-12-04');
  });
  it('should refuse a date that does not exist and days out of range', () => {
    expect(() => dueDate('2026-02-30', 30)).toThrow(/YYYY-MM-DD/);
    expect(() => dueDate('2026-12-04', 366)).toThrow(/0 to 365/);
  });
});

describe('formatMoney and parseMoney', () => {
  it('should print minor units with the currency’s decimals', () => {
    expect(formatMoney(123450, 'EUR')).toBe('€1,234.50');
    expect(formatMoney(1234, 'JPY')).toBe('JP¥1,234');
  });
  it('should read money as typed, exactly', () => {
    expect(parseMoney('1,234.50', 'EUR')).toBe(123450);
    expect(parseMoney('1 234,5', 'EUR')).toBe(123450);
    expect(parseMoney('1.234,50', 'EUR')).toBe(123450);
    expect(parseMoney('0.1', 'EUR')).toBe(10); // 0.1 in floating point is not exact; the text is
    expect(parseMoney('1,234', 'JPY')).toBe(1234);
  });
  it('should refuse too many decimals and words', () => {
    expect(() => parseMoney('1.005', 'EUR')).toThrow(/more than 2 decimals/);
    expect(() => parseMoney('ten', 'EUR')).toThrow(/not an amount/);
    expect(() => parseMoney('1,234,5', 'EUR')).toThrow(MetrologyError);
  });
});
