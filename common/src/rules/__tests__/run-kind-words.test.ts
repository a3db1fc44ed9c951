import { runKindWords } from '../index.js';

// How the lab writes the kinds in running text (common practice, no published source): hyphenated
// "as-found", "as-left" and "warm-up"; "supply sensitivity" as two words.
describe('run kinds in words', () => {
  it('writes each kind as the lab does', () => {
    expect(runKindWords('as_found')).toBe('as-found');
    expect(runKindWords('as_left')).toBe('as-left');
    expect(runKindWords('warmup')).toBe('warm-up');
    expect(runKindWords('supply_sensitivity')).toBe('supply sensitivity');
    expect(runKindWords('stability')).toBe('stability');
    expect(runKindWords('keying')).toBe('keying');
  });
});
