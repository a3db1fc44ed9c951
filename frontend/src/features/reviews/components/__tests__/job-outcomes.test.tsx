import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { JobOutcome, JobOutcomes } from '@kilocycle/common/types';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { JobOutcomesSummary } from '../job-outcomes';

const side = (o: Partial<JobOutcome>): JobOutcome => ({
  decision: 'pass',
  settings: 10,
  pass: 10,
  conditionalPass: 0,
  conditionalFail: 0,
  fail: 0,
  outOfTolerance: 0,
  conditional: 0,
  undecided: 0,
  words: 'within tolerance',
  ...o,
});
const foundOut: JobOutcomes = {
  asFound: side({ decision: 'fail', pass: 7, fail: 3, outOfTolerance: 3, words: 'out of tolerance at 3 of 10 settings' }),
  asLeft: side({}),
  asFoundFinalRanges: [],
  summary: 'As found: out of tolerance at 3 of 10 settings; as left: within tolerance.',
};

describe('<JobOutcomesSummary>', () => {
  it('states an as-found failure beside the as-left pass, in words and chips', () => {
    signInAs({ role: 'lead' });
    renderWithApp(<JobOutcomesSummary outcomes={foundOut} />);
    const list = screen.getByLabelText('Outcomes');
    expect(within(list).getByText('As found, before adjustment')).toBeTruthy();
    expect(within(list).getByText('Out of tolerance at 3 of 10 settings')).toBeTruthy();
    expect(within(list).getByText('Fail')).toBeTruthy();
    expect(within(list).getByText('Within tolerance')).toBeTruthy();
    expect(within(list).getByText('Pass')).toBeTruthy();
  });

  it('says the as-found results are final when nothing was adjusted', () => {
    signInAs({ role: 'lead' });
    renderWithApp(<JobOutcomesSummary outcomes={{ ...foundOut, asLeft: null, asFoundFinalRanges: ['Band A'] }} />);
    expect(screen.getByText('Not adjusted: the as-found results are the final ones')).toBeTruthy();
    expect(screen.getByText('Not adjusted')).toBeTruthy();
  });

  it('compact: two labelled chips for a page header', () => {
    signInAs({ role: 'lead' });
    renderWithApp(<JobOutcomesSummary outcomes={foundOut} compact />);
    const chips = screen.getByLabelText('Outcomes');
    expect(chips.textContent).toBe('As foundFailAs leftPass');
  });
});
