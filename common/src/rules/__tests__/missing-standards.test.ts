import { missingStandards } from '../index.js';

// A calibration result is stated against a reference standard (common practice in calibration, no published
// source here); studies need none. The sentences are written by hand.
describe('calibration runs without a reference standard', () => {
  it('is null when every as-found and as-left run names one, whatever the studies do', () => {
    expect(missingStandards([])).toBeNull();
    expect(
      missingStandards([
        { id: 1, kind: 'as_found', rangeLabel: '10-100 kHz', standardId: 4 },
        { id: 2, kind: 'warmup', rangeLabel: '10-100 kHz', standardId: null },
      ]),
    ).toBeNull();
  });

  it('names each calibration run that lacks one, in the order given', () => {
    expect(
      missingStandards([
        { id: 7, kind: 'as_left', rangeLabel: 'Range B', standardId: null },
        { id: 3, kind: 'stability', rangeLabel: 'Range A', standardId: null },
        { id: 5, kind: 'as_found', rangeLabel: 'Range A', standardId: null },
      ]),
    ).toBe('run 7 (as-left, Range B) has no reference standard; run 5 (as-found, Range A) has no reference standard');
  });
});
