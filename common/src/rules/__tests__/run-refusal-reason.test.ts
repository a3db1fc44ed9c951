import { runRefusalReason } from '../index.js';

// A run takes readings only while it is open and its job is being worked on: once submitted for review or
// signed, the record is fixed (the product's job workflow; common practice, no published source).
describe('why a run takes no readings', () => {
  it('is null for an open run of a job being worked on', () => {
    for (const jobStatus of ['received', 'in_progress', 'returned'] as const) {
      expect(runRefusalReason({ runId: 4, status: 'open', jobStatus })).toBeNull();
    }
  });

  it('names a closed run first, whatever its job', () => {
    expect(runRefusalReason({ runId: 4, status: 'closed', jobStatus: 'in_progress' })).toBe('run 4 is closed');
    expect(runRefusalReason({ runId: 4, status: 'closed', jobStatus: 'issued' })).toBe('run 4 is closed');
  });

  it('names the job in review or signed', () => {
    expect(runRefusalReason({ runId: 9, status: 'open', jobStatus: 'in_review' })).toBe('run 9 belongs to a job that is in review');
    expect(runRefusalReason({ runId: 9, status: 'open', jobStatus: 'approved' })).toBe('run 9 belongs to a job that is approved');
    expect(runRefusalReason({ runId: 9, status: 'open', jobStatus: 'issued' })).toBe('run 9 belongs to a job that is issued');
  });
});
