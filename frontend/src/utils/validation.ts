const EMAIL_PATTERN = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** A light check for typing slips; the server has the final word on an address. */
export function looksLikeEmail(value: string) {
  return EMAIL_PATTERN.test(value.trim());
}
