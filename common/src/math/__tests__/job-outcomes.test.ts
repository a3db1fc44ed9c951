// The job's two outcomes (ISO/IEC 17025:2017 7.8.4.1: results before and after adjustment). Every case is
// written by hand: its counts and words are read off the decisions listed in the case itself.
import type { Decision, PointResult } from '../../types/certificates.js';
import { jobOutcomes, withOutcomes } from '../job-outcomes.js';

type Side = Decision | null | undefined; // undefined: not measured in that kind of run
const at = (decision: Decision | null) => ({ decision }) as unknown as NonNullable<PointResult['asFound']>;
function range(label: string, pairs: Array<[Side, Side]>) {
  return { label, points: pairs.map(([f, l]) => ({ asFound: f === undefined ? null : at(f), asLeft: l === undefined ? null : at(l) })) };
}
const P = 'pass';
const CP = 'conditional_pass';
const CF = 'conditional_fail';
const F = 'fail';

describe('jobOutcomes()', () => {
  test("three of ten as-found settings out of tolerance, all passing as left (the issue's sentence)", () => {
    const pairs: Array<[Side, Side]> = [
      [P, P],
      [P, P],
      [F, P],
      [P, P],
      [F, P],
      [P, P],
      [P, P],
      [F, P],
      [P, P],
      [P, P],
    ];
    const o = jobOutcomes([range('Band A', pairs)]);
    expect(o.asFound).toEqual({
      decision: 'fail',
      settings: 10,
      pass: 7,
      conditionalPass: 0,
      conditionalFail: 0,
      fail: 3,
      outOfTolerance: 3,
      conditional: 0,
      undecided: 0,
      words: 'out of tolerance at 3 of 10 settings',
    });
    expect(o.asLeft).toMatchObject({ decision: 'pass', settings: 10, pass: 10, outOfTolerance: 0, words: 'within tolerance' });
    expect(o.asFoundFinalRanges).toEqual([]);
    expect(o.summary).toBe('As found: out of tolerance at 3 of 10 settings; as left: within tolerance.');
  });

  test('settings are counted over every range; the worst decision is fail over conditional fail over conditional pass', () => {
    const o = jobOutcomes([
      range('Band A', [
        [P, P],
        [CP, P],
        [CF, CP],
      ]),
      range('Band B', [
        [P, P],
        [P, CP],
      ]),
    ]);
    expect(o.asFound).toMatchObject({
      decision: 'conditional_fail',
      settings: 5,
      pass: 3,
      conditionalPass: 1,
      conditionalFail: 1,
      fail: 0,
      outOfTolerance: 1,
      conditional: 2,
    });
    expect(o.asFound!.words).toBe('out of tolerance at 1 of 5 settings, conditionally (beyond the limit by less than U)');
    expect(o.asLeft).toMatchObject({ decision: 'conditional_pass', settings: 5, pass: 3, conditionalPass: 2, outOfTolerance: 0, conditional: 2 });
    expect(o.asLeft!.words).toBe('within tolerance, conditionally at 2 of 5 settings (inside the limit by less than U)');
  });

  test('fail and conditional fail together are both out of tolerance', () => {
    const o = jobOutcomes([
      range('R', [
        [F, P],
        [CF, P],
        [CF, P],
        [P, P],
      ]),
    ]);
    expect(o.asFound).toMatchObject({ decision: 'fail', fail: 1, conditionalFail: 2, outOfTolerance: 3, conditional: 2 });
    expect(o.asFound!.words).toBe('out of tolerance at 3 of 4 settings (2 of them conditionally: beyond the limit by less than U)');
  });

  test('as found only: the as-found results are said to be the final ones', () => {
    const o = jobOutcomes([
      range('Band A', [
        [P, undefined],
        [P, undefined],
        [P, undefined],
      ]),
    ]);
    expect(o.asLeft).toBeNull();
    expect(o.asFound).toMatchObject({ decision: 'pass', settings: 3, pass: 3 });
    expect(o.asFoundFinalRanges).toEqual(['Band A']);
    expect(o.summary).toBe('As found: within tolerance. No adjustment was recorded: the as-found results are the final ones.');
  });

  test('one range adjusted, two not: the summary names the ranges whose as-found results are final', () => {
    const o = jobOutcomes([
      range('Band A', [
        [F, P],
        [P, P],
      ]),
      range('Band B', [[P, undefined]]),
      range('Band C', [[P, undefined]]),
    ]);
    expect(o.asFound).toMatchObject({ settings: 4, fail: 1 });
    expect(o.asLeft).toMatchObject({ settings: 2, pass: 2 });
    expect(o.asFoundFinalRanges).toEqual(['Band B', 'Band C']);
    expect(o.summary).toBe(
      'As found: out of tolerance at 1 of 4 settings; as left: within tolerance. On Band B and Band C no adjustment was recorded: there the as-found results are the final ones.',
    );
  });

  test('settings with no decision are counted apart and never read as a pass', () => {
    const o = jobOutcomes([
      range('R', [
        [null, P],
        [null, null],
        [P, P],
      ]),
    ]);
    expect(o.asFound).toMatchObject({ decision: 'pass', settings: 3, pass: 1, undecided: 2 });
    expect(o.asFound!.words).toBe('within tolerance; no decision at 2 of 3 settings');
    const none = jobOutcomes([
      range('R', [
        [null, undefined],
        [null, undefined],
      ]),
    ]);
    expect(none.asFound).toMatchObject({ decision: null, settings: 2, undecided: 2, words: 'no decision at any of the 2 settings' });
  });

  test('as left only, and nothing at all', () => {
    expect(jobOutcomes([range('R', [[undefined, P]])]).summary).toBe('As found: not measured; as left: within tolerance.');
    const empty = jobOutcomes([]);
    expect(empty).toEqual({ asFound: null, asLeft: null, asFoundFinalRanges: [], summary: 'No as-found or as-left results.' });
  });

  test('one setting out of tolerance is singular', () => {
    expect(jobOutcomes([range('R', [[F, P]])]).asFound!.words).toBe('out of tolerance at 1 of 1 setting');
  });
});

describe('withOutcomes()', () => {
  const stored = {
    ranges: [
      range('R', [
        [F, P],
        [P, P],
      ]),
    ],
  } as unknown as Parameters<typeof withOutcomes>[0];

  test('derives the outcomes of results stored without them', () => {
    expect(withOutcomes(stored).outcomes.summary).toBe('As found: out of tolerance at 1 of 2 settings; as left: within tolerance.');
  });

  test('keeps outcomes that are present', () => {
    const kept = { ...stored, outcomes: { asFound: null, asLeft: null, asFoundFinalRanges: [], summary: 'kept' } };
    expect(withOutcomes(kept).outcomes.summary).toBe('kept');
  });
});
