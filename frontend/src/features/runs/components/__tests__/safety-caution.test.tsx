import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { CalibrationRunAnalysis } from '@kilocycle/common/types';
import BenchesRoute from '@/app/routes/benches';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { AlignmentPanel } from '../calibration/alignment-panel';
import { PaddingCalculator } from '../calibration/padding-calculator';

// The caution defers to local codes and licensed practice and never says a procedure is safe
// (the product owners' rule for every page beside live equipment).
function expectCaution(lead: RegExp) {
  const caution = screen.getByRole('note', { name: 'Safety caution' });
  const text = caution.textContent ?? '';
  expect(text).toMatch(/hundreds of volts/);
  expect(text).toMatch(/Follow your local electrical codes and licensed practice\./);
  expect(text).toMatch(lead);
  // "safe" appears only in the disclaimer that Kilocycle does not judge it.
  expect(text.match(/\bsafe\b/g)).toHaveLength(1);
  expect(text).toMatch(/does not judge whether a procedure is safe\./);
  expect(text).not.toMatch(/\bsafely\b|\bis safe to\b/);
}

// The alignment panel reads nothing but these two fields: a run whose two ends are not measured yet.
const noAlignment = { alignment: null, alignmentNote: 'Measure both ends of the range to work out the alignment.' } as unknown as CalibrationRunAnalysis;

describe('safety cautions beside the work', () => {
  it('the alignment panel carries the caution, also for someone who only reads', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<AlignmentPanel analysis={noAlignment} />);
    expectCaution(/insulated trimming tool/);
    expect(screen.getByText('Measure both ends of the range to work out the alignment.')).toBeTruthy();
  });

  it('the padding calculator carries the caution', () => {
    signInAs({ role: 'client' });
    renderWithApp(<PaddingCalculator unit="kHz" />);
    expectCaution(/switched off, unplugged and its capacitors discharged/);
  });

  it('the Benches page carries the caution', async () => {
    signInAs({ role: 'technician' });
    mockFetch([{ path: '/api/benches', body: { items: [], total: 0 } }]);
    renderWithApp(<BenchesRoute />, { path: '/benches' });
    expect(screen.getByRole('heading', { name: 'Benches' })).toBeTruthy();
    expectCaution(/often a live valve set/);
  });
});
