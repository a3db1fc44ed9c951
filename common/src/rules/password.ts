import { MAX_PASSWORD_BYTES, MIN_PASSWORD_LENGTH } from '../types/auth.js';

/** Bytes of the text in UTF-8 (what bcrypt hashes): 1 to 4 per code point, by its value. */
export function utf8Length(text: string): number {
  let bytes = 0;
  for (const char of text) {
    const code = char.codePointAt(0)!;
    bytes += code < 0x80 ? 1 : code < 0x800 ? 2 : code < 0x10000 ? 3 : 4;
  }
  return bytes;
}

/**
 * The shape rule every new password must meet, on both sides: at least MIN_PASSWORD_LENGTH characters
 * and at most MAX_PASSWORD_BYTES bytes in UTF-8, because bcrypt ignores everything past its 72nd byte
 * (a longer password would sign in with its first 72 bytes followed by anything). The server then also
 * refuses guessable passwords (common ones, the account's own name or e-mail): users/password-policy.ts.
 * Returns the message naming the problem, or null.
 */
export function passwordShapeProblem(password: string): string | null {
  const characters = [...password].length;
  if (characters < MIN_PASSWORD_LENGTH) return `password must be at least ${MIN_PASSWORD_LENGTH} characters (it has ${characters})`;
  const bytes = utf8Length(password);
  if (bytes > MAX_PASSWORD_BYTES) {
    return `password must be at most ${MAX_PASSWORD_BYTES} bytes in UTF-8 (it has ${bytes}): the hashing ignores anything past the ${MAX_PASSWORD_BYTES}th byte`;
  }
  return null;
}
