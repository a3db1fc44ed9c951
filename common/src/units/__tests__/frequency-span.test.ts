// The capture guardrail: a reading outside its range's span by more than 10 % of the span is a probable
// unit slip. Expected values are closed forms worked by hand: limits fMin − 0.1·(fMax − fMin) and
// fMax + 0.1·(fMax − fMin); the probable reading is the value × or ÷ 10³ or 10⁶ that lands inside
// (common practice, no published source: how a counter reading loses its unit).
import { MetrologyError, SPAN_MARGIN, checkFrequencySpan, isWithinSpan, probableFrequency, spanLimits } from '../index.js';

describe('spanLimits()', () => {
  test('1.75–2.0 MHz widens by 25 kHz on each side (10 % of 250 kHz)', () => {
    expect(SPAN_MARGIN).toBe(0.1);
    const { low, high } = spanLimits(1_750_000, 2_000_000);
    expect(low).toBeCloseTo(1_725_000, 6);
    expect(high).toBeCloseTo(2_025_000, 6);
  });

  test('a margin of its own: 150–400 kHz with 20 % is 100–450 kHz; 0 % is the span itself', () => {
    const wide = spanLimits(150_000, 400_000, 0.2);
    expect(wide.low).toBeCloseTo(100_000, 6);
    expect(wide.high).toBeCloseTo(450_000, 6);
    expect(spanLimits(150_000, 400_000, 0)).toEqual({ low: 150_000, high: 400_000 });
  });

  test.each([
    [0, 2e6, 0.1],
    [2e6, 1e6, 0.1],
    [1e6, 1e6, 0.1],
    [Number.NaN, 2e6, 0.1],
    [1e6, Number.POSITIVE_INFINITY, 0.1],
    [1e6, 2e6, -0.1],
    [1e6, 2e6, Number.NaN],
  ])('refuses span %p–%p with margin %p', (min, max, margin) => {
    expect(() => spanLimits(min, max, margin)).toThrow(MetrologyError);
  });
});

describe('isWithinSpan()', () => {
  const limits = spanLimits(1_750_000, 2_000_000);
  test.each([
    [1_725_000, true], // the low limit itself
    [2_025_000, true], // the high limit itself
    [1_724_999, false],
    [2_025_001, false],
    [1_900_000, true],
    [1_900, false],
    [Number.NaN, false],
  ])('%p Hz → %p', (hz, expected) => {
    expect(isWithinSpan(hz, limits)).toBe(expected);
  });
});

describe('probableFrequency()', () => {
  test.each([
    // 1900 typed with no unit on a kHz range: meant kHz, × 10³
    [1_900, 1_750_000, 2_000_000, 1_900_000],
    // 1.9 typed: meant MHz, × 10⁶
    [1.9, 1_750_000, 2_000_000, 1_900_000],
    // 7 050 000 typed with "kHz" on a 7.0–7.2 MHz range: ÷ 10³
    [7_050_000_000, 7_000_000, 7_200_000, 7_050_000],
    // 5 000 000 MHz on a 4.99–5.01 MHz output: ÷ 10⁶
    [5_000_000_000_000, 4_990_000, 5_010_000, 5_000_000],
    // 50 Hz on a 1.75–2.0 MHz range: no factor of 10³ or 10⁶ lands inside
    [50, 1_750_000, 2_000_000, null],
  ])('%p Hz on %p–%p Hz → %p', (hz, min, max, expected) => {
    const found = probableFrequency(hz, spanLimits(min, max));
    if (expected === null) expect(found).toBeNull();
    else expect(found).toBeCloseTo(expected, 6);
  });

  test('over a range wider than three decades the smallest change of unit wins', () => {
    // 20 Hz–200 kHz (an audio oscillator): 0.05 Hz × 10³ = 50 Hz and × 10⁶ = 50 kHz both land inside.
    expect(probableFrequency(0.05, spanLimits(20, 200_000))).toBeCloseTo(50, 9);
  });
});

describe('checkFrequencySpan()', () => {
  test('the slip of the issue: dial 1900, counter "1900" on 1.75–2.0 MHz', () => {
    const found = checkFrequencySpan('1900', 1_900, 1_750_000, 2_000_000);
    expect(found).not.toBeNull();
    expect(found!.hz).toBe(1_900);
    expect(found!.probableHz).toBeCloseTo(1_900_000, 6);
    expect(found!.message).toBe('1900 read as 1.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?');
  });

  test('inside the widened span there is nothing to say', () => {
    expect(checkFrequencySpan('1735 kHz', 1_735_000, 1_750_000, 2_000_000)).toBeNull();
    expect(checkFrequencySpan(2_020_000, 2_020_000, 1_750_000, 2_000_000)).toBeNull();
  });

  test('a high slip in MHz, and one with no likely meaning', () => {
    expect(checkFrequencySpan('7050 MHz', 7_050_000_000, 7_000_000, 7_200_000)!.message).toBe(
      '7050 MHz read as 7 050.000 MHz, outside this range (7 000–7 200 kHz) by more than 10 % of its span; did you mean 7 050 kHz?',
    );
    expect(checkFrequencySpan(' 50 ', 50, 1_750_000, 2_000_000)!.message).toBe(
      '50 read as 50 Hz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; check the unit and the reading',
    );
  });

  test('just outside the margin is refused; the fractional span ends are printed as needed', () => {
    // 4.99–5.01 MHz: limits 4.988–5.012 MHz; 5.013 MHz is outside with no ×/÷ 10³ landing inside.
    expect(checkFrequencySpan(5_013_000, 5_013_000, 4_990_000, 5_010_000)!.message).toBe(
      '5013000 read as 5 013.000 kHz, outside this range (4 990–5 010 kHz) by more than 10 % of its span; check the unit and the reading',
    );
    expect(checkFrequencySpan('1900', 1_900, 1_750_500, 2_000_000)!.message).toContain('outside this range (1 750.5–2 000 kHz)');
  });
});
