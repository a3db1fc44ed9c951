import { describeSignerDeeds, selfSignRefusal } from '../index.js';

// The expected sentences are the issue's own words for the refusal (issue #12, item 4), written by hand.
describe('the no-self-sign words', () => {
  it('says what the signatory did, in the words of the issue', () => {
    expect(
      selfSignRefusal([
        { kind: 'entered', runId: 12, readings: 4 },
        { kind: 'excluded', runId: 12, seq: 4 },
        { kind: 'entered', runId: 12, readings: 6 },
        { kind: 'edited_budget', runId: 13 },
      ]),
    ).toBe('you entered 10 readings of run 12, excluded reading #4 of run 12 and edited the budget of run 13: another lead must sign');
  });

  it('is null when the signatory did nothing to the data', () => {
    expect(describeSignerDeeds([])).toBeNull();
    expect(selfSignRefusal([{ kind: 'entered', runId: 3, readings: 0 }])).toBeNull();
  });

  it('names opened runs, imports and several excluded readings, runs in ascending order', () => {
    expect(
      describeSignerDeeds([
        { kind: 'opened_run', runId: 9 },
        { kind: 'opened_run', runId: 7 },
        { kind: 'imported', runId: 7, readings: 1 },
        { kind: 'excluded', runId: 7, seq: 9 },
        { kind: 'excluded', runId: 7, seq: 2 },
        { kind: 'edited_budget', runId: 9 },
        { kind: 'edited_budget', runId: 7 },
        { kind: 'edited_budget', runId: 9 },
      ]),
    ).toBe('you opened runs 7 and 9, imported 1 reading into run 7, excluded readings #2 and #9 of run 7 and edited the budget of runs 7 and 9');
  });

  it('lists at most five excluded readings of a run', () => {
    const deeds = [1, 2, 3, 4, 5, 6, 7].map((seq) => ({ kind: 'excluded' as const, runId: 1, seq }));
    expect(describeSignerDeeds(deeds)).toBe('you excluded readings #1, #2, #3, #4, #5 and 2 more of run 1');
  });
});
