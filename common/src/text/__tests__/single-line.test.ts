// Single-line text: the characters refused are the Unicode general categories Cc (control: C0, DEL, C1), Zl
// (U+2028 LINE SEPARATOR) and Zp (U+2029 PARAGRAPH SEPARATOR), as the JavaScript engine's own Unicode data
// classifies them (an oracle independent of the code under test).
import { isSingleLineText, printableLine, printableText, singleLineMessage } from '../single-line.js';

const UNICODE_CONTROL_OR_SEPARATOR = /^[\p{Cc}\p{Zl}\p{Zp}]$/u;

describe('isSingleLineText()', () => {
  test('refuses exactly the Cc, Zl and Zp characters of the Basic Multilingual Plane', () => {
    const disagree: string[] = [];
    for (let cp = 0; cp <= 0xffff; cp++) {
      if (cp >= 0xd800 && cp <= 0xdfff) continue; // lone surrogates are not characters
      const ch = String.fromCharCode(cp);
      if (isSingleLineText(`a${ch}b`) === UNICODE_CONTROL_OR_SEPARATOR.test(ch)) disagree.push(cp.toString(16));
    }
    expect(disagree).toEqual([]);
  });

  test.each([
    ['CR LF', 'SN 1234\r\nPASS'],
    ['LF', 'SN 1234\nPASS'],
    ['CR', 'SN 1234\rPASS'],
    ['TAB', 'SN\t1234'],
    ['NUL', 'SN\u00001234'],
    ['ESC', 'SN \u001b[2J'],
    ['DEL', 'SN\u007f'],
    ['NEL (C1)', 'SN\u0085PASS'],
    ['LINE SEPARATOR', 'SN\u2028PASS'],
    ['PARAGRAPH SEPARATOR', 'SN\u2029PASS'],
  ])('refuses %s', (_name, text) => {
    expect(isSingleLineText(text)).toBe(false);
  });

  test.each(['HR 3318L', 'Harwick Radio SG 144H/4S', 'Ångström & Söhne — Schwebungssummer', '短波受信機', 'RX-9A/LAB 📻', 'a@b.example', ''])(
    'accepts ordinary text: %s',
    (text) => {
      expect(isSingleLineText(text)).toBe(true);
    },
  );

  test('the message names the field', () => {
    expect(singleLineMessage('serial')).toBe('serial must be a single line of text without control characters');
  });
});

describe('printableLine()', () => {
  test('line breaks and tabs become one space, other control characters go', () => {
    expect(printableLine('Signal\r\ngenerator\tmk II\u0007')).toBe('Signal generator mk II');
    expect(printableLine('SN 1234\r\n\r\nCalibration: PASS')).toBe('SN 1234 Calibration: PASS');
    expect(printableLine('a\u2028b\u2029c\u0085d\u000be\u000cf')).toBe('a b c d e f');
    expect(printableLine('  \u001b[31mred\u001b[0m  ')).toBe('[31mred[0m');
  });

  test('ordinary text is unchanged', () => {
    expect(printableLine('Ångström & Söhne — 7 001.250 kHz')).toBe('Ångström & Söhne — 7 001.250 kHz');
  });
});

describe('printableText()', () => {
  test('keeps line breaks, as LF, whatever the convention', () => {
    expect(printableText('Dial cord slips.\r\nCase cracked.\rKnob missing.\u2028Fuse blown.')).toBe(
      'Dial cord slips.\nCase cracked.\nKnob missing.\nFuse blown.',
    );
  });

  test('at most one empty line; spaces at line ends and the ends trimmed', () => {
    expect(printableText('\n\nFirst.   \n\n\n\n\n\nSecond.\n\n')).toBe('First.\n\nSecond.');
  });

  test('drops other control characters, tabs become spaces', () => {
    expect(printableText('Hum\u0000 at\t50 Hz\u001b[2J\u007f\u009b')).toBe('Hum at 50 Hz[2J');
  });
});
