import { sniffContent } from './content-sniffer.js';

const bytes = (...values: number[]) => Uint8Array.from(values);
const text = (value: string) => new TextEncoder().encode(value);

describe('sniffContent()', () => {
  test.each([
    ['PNG', bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13), 'image/png'],
    ['JPEG', bytes(0xff, 0xd8, 0xff, 0xe0, 0, 0x10, 0x4a, 0x46), 'image/jpeg'],
    ['GIF', text('GIF89a\u0001\u0000'), 'image/gif'],
    ['WebP', bytes(...text('RIFF'), 0x24, 0, 0, 0, ...text('WEBPVP8 ')), 'image/webp'],
    ['PDF', text('%PDF-1.7\n%âãÏÓ'), 'application/pdf'],
    ['text', text('time,frequency\n0,7000000\n'), 'text/plain'],
  ])('%s is recognised from its bytes', (_name, head, type) => {
    expect(sniffContent(head).contentType).toBe(type);
  });

  test('a ZIP (an .xlsx) is named but not accepted', () => {
    expect(sniffContent(bytes(0x50, 0x4b, 0x03, 0x04, 0x14, 0))).toMatchObject({ contentType: null, text: false, description: expect.stringContaining('ZIP') });
  });

  test('a UTF-8 byte-order mark is measured and the rest read as text', () => {
    expect(sniffContent(bytes(0xef, 0xbb, 0xbf, ...text('t;f\r\n1;2\r\n')))).toEqual({
      contentType: 'text/plain',
      description: 'UTF-8 text',
      text: true,
      bomLength: 3,
    });
  });

  test('NUL bytes, many control characters or bytes that are not UTF-8 are not text', () => {
    expect(sniffContent(text('abc\u0000def')).text).toBe(false);
    expect(sniffContent(bytes(...Array.from({ length: 50 }, () => 0x41), 0x01, 0x02)).text).toBe(false);
    expect(sniffContent(bytes(0x41, 0xe9, 0x41)).description).toContain('not UTF-8');
    expect(sniffContent(bytes(0xff, 0xfe, 0x74, 0x00)).description).toContain('UTF-16');
    expect(sniffContent(bytes()).description).toBe('an empty file');
  });

  test('a multi-byte character cut off at the end of the sample is still text', () => {
    const head = text('Fréquence,kHz\n7 001,25 é');
    expect(sniffContent(head.subarray(0, head.length - 1)).text).toBe(true);
  });
});
