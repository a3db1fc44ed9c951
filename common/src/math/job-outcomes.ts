import type { Decision } from './decide.js';
import type { JobOutcome, JobOutcomes, JobResults, PointResult, RangeResult } from '../types/certificates.js';

/** Order of severity: the worst decision of a set is the one latest in this list. */
const SEVERITY: readonly Decision[] = ['pass', 'conditional_pass', 'conditional_fail', 'fail'];

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function outcomeWords(o: Omit<JobOutcome, 'words'>): string {
  const n = o.settings;
  if (o.undecided === n) return `no decision at ${n === 1 ? 'the one setting' : `any of the ${n} settings`}`;
  let words: string;
  if (o.outOfTolerance > 0) {
    words = `out of tolerance at ${o.outOfTolerance} of ${plural(n, 'setting')}`;
    if (o.conditionalFail > 0) {
      words +=
        o.conditionalFail === o.outOfTolerance
          ? ', conditionally (beyond the limit by less than U)'
          : ` (${o.conditionalFail} of them conditionally: beyond the limit by less than U)`;
    }
  } else if (o.conditionalPass > 0) {
    words = `within tolerance, conditionally at ${o.conditionalPass} of ${plural(n, 'setting')} (inside the limit by less than U)`;
  } else {
    words = 'within tolerance';
  }
  if (o.undecided > 0) words += `; no decision at ${o.undecided} of ${plural(n, 'setting')}`;
  return words;
}

function outcomeOf(points: ReadonlyArray<{ decision: Decision | null }>): JobOutcome | null {
  if (points.length === 0) return null;
  const counts = { pass: 0, conditional_pass: 0, conditional_fail: 0, fail: 0 } satisfies Record<Decision, number>;
  let undecided = 0;
  let worst: Decision | null = null;
  for (const { decision } of points) {
    if (decision === null) {
      undecided += 1;
      continue;
    }
    counts[decision] += 1;
    if (worst === null || SEVERITY.indexOf(decision) > SEVERITY.indexOf(worst)) worst = decision;
  }
  const outcome: Omit<JobOutcome, 'words'> = {
    decision: worst,
    settings: points.length,
    pass: counts.pass,
    conditionalPass: counts.conditional_pass,
    conditionalFail: counts.conditional_fail,
    fail: counts.fail,
    outOfTolerance: counts.fail + counts.conditional_fail,
    conditional: counts.conditional_pass + counts.conditional_fail,
    undecided,
  };
  return { ...outcome, words: outcomeWords(outcome) };
}

function listWords(labels: readonly string[]): string {
  return labels.length <= 1 ? (labels[0] ?? '') : `${labels.slice(0, -1).join(', ')} and ${labels[labels.length - 1]}`;
}

/**
 * The job's two outcomes, as found (before any adjustment) and as left (after it), from its ranges'
 * point results. ISO/IEC 17025:2017 7.8.4.1 asks a calibration certificate for the results before and
 * after an adjustment; telling the customer that the instrument was found out of tolerance is what lets
 * them judge the work it did since its last calibration (common practice, no published source).
 *
 * For each side, over every setting with a result of that kind: the worst decision (fail > conditional
 * fail > conditional pass > pass), the number of settings, the count of each decision, out of tolerance
 * = fail + conditional fail, conditional = conditional pass + conditional fail, undecided = settings with
 * no decision; and plain words. A range measured as found and not as left keeps its as-found results as
 * the final ones; the summary says so.
 *
 * @param ranges each range's label and points (a point's asFound / asLeft, each with its decision, or null)
 * @returns both outcomes (null for a side with no setting) and the summary sentence
 * @example jobOutcomes(ranges).summary; // => 'As found: out of tolerance at 3 of 10 settings; as left: within tolerance.'
 */
export function jobOutcomes(
  ranges: ReadonlyArray<Pick<RangeResult, 'label'> & { points: ReadonlyArray<Pick<PointResult, 'asFound' | 'asLeft'>> }>,
): JobOutcomes {
  const found: Array<{ decision: Decision | null }> = [];
  const left: Array<{ decision: Decision | null }> = [];
  const asFoundFinalRanges: string[] = [];
  for (const range of ranges) {
    let rangeFound = 0;
    let rangeLeft = 0;
    for (const point of range.points) {
      if (point.asFound) {
        found.push(point.asFound);
        rangeFound += 1;
      }
      if (point.asLeft) {
        left.push(point.asLeft);
        rangeLeft += 1;
      }
    }
    if (rangeFound > 0 && rangeLeft === 0) asFoundFinalRanges.push(range.label);
  }
  const asFound = outcomeOf(found);
  const asLeft = outcomeOf(left);
  let summary: string;
  if (!asFound && !asLeft) summary = 'No as-found or as-left results.';
  else if (asFound && !asLeft) summary = `As found: ${asFound.words}. No adjustment was recorded: the as-found results are the final ones.`;
  else if (!asFound) summary = `As found: not measured; as left: ${asLeft!.words}.`;
  else {
    summary = `As found: ${asFound.words}; as left: ${asLeft!.words}.`;
    if (asFoundFinalRanges.length > 0) {
      summary += ` On ${listWords(asFoundFinalRanges)} no adjustment was recorded: there the as-found results are the final ones.`;
    }
  }
  return { asFound, asLeft, asFoundFinalRanges, summary };
}

/**
 * Results as stored before `outcomes` existed lack it: this answers them with the outcomes derived from
 * their own points (jobOutcomes), and answers results that have it unchanged.
 */
export function withOutcomes<T extends Omit<JobResults, 'outcomes'> & { outcomes?: JobOutcomes }>(results: T): T & { outcomes: JobOutcomes } {
  return results.outcomes ? (results as T & { outcomes: JobOutcomes }) : { ...results, outcomes: jobOutcomes(results.ranges) };
}
