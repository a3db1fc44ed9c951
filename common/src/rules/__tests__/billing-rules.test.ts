import { certificateRelease, quoteTransitionRefusal } from '../index.js';

describe('certificateRelease', () => {
  const unpaid = { id: 7, status: 'issued' as const, number: 'INV-000007' };
  it('should always release to the lab’s staff and at once to a customer on account', () => {
    expect(certificateRelease({ role: 'lead', paymentTerms: 'pay_before_release', invoice: unpaid }).released).toBe(true);
    expect(certificateRelease({ role: 'client', paymentTerms: 'on_account', invoice: unpaid }).released).toBe(true);
  });
  it('should hold a pay-first client’s certificate until the invoice is settled, saying why', () => {
    const held = certificateRelease({ role: 'client', paymentTerms: 'pay_before_release', invoice: unpaid });
    expect(held).toEqual({ released: false, heldReason: 'Held until invoice INV-000007 is paid: it is not paid yet.', invoiceId: 7 });
    expect(certificateRelease({ role: 'client', paymentTerms: 'pay_before_release', invoice: null }).heldReason).toMatch(/preparing the invoice/);
    expect(certificateRelease({ role: 'client', paymentTerms: 'pay_before_release', invoice: { ...unpaid, status: 'part_paid' } }).released).toBe(false);
    expect(certificateRelease({ role: 'client', paymentTerms: 'pay_before_release', invoice: { ...unpaid, status: 'paid' } }).released).toBe(true);
    expect(certificateRelease({ role: 'client', paymentTerms: 'pay_before_release', invoice: { ...unpaid, status: 'credited' } }).released).toBe(true);
  });
});

describe('quoteTransitionRefusal', () => {
  it('should allow draft → sent → accepted, declined or expired and nothing else', () => {
    expect(quoteTransitionRefusal('draft', 'sent')).toBeNull();
    expect(quoteTransitionRefusal('sent', 'accepted')).toBeNull();
    expect(quoteTransitionRefusal('sent', 'declined')).toBeNull();
    expect(quoteTransitionRefusal('draft', 'accepted')).toMatch(/must be sent/);
    expect(quoteTransitionRefusal('accepted', 'declined')).toMatch(/already accepted/);
    expect(quoteTransitionRefusal('expired', 'accepted')).toMatch(/make a new quote/);
  });
});
