import { MetrologyError } from '../../math/metrology-error.js';
import { billableHoursMilli } from '../index.js';

// Worked by hand: a quarter hour is 900 s = 250 thousandths of an hour; the time is rounded up, at least one hour.
describe('billableHoursMilli', () => {
  it('should bill at least one hour', () => {
    expect(billableHoursMilli(0)).toBe(1000); // nothing recorded yet → 1 h
    expect(billableHoursMilli(1_200)).toBe(1000); // 20 min → 1 h
  });
  it('should round up to the next quarter hour', () => {
    expect(billableHoursMilli(3_600)).toBe(1000); // exactly 1 h
    expect(billableHoursMilli(3_601)).toBe(1250); // 1 h 0 min 1 s → 1.25 h
    expect(billableHoursMilli(9_000)).toBe(2500); // 2 h 30 min exactly → 2.5 h
    expect(billableHoursMilli(86_400 + 1)).toBe(24_250); // a day and a second → 24.25 h
  });
  it('should refuse a negative or non-finite time', () => {
    expect(() => billableHoursMilli(-1)).toThrow(MetrologyError);
    expect(() => billableHoursMilli(Number.NaN)).toThrow(MetrologyError);
  });
});
