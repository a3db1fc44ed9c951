import { columnForHeader, convertRow, detectDelimiter, detectNewline, ImportFileError, lastRecordEnd, parseMapping, resolveColumns } from './csv-columns.js';

const run = { kind: 'warmup' as const, dataKind: 'frequency' as const, startedAtMs: Date.parse('2025-03-01T08:00:00Z') };

describe('columnForHeader()', () => {
  test.each([
    ['Time (s)', 'time'],
    ['t_s', 'time'],
    ['Elapsed', 'time'],
    ['Dial setting', 'dial'],
    ['SETTING', 'dial'],
    ['Frequency (kHz)', 'frequency'],
    ['frequency_hz', 'frequency'],
    ['Counter', 'frequency'],
    ['freq', 'frequency'],
    ['Unit', 'unit'],
    ['Supply (V)', 'aux'],
    ['Time interval (ns)', 'frequency'],
    ['time_interval_s', 'frequency'],
    ['Phase', 'frequency'],
    ['received_at', null],
    ['notes', null],
    ['', null],
  ])('%s → %s', (header, column) => expect(columnForHeader(header)).toBe(column));
});

describe('detectDelimiter()', () => {
  test('counts delimiters outside quotes', () => {
    expect(detectDelimiter('time,frequency,"dial, marked"', 'a.csv')).toBe(',');
    expect(detectDelimiter('time\tfrequency\tdial', 'a.csv')).toBe('\t');
    expect(detectDelimiter('Zeit;Frequenz (kHz);Skala', 'a.csv')).toBe(';');
    expect(detectDelimiter('frequency', 'a.tsv')).toBe('\t');
    expect(detectDelimiter('frequency', 'a.csv')).toBe(',');
  });
});

describe('resolveColumns()', () => {
  test('finds columns in any order and reads units from headers', () => {
    const columns = resolveColumns(['Frequency (kHz)', 'Unit', 'Dial', 'Time (min)'], null);
    expect(columns.index).toEqual({ frequency: 0, unit: 1, dial: 2, time: 3, aux: null });
    expect(columns.frequencyUnit).toBe('kHz');
    expect(columns.timeScale).toBe(60);
  });

  test('a mapping overrides the detection, by header or by column number', () => {
    const columns = resolveColumns(['A', 'B', 'Counter'], parseMapping('{"time":"a","frequency":3,"dial":"B"}'));
    expect(columns.index).toEqual({ time: 0, dial: 1, frequency: 2, unit: null, aux: null });
    expect(columns.names.time).toBe('A');
  });

  test('refuses a file without a frequency column, ambiguous columns and mappings to nothing', () => {
    expect(() => resolveColumns(['time', 'dial'], null)).toThrow(/no frequency column/);
    expect(() => resolveColumns(['freq', 'counter'], null)).toThrow(/could both be frequency/);
    expect(() => resolveColumns(['time', 'freq'], parseMapping('{"dial":"Knob"}'))).toThrow(ImportFileError);
    expect(() => parseMapping('{"speed":"x"}')).toThrow(/not a column/);
    expect(() => parseMapping('{oops')).toThrow(/must be JSON/);
  });
});

describe('convertRow()', () => {
  const columns = resolveColumns(['t', 'frequency', 'unit', 'dial'], null);

  test('mixed units: the cell, the unit column, the header, else Hz', () => {
    expect(convertRow(['1', '1735 kHz', '', ''], columns, run)).toEqual({ input: { t: 1, frequency: 1_735_000 } });
    expect(convertRow(['2', '1.735', 'MHz', ''], columns, run)).toEqual({ input: { t: 2, frequency: 1_735_000 } });
    expect(convertRow(['3', '1735000', '', '7,5'], columns, run)).toEqual({ input: { t: 3, frequency: 1_735_000, dial: 7.5 } });
    const kHzHeader = resolveColumns(['time', 'Counter [kHz]'], null);
    expect(convertRow(['0', '7001.25'], kHzHeader, run)).toEqual({ input: { t: 0, frequency: 7_001_250 } });
  });

  test('times as seconds, clock time since the start, or an ISO date and time', () => {
    expect(convertRow(['1:02:03.5', '7e6', '', ''], columns, run)).toMatchObject({ input: { t: 3723.5 } });
    expect(convertRow(['2025-03-01T08:10:00Z', '7e6', '', ''], columns, run)).toMatchObject({ input: { t: 600 } });
    expect(convertRow(['2025-03-01 08:00:30', '7e6', '', ''], columns, run)).toMatchObject({ input: { t: 30 } });
  });

  test('bad cells name their column and say why', () => {
    expect(convertRow(['x', '7e6', '', ''], columns, run)).toEqual({ column: 'time', reason: expect.stringContaining('not a number') });
    expect(convertRow(['', '7e6', '', ''], columns, run)).toEqual({ column: 'time', reason: expect.stringContaining('needs the time') });
    expect(convertRow(['1', '7e6', 'GHz', ''], columns, run)).toEqual({ column: 'unit', reason: "unknown unit 'GHz' (use Hz, kHz or MHz)" });
    expect(convertRow(['1', '-5 kHz', '', ''], columns, run)).toEqual({ column: 'frequency', reason: expect.stringContaining('negative') });
    expect(convertRow(['1', '', '', ''], columns, run)).toEqual({ column: 'frequency', reason: 'no frequency given' });
    expect(convertRow(['2025-02-28T08:00:00Z', '7e6', '', ''], columns, run)).toEqual({
      column: 'time',
      reason: expect.stringContaining('before the run started'),
    });
  });

  test('a calibration run may leave the time out, and the reading then has t = 0, not the time since the run began', () => {
    expect(convertRow(['', '1735 kHz', '', '1735'], columns, { ...run, kind: 'as_found' })).toEqual({ input: { frequency: 1_735_000, dial: 1735, t: 0 } });
  });
});

describe('detectNewline() and lastRecordEnd()', () => {
  test('finds the line break outside quotes', () => {
    expect(detectNewline('a,b\r\n1,2')).toBe('\r\n');
    expect(detectNewline('"x\r\ny",b\n1,2')).toBe('\n');
    expect(detectNewline('a\rb')).toBe('\r');
    expect(detectNewline('abc')).toBe('\n');
  });

  test('cuts after the last record end, never inside a quoted cell or between CR and LF', () => {
    expect(lastRecordEnd('a,b\r\n1,2\r\n3,', '\r\n')).toBe(10);
    expect(lastRecordEnd('a,b\r\n1,2\r', '\r\n')).toBe(5);
    expect(lastRecordEnd('a,"b\nc"\nd,"e\nf', '\n')).toBe(8);
    expect(lastRecordEnd('"open\n', '\n')).toBe(-1);
  });
});

describe('convertRow() in a phase run', () => {
  // SI submultiples of the second (SI Brochure): 1 ns = 1e-9 s, 1 µs = 1e-6 s.
  test('a phase run reads the value column as a time interval: unit from the cell, the unit column, the header, else seconds', () => {
    const phaseRun = { ...run, kind: 'stability' as const, dataKind: 'phase' as const };
    const nsHeader = resolveColumns(['t', 'Time interval (ns)'], null);
    expect(nsHeader.index).toMatchObject({ time: 0, frequency: 1 });
    expect(nsHeader.intervalUnit).toBe('ns');
    const at = (row: string[], cols = nsHeader) => convertRow(row, cols, phaseRun);
    expect((at(['1', '12.5']) as { input: { timeInterval: number } }).input.timeInterval).toBeCloseTo(12.5e-9, 20);
    expect((at(['2', '-3 µs']) as { input: { timeInterval: number } }).input.timeInterval).toBeCloseTo(-3e-6, 18);
    expect(convertRow(['3', '0.25'], resolveColumns(['t', 'phase'], null), phaseRun)).toEqual({ input: { t: 3, timeInterval: 0.25 } });
    expect(convertRow(['4', '7', 'ps'], resolveColumns(['t', 'phase', 'unit'], null), phaseRun)).toEqual({ input: { t: 4, timeInterval: 7e-12 } });
    expect(convertRow(['5', '7', 'kHz'], resolveColumns(['t', 'phase', 'unit'], null), phaseRun)).toEqual({
      column: 'unit',
      reason: "unknown unit 'kHz' for a time interval (use s, ms, µs, ns or ps)",
    });
    expect(at(['6', ''])).toEqual({ column: 'frequency', reason: 'no time interval given' });
  });
});
