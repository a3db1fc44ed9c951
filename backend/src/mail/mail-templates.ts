import type { JobOutcomes } from '@kilocycle/common/types';
import type { OutgoingMail } from './mailer.js';
import { printableMailInput } from './mail-text.js';

// The sign-off (where replies go) and the HTML part are added by Mailer.send, which knows the lab's contact address.

export function certificateIssuedMail(raw: {
  to: string[];
  labName: string;
  number: string;
  revision: number;
  replacesRevision: number | null;
  instrument: string;
  customer: string;
  verifyUrl: string;
  /** The job's two outcomes: both are stated, and an as-found failure is said plainly. */
  outcomes: JobOutcomes;
  pdf: Buffer;
  fileName: string;
}): OutgoingMail {
  const input = printableMailInput(raw);
  const revisionText = input.replacesRevision ? `revision ${input.revision}, which replaces revision ${input.replacesRevision}` : `revision ${input.revision}`;
  const found = input.outcomes.asFound;
  // Labs tell the customer of an as-found failure so they can judge the work the instrument did since its last calibration.
  const foundOut =
    found && found.outOfTolerance > 0
      ? `\n\nThe instrument was found out of tolerance at ${found.outOfTolerance} of ${found.settings} setting${found.settings === 1 ? '' : 's'}` +
        `${input.outcomes.asLeft ? ' before adjustment' : ''}. Please consider the effect on work done with it since its last calibration.`
      : '';
  return {
    kind: 'certificate_issued',
    to: input.to,
    subject: `Calibration certificate ${input.number} (rev. ${input.revision}) for ${input.instrument}`,
    text:
      `Hello,\n\n${input.labName} has issued calibration certificate ${input.number}, ${revisionText}, ` +
      `for ${input.instrument} (${input.customer}). The signed PDF is attached.\n\n` +
      `Results: ${input.outcomes.summary}${foundOut}\n\n` +
      `Anyone can check that a copy is the one issued, and whether it is still valid, at:\n${input.verifyUrl}`,
    links: [input.verifyUrl],
    attachments: [{ filename: input.fileName, content: input.pdf, contentType: 'application/pdf' }],
  };
}

export function jobReturnedMail(raw: {
  to: string;
  technician: string;
  lead: string;
  jobNumber: string;
  instrument: string;
  comment: string;
  jobUrl: string;
}): OutgoingMail {
  const input = printableMailInput(raw, ['comment']);
  return {
    kind: 'job_returned',
    to: [input.to],
    subject: `Job ${input.jobNumber} returned for rework`,
    text:
      `Hello ${input.technician},\n\n${input.lead} has returned job ${input.jobNumber} (${input.instrument}) for rework:\n\n` +
      `${input.comment
        .split('\n')
        .map((l) => `  ${l}`)
        .join('\n')}\n\nOpen the job: ${input.jobUrl}`,
    links: [input.jobUrl],
  };
}

export function recallReminderMail(raw: {
  to: string[];
  labName: string;
  customer: string;
  instruments: Array<{ label: string; dueDate: string }>;
  portalUrl: string;
}): OutgoingMail {
  const input = printableMailInput(raw);
  const lines = input.instruments.map((i) => `  - ${i.label}: due ${i.dueDate}`).join('\n');
  return {
    kind: 'recall_reminder',
    to: input.to,
    subject:
      input.instruments.length === 1
        ? `Calibration due ${input.instruments[0]!.dueDate}: ${input.instruments[0]!.label}`
        : `Calibration due soon for ${input.instruments.length} instruments`,
    text:
      `Hello,\n\nThis is a reminder from ${input.labName} that the calibration of the following ` +
      `${input.instruments.length === 1 ? 'instrument' : 'instruments'} of ${input.customer} falls due soon:\n\n${lines}\n\n` +
      `To book it in, write to the laboratory (see below). Your instruments and certificates: ${input.portalUrl}`,
    links: [input.portalUrl],
  };
}

export function quoteSentMail(raw: {
  to: string[];
  labName: string;
  number: string;
  jobNumber: string;
  instrument: string;
  customer: string;
  /** The total with tax, as printed ("€1,234.50"). */
  total: string;
  /** YYYY-MM-DD */
  validUntil: string;
  portalUrl: string;
  pdf: Buffer;
  fileName: string;
}): OutgoingMail {
  const input = printableMailInput(raw);
  return {
    kind: 'quote_sent',
    to: input.to,
    subject: `Quote ${input.number} for ${input.instrument} (job ${input.jobNumber})`,
    text:
      `Hello,\n\n${input.labName} quotes ${input.total} for the work on ${input.instrument} of ${input.customer} ` +
      `(job ${input.jobNumber}). The quote is attached as a PDF and is valid until ${input.validUntil}.\n\n` +
      `You can accept or decline it in the portal, or tell the laboratory by reply:\n${input.portalUrl}`,
    links: [input.portalUrl],
    attachments: [{ filename: input.fileName, content: input.pdf, contentType: 'application/pdf' }],
  };
}
