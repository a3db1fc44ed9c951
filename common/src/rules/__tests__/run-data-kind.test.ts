import { RUN_KINDS } from '../../types/lab.js';
import { mixedRunRefusal, runDataKindRefusal } from '../index.js';

// The rule is the lab's own (phase data only in stability runs): common practice, no published source.
describe('runDataKindRefusal', () => {
  it('should let every run kind hold frequency readings', () => {
    for (const kind of RUN_KINDS) expect(runDataKindRefusal(kind, 'frequency')).toBeNull();
  });

  it('should let only a stability run hold phase readings, naming the kind refused', () => {
    expect(runDataKindRefusal('stability', 'phase')).toBeNull();
    for (const kind of RUN_KINDS.filter((k) => k !== 'stability')) {
      expect(runDataKindRefusal(kind, 'phase')).toBe(`phase (time-interval) readings are kept in stability runs only, not in a ${kind} run`);
    }
  });
});

describe('mixedRunRefusal', () => {
  it('should accept a reading of the kind the run holds', () => {
    expect(mixedRunRefusal(3, 'phase', 'phase')).toBeNull();
    expect(mixedRunRefusal(3, 'frequency', 'frequency')).toBeNull();
  });

  it('should call a reading of the other kind a mixed run, naming the run and the field to send', () => {
    expect(mixedRunRefusal(12, 'phase', 'frequency')).toMatch(/^run 12 holds phase readings .*mixed run; send timeInterval$/);
    expect(mixedRunRefusal(7, 'frequency', 'phase')).toMatch(/^run 7 holds frequency readings \(Hz\).*mixed run; send frequency/);
  });
});
