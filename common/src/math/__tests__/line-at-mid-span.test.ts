import { lineAtMidSpan } from '../line-at-mid-span.js';
import { MetrologyError } from '../metrology-error.js';

// Closed form: a straight line evaluated at the midpoint of the span, worked by hand.
describe('lineAtMidSpan', () => {
  it('evaluates the line at the centre of the span, whatever the order and spacing of the settings', () => {
    // 100 − 0.002 × 1 875 000 = 100 − 3 750 = −3 650 Hz
    expect(lineAtMidSpan({ offsetHz: 100, slope: -0.002 }, [2_000_000, 1_750_000, 1_800_000])).toEqual({ nominalHz: 1_875_000, errorHz: -3650 });
  });

  it('gives the intercept’s opposite sign when the line crosses zero between 0 Hz and the range (the case the intercept misleads)', () => {
    // 6 701 − 0.0056 × 2 000 000 = 6 701 − 11 200 = −4 499 Hz
    const { errorHz } = lineAtMidSpan({ offsetHz: 6701, slope: -0.0056 }, [1_500_000, 2_500_000]);
    expect(errorHz).toBeCloseTo(-4499, 9);
  });

  it('refuses no settings, naming the problem', () => {
    expect(() => lineAtMidSpan({ offsetHz: 0, slope: 0 }, [])).toThrow(MetrologyError);
    expect(() => lineAtMidSpan({ offsetHz: 0, slope: 0 }, [Number.NaN])).toThrow(/at least one finite nominal/);
  });
});
