import { describe, expect, it } from 'vitest';
import { niceExtreme, textWidth, yAxisWidth } from '../chart-layout';
import { formatNumber } from '../frequency';

describe('niceExtreme()', () => {
  it('rounds the first digit away from zero', () => {
    expect(niceExtreme(-1234)).toBe(-2000);
    expect(niceExtreme(87)).toBe(90);
    expect(niceExtreme(1000)).toBe(1000);
    expect(niceExtreme(0.034)).toBeCloseTo(0.04, 12);
    expect(niceExtreme(0)).toBe(0);
  });
});

describe('yAxisWidth()', () => {
  // Roboto Mono advances every glyph by 600 of its 1000 units: at 11 px, 6.6 px a character.
  it('measures monospaced labels at 0.6 em a character', () => {
    expect(textWidth('-1 000', 11)).toBeCloseTo(39.6, 9);
  });

  it('makes room for the widest label an outlier brings, "-10 000" and not "-1 000…"', () => {
    const format = (v: number) => formatNumber(v, 0);
    const quiet = yAxisWidth([-40, 35], format);
    const outlier = yAxisWidth([-9_400, -40, 35], format);
    // "-10 000" is 7 characters: 46.2 px of label, 12 px of tick and gap, 22 px of title.
    expect(outlier).toBe(Math.ceil(7 * 6.6 + 12 + 22));
    expect(outlier).toBeGreaterThan(quiet);
  });

  it('never goes below its minimum, and copes with no data', () => {
    expect(yAxisWidth([1, 2], (v) => String(v), { min: 60 })).toBe(60);
    expect(yAxisWidth([], (v) => String(v))).toBe(48);
  });
});
