/**
 * How a certificate, its mails and a job's review name an instrument: "make model, serial S" (the
 * instruments module's own lists use their own wording). Shared by certificates and reviews.
 */
export function instrumentLabel(i: { make: string; model: string; serial: string }): string {
  return `${i.make} ${i.model}, serial ${i.serial}`;
}
