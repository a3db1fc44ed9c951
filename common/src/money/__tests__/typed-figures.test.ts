import { MetrologyError } from '../../math/metrology-error.js';
import { formatQuantityMilli, formatRatePercent, moneyEditText, parseMoney, parseQuantityMilli, parseRatePercent } from '../index.js';

// Quantities are integer thousandths and tax rates integer basis points (common/src/types/billing.ts); the
// expected counts below are the typed decimals with the point moved by hand.

describe('parseQuantityMilli and formatQuantityMilli', () => {
  it('should read a typed quantity exactly', () => {
    expect(parseQuantityMilli('1.5')).toBe(1500); // 1.500 → 1500
    expect(parseQuantityMilli('3')).toBe(3000);
    expect(parseQuantityMilli('0,25')).toBe(250); // decimal comma
    expect(parseQuantityMilli(' 2.125 ')).toBe(2125);
    expect(parseQuantityMilli('.5')).toBe(500);
    expect(parseQuantityMilli('0.1')).toBe(100); // not 100.00000000000001
  });
  it('should refuse signs, grouping, words and a fourth decimal', () => {
    expect(() => parseQuantityMilli('1.2345')).toThrow(/more than 3 decimals/);
    expect(() => parseQuantityMilli('-1')).toThrow(MetrologyError);
    expect(() => parseQuantityMilli('1,000.5')).toThrow(/not a quantity/);
    expect(() => parseQuantityMilli('two')).toThrow(/not a quantity/);
    expect(() => parseQuantityMilli('')).toThrow(/not a quantity/);
  });
  it('should print thousandths without trailing zeros', () => {
    expect(formatQuantityMilli(1500)).toBe('1.5');
    expect(formatQuantityMilli(3000)).toBe('3');
    expect(formatQuantityMilli(250)).toBe('0.25');
    expect(formatQuantityMilli(1)).toBe('0.001');
    expect(formatQuantityMilli(0)).toBe('0');
  });
});

describe('parseRatePercent and formatRatePercent', () => {
  it('should read percent as basis points exactly', () => {
    expect(parseRatePercent('20')).toBe(2000);
    expect(parseRatePercent('17.5')).toBe(1750);
    expect(parseRatePercent('5,25 %')).toBe(525);
    expect(parseRatePercent('0')).toBe(0);
  });
  it('should refuse a third decimal and words', () => {
    expect(() => parseRatePercent('7.125')).toThrow(/more than 2 decimals/);
    expect(() => parseRatePercent('standard')).toThrow(/not a percentage/);
  });
  it('should print basis points as percent', () => {
    expect(formatRatePercent(2000)).toBe('20 %');
    expect(formatRatePercent(1750)).toBe('17.5 %');
    expect(formatRatePercent(525)).toBe('5.25 %');
    expect(formatRatePercent(0)).toBe('0 %');
  });
});

describe('moneyEditText', () => {
  it('should give the plain text parseMoney reads back', () => {
    expect(moneyEditText(8500, 'EUR')).toBe('85.00');
    expect(moneyEditText(5, 'EUR')).toBe('0.05');
    expect(moneyEditText(123450, 'EUR')).toBe('1234.50');
    expect(moneyEditText(1234, 'JPY')).toBe('1234');
    expect(parseMoney(moneyEditText(4999, 'GBP'), 'GBP')).toBe(4999);
  });
});
