import { ENGINEER_RUN_KINDS, runWriteRefusal } from '../index.js';

// The product brief's table of roles (common practice, no published source): technicians, leads and admins
// work at the bench on every run; an engineer runs drift and stability studies (warm-up, stability, supply
// sensitivity, keying) but not calibrations; a client only reads. Written out here by hand.
describe('who may write into a run', () => {
  it('lets the bench roles work on calibrations and studies alike', () => {
    for (const role of ['admin', 'lead', 'technician'] as const) {
      expect(runWriteRefusal(role, 'as_found')).toBeNull();
      expect(runWriteRefusal(role, 'as_left')).toBeNull();
      expect(runWriteRefusal(role, 'warmup')).toBeNull();
    }
  });

  it('lets an engineer work on the four study kinds only', () => {
    expect([...ENGINEER_RUN_KINDS].sort()).toEqual(['keying', 'stability', 'supply_sensitivity', 'warmup']);
    expect(runWriteRefusal('engineer', 'stability')).toBeNull();
    expect(runWriteRefusal('engineer', 'keying')).toBeNull();
    expect(runWriteRefusal('engineer', 'as_left')).toBe('an engineer may work on warmup, stability, supply_sensitivity, keying runs, not as_left');
  });

  it('keeps a client read-only', () => {
    expect(runWriteRefusal('client', 'warmup')).toBe('lab records are read-only for this account');
    expect(runWriteRefusal('client', 'as_found')).toBe('lab records are read-only for this account');
  });
});
