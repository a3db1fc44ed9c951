import { resultsCsvText, type ResultsCsvRun } from './results-csv.js';

// Hand-worked: dial read directly in kHz, so setting 1000 is 1 000 000 Hz nominal. Two included readings,
// 1 000 100 and 1 000 300 Hz: mean 1 000 200 Hz, sample SD √((100² + 100²)/1) = √20000 = 141.421 356 Hz,
// error +200 Hz = +200 ppm = +0.02 %. A tolerance of 0.25 % of 1 MHz is 2 500 Hz. The excluded third reading
// (1 000 900 Hz) counts for nothing.
const range: ResultsCsvRun['range'] = {
  label: 'Band A',
  dialUnit: 'kHz',
  dialLaw: { kind: 'direct', unit: 'kHz' },
  tolerance: { kind: 'percent', percent: 0.25 },
};

const cells = (line: string) => line.split(',');

describe('resultsCsvText()', () => {
  test('one line per dial setting, from the included readings only', () => {
    const csv = resultsCsvText('J-0001', [
      {
        id: 7,
        kind: 'as_found',
        range,
        readings: [
          { dial: 1000, frequency: 1_000_100, excluded: false },
          { dial: 1000, frequency: 1_000_300, excluded: false },
          { dial: 1000, frequency: 1_000_900, excluded: true },
        ],
      },
    ]);
    const [header, line, rest] = csv.split('\r\n');
    expect(cells(header!).slice(0, 4)).toEqual(['job', 'run_id', 'run_kind', 'range']);
    const row = cells(line!);
    expect(row.slice(0, 6)).toEqual(['J-0001', '7', 'as_found', 'Band A', '1000', 'kHz']);
    const [nominal, measured, n, sd, errorHz, errorPpm, errorPercent, tolerance] = row.slice(6, 14).map(Number);
    expect([nominal, measured, n]).toEqual([1_000_000, 1_000_200, 2]);
    expect(sd).toBeCloseTo(Math.SQRT2 * 100, 6);
    expect(errorHz).toBeCloseTo(200, 6);
    expect(errorPpm).toBeCloseTo(200, 6);
    expect(errorPercent).toBeCloseTo(0.02, 9);
    expect(tolerance).toBeCloseTo(2500, 6);
    expect(rest).toBe('');
  });

  test('a run with no included reading at a dial setting gets one line saying so', () => {
    const csv = resultsCsvText('J-0002', [{ id: 9, kind: 'as_left', range, readings: [{ dial: null, frequency: 1_000_000, excluded: false }] }]);
    const row = cells(csv.split('\r\n')[1]!);
    expect(row.slice(0, 4)).toEqual(['J-0002', '9', 'as_left', 'Band A']);
    expect(row[8]).toBe('0');
    expect(row.at(-1)).toBe('no included readings with a dial setting');
  });
});
