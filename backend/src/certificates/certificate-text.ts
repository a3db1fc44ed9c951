import { printableLine, printableText } from '@kilocycle/common/text';
import type { CertificatePdfData } from './certificate-pdf.js';

/** Every string inside a value passed through `fn`; numbers, Dates and Buffers untouched. */
function mapStrings<T>(value: T, fn: (text: string) => string): T {
  if (typeof value === 'string') return fn(value) as T;
  if (Array.isArray(value)) return value.map((item) => mapStrings(item, fn)) as T;
  if (value !== null && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    return Object.fromEntries(Object.entries(value).map(([key, item]) => [key, mapStrings(item, fn)])) as T;
  }
  return value;
}

const line = printableLine;
const lineOrNull = (text: string | null): string | null => (text === null ? null : printableLine(text));

/**
 * What the certificate prints, made safe to print: every text loses its control characters and keeps
 * its line breaks (notes, condition as received, method, reasons, addresses print as paragraphs), and
 * every text printed where one line belongs (names, make, model, serial, tag, numbers, labels, the
 * standard's identity, the signatory) is made one line, so a value typed or stored with CR/LF before
 * single-line fields were enforced can neither break the layout nor print a line of its own.
 * Fields added later default to the multi-line treatment.
 */
export function printableCertificateData(data: CertificatePdfData): CertificatePdfData {
  const safe = mapStrings(data, printableText);
  return {
    ...safe,
    number: line(data.number),
    lab: { ...safe.lab, name: line(data.lab.name), place: line(data.lab.place) },
    customer: { ...safe.customer, name: line(data.customer.name), contact: lineOrNull(data.customer.contact) },
    instrument: {
      ...safe.instrument,
      make: line(data.instrument.make),
      model: line(data.instrument.model),
      serial: line(data.instrument.serial),
      assetTag: lineOrNull(data.instrument.assetTag),
    },
    job: { ...safe.job, number: line(data.job.number), receivedDate: line(data.job.receivedDate) },
    signatory: { ...safe.signatory, name: line(data.signatory.name), role: line(data.signatory.role), meaning: line(data.signatory.meaning) },
    verifyUrl: line(data.verifyUrl),
    results: {
      ...safe.results,
      jobNumber: line(data.results.jobNumber),
      decisionRuleText: line(data.results.decisionRuleText),
      procedure: { ...safe.results.procedure, name: line(data.results.procedure.name) },
      ranges: safe.results.ranges.map((range) => ({ ...range, label: line(range.label), problems: range.problems.map(line) })),
      standards: data.results.standards.map((standard) => mapStrings(standard, line)),
      flags: safe.results.flags.map((flag) => ({ ...flag, message: line(flag.message) })),
    },
  };
}
