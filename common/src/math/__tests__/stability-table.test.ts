// The stability table the analysis of a stability run serves, and drift removal. Expected values: NIST SP 1065
// (Riley 2008) Table 31 (fixtures/stability), and closed forms derived here; none computed by the code under test.
import { errorCode, expectPrintedDigits, readFixture, sp1065TestSuite } from './helpers.js';
import { removeLinearFrequencyDrift } from '../remove-linear-frequency-drift.js';
import { stabilityFactorLimit, stabilityTable } from '../stability-table.js';

const table31 = JSON.parse(readFixture('stability/sp1065_1000point_results.json'));

describe('stabilityTable on the SP 1065 1000-point suite (Table 31), m = 1, 10, 100', () => {
  const rows = stabilityTable(sp1065TestSuite(), 1, { factors: [1, 10, 100] });
  test.each([
    ['adev', 'adev_overlapping'],
    ['mdev', 'mdev'],
    ['hdev', 'hdev_overlapping'],
    ['tdev', 'tdev'],
    ['totdev', 'totdev'],
  ] as const)('%s matches the printed digits', (deviation, key) => {
    rows.forEach((row, i) => expectPrintedDigits(row[deviation]!.deviation, table31.results[key][i], `${deviation} m=${row.m}`));
  });

  test('each point has its terms (N − 2m for the overlapping ADEV, N − 3m for the Hadamard, N phase points = 1001) and a 95 % interval about it', () => {
    expect(rows.map((r) => r.adev!.terms)).toEqual([999, 981, 801]);
    expect(rows.map((r) => r.hdev!.terms)).toEqual([998, 971, 701]);
    for (const row of rows) {
      for (const value of [row.adev, row.mdev, row.hdev, row.tdev, row.totdev]) {
        expect(value!.ciLow).toBeLessThan(value!.deviation);
        expect(value!.ciHigh).toBeGreaterThan(value!.deviation);
      }
    }
  });

  test('uniform random numbers are white FM: named so at τ0 by the lag-1 method, with that type used for the edf', () => {
    // Independent readings: white frequency noise by construction (α = 0).
    expect(rows[0]!.noise).toMatchObject({ status: 'identified', noise: 'white_fm', method: 'lag1_acf' });
    expect(rows[0]!).toMatchObject({ edfNoise: 'white_fm', edfNoiseFrom: 'identified' });
  });
});

describe('stabilityTable factors', () => {
  const y = sp1065TestSuite();
  test('octaves by default up to ⌊M/2⌋, decades on request; a deviation past its own limit is left empty', () => {
    expect(stabilityFactorLimit(1000)).toBe(500);
    expect(stabilityTable(y, 1).map((r) => r.m)).toEqual([1, 2, 4, 8, 16, 32, 64, 128, 256]);
    const decadeRows = stabilityTable(y, 1, { spacing: 'decades' });
    expect(decadeRows.map((r) => r.m)).toEqual([1, 2, 5, 10, 20, 50, 100, 200, 500]);
    // m = 500: ADEV and total deviation reach M/2 = 500; Hadamard stops at M/3, modified and time at (M + 1)/3.
    const last = decadeRows[decadeRows.length - 1]!;
    expect(last.adev).not.toBeNull();
    expect(last.totdev).not.toBeNull();
    expect([last.mdev, last.hdev, last.tdev]).toEqual([null, null, null]);
  });

  test('a factor beyond the record is refused with its τ named', () => {
    expect(errorCode(() => stabilityTable(y, 2, { factors: [1, 501] }))).toBe('too_short');
    expect(() => stabilityTable(y, 2, { factors: [1, 501] })).toThrow('τ = 1002 s (m = 501) is too long');
    expect(errorCode(() => stabilityTable(y, 1, { factors: [0] }))).toBe('bad_argument');
    expect(errorCode(() => stabilityTable(y, 1, { factors: [1.5] }))).toBe('bad_argument');
  });

  test('too few decimated points to name a noise type: said, and the edf takes the type of the nearest shorter τ', () => {
    // m = 400 leaves ⌊1000/400⌋ + 1 = 3 decimated phase points, under the B1 ratio's 4.
    const [first, last] = stabilityTable(y, 1, { factors: [1, 400] });
    expect(last!.noise.status).toBe('too_short');
    expect(last!).toMatchObject({ edfNoise: first!.edfNoise, edfNoiseFrom: 'shorter_tau' });
  });
});

describe('removeLinearFrequencyDrift', () => {
  test('a straight line leaves nothing, and gives back its slope and intercept', () => {
    const line = Array.from({ length: 50 }, (_, i) => 3e-9 + 2e-12 * i * 10);
    const removed = removeLinearFrequencyDrift(line, 10);
    expect(removed.drift).toBeCloseTo(2e-12, 24);
    expect(removed.intercept).toBeCloseTo(3e-9, 21);
    for (const r of removed.residuals) expect(Math.abs(r)).toBeLessThan(1e-21);
  });

  test('alternating ±a plus a drift D: the Hadamard deviation at τ0 is 4a/√6 before and after; the Allan deviation at 2τ0 falls from Dτ/√2', () => {
    // Closed forms: the second difference of y kills a line, and (−1)^i has second difference ±4a, so Hσ(τ0) = √(16a²/6).
    // Averaged over 2 readings the alternation vanishes, leaving only the drift: σ_y(2τ0) = D·2τ0/√2.
    const a = 1e-7;
    const D = 1e-9;
    const y = Array.from({ length: 1000 }, (_, i) => (i % 2 === 0 ? a : -a) + D * i);
    const before = stabilityTable(y, 1, { factors: [1, 2] });
    const after = stabilityTable(removeLinearFrequencyDrift(y, 1).residuals, 1, { factors: [1, 2] });
    expect(before[0]!.hdev!.deviation).toBeCloseTo((4 * a) / Math.sqrt(6), 15);
    expect(after[0]!.hdev!.deviation).toBeCloseTo((4 * a) / Math.sqrt(6), 15);
    expect(before[1]!.adev!.deviation).toBeCloseTo((D * 2) / Math.SQRT2, 17);
    expect(after[1]!.adev!.deviation).toBeLessThan(1e-3 * ((D * 2) / Math.SQRT2));
  });
});
