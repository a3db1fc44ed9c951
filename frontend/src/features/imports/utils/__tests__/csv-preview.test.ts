import { describe, expect, it } from 'vitest';
import { guessColumn, guessMapping, parsePreview, splitLine } from '../csv-preview';

describe('parsePreview()', () => {
  it('reads a BOM, Windows line ends and tabs, and numbers the rows by their line in the file', () => {
    const text = '\ufeffElapsed (s)\tDial setting\tCounter\tUnit\r\n20\t1750\t1749.97\tkHz\r\n\r\n40\t1775\t1775.00\tkHz\r\n';
    const preview = parsePreview(text, 'bench.tsv', false);
    expect(preview.delimiter).toBe('\t');
    expect(preview.header).toEqual(['Elapsed (s)', 'Dial setting', 'Counter', 'Unit']);
    expect(preview.rows).toEqual([
      { line: 2, cells: ['20', '1750', '1749.97', 'kHz'] },
      { line: 4, cells: ['40', '1775', '1775.00', 'kHz'] },
    ]);
    expect(preview.more).toBe(false);
  });

  it('drops the cut-off last line of a partial read and says the file goes on', () => {
    const preview = parsePreview('frequency;dial\n1735000;1735\n1760000;17', 'x.csv', true);
    expect(preview.delimiter).toBe(';');
    expect(preview.rows.map((r) => r.cells)).toEqual([['1735000', '1735']]);
    expect(preview.more).toBe(true);
  });

  it('shows at most the first twenty rows', () => {
    const lines = ['t,frequency', ...Array.from({ length: 30 }, (_, i) => `${i},${7e6 + i}`)];
    const preview = parsePreview(lines.join('\n'), 'long.csv', false);
    expect(preview.rows).toHaveLength(20);
    expect(preview.rows[19]?.line).toBe(21);
    expect(preview.more).toBe(true);
  });
});

describe('splitLine()', () => {
  it('keeps delimiters inside quotes and reads doubled quotes', () => {
    expect(splitLine('"1,735 kHz",1735,"the ""long"" one"', ',')).toEqual(['1,735 kHz', '1735', 'the "long" one']);
  });
});

describe('guessMapping()', () => {
  it('prefills each column from the header’s first word, in any order', () => {
    expect(guessMapping(['Counter (kHz)', 'Unit', 'Dial setting', 'Elapsed', 'Supply volts'])).toEqual({
      time: 'Elapsed',
      dial: 'Dial setting',
      frequency: 'Counter (kHz)',
      unit: 'Unit',
      aux: 'Supply volts',
    });
  });

  it('leaves a column empty when no header looks like it', () => {
    expect(guessMapping(['Reading', 'Comment'])).toEqual({ time: '', dial: '', frequency: 'Reading', unit: '', aux: '' });
    expect(guessColumn('Comment')).toBeNull();
  });
});
