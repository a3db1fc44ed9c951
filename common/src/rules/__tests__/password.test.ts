import { passwordShapeProblem, utf8Length } from '../index.js';

// Byte counts are checked against Node's own UTF-8 encoder (Buffer.byteLength), an independent implementation.
describe('utf8Length', () => {
  it('counts bytes as Node’s UTF-8 encoder does, for 1- to 4-byte characters', () => {
    for (const text of ['', 'kilocycle', 'Dvořák', 'Ωmega', '€1735', '周波数', '🎛️ dial', 'a\u0000b']) {
      expect(utf8Length(text)).toBe(Buffer.byteLength(text, 'utf8'));
    }
  });
});

// bcrypt uses only the first 72 bytes of its input (the algorithm's key schedule; common practice, no
// published source in fixtures/): 72 is accepted, 73 refused.
describe('passwordShapeProblem', () => {
  it('accepts 12 characters and 72 bytes, refuses 11 characters and 73 bytes with a message saying why', () => {
    expect(passwordShapeProblem('x'.repeat(12))).toBeNull();
    expect(passwordShapeProblem('x'.repeat(72))).toBeNull();
    expect(passwordShapeProblem('x'.repeat(11))).toBe('password must be at least 12 characters (it has 11)');
    expect(passwordShapeProblem('x'.repeat(73))).toMatch(/^password must be at most 72 bytes in UTF-8 \(it has 73\)/);
  });

  it('counts bytes, not characters: 36 two-byte letters pass, 25 three-byte ones (75 bytes) do not', () => {
    expect(passwordShapeProblem('ř'.repeat(36))).toBeNull();
    expect(passwordShapeProblem('周'.repeat(25))).toMatch(/it has 75\)/);
  });
});
