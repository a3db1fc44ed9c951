import type { OutgoingMail } from './mailer.js';
import { printableMailInput } from './mail-text.js';

// Billing mail: an issued invoice and a credit note, each with its PDF, and the reminder of an overdue invoice.
// Amounts arrive already written for people (formatMoney); the sign-off is added by Mailer.send.

export function invoiceIssuedMail(raw: {
  to: string[];
  labName: string;
  customer: string;
  number: string;
  jobNumber: string;
  amount: string;
  dueDate: string;
  payBeforeRelease: boolean;
  invoiceUrl: string;
  pdf: Buffer;
}): OutgoingMail {
  const input = printableMailInput(raw);
  const release = input.payBeforeRelease
    ? `\n\nThe calibration certificate for this job is released for download in the portal once the invoice is paid; you can pay it by card there.`
    : '';
  return {
    kind: 'invoice_issued',
    to: input.to,
    subject: `Invoice ${input.number} for job ${input.jobNumber}: ${input.amount}`,
    text:
      `Hello,\n\n${input.labName} has issued invoice ${input.number} to ${input.customer} for job ${input.jobNumber}: ` +
      `${input.amount}, due ${input.dueDate}. The invoice is attached as a PDF.${release}\n\nThe invoice in the portal: ${input.invoiceUrl}`,
    links: [input.invoiceUrl],
    attachments: [{ filename: `${raw.number}.pdf`, content: raw.pdf, contentType: 'application/pdf' }],
  };
}

export function creditNoteMail(raw: {
  to: string[];
  labName: string;
  customer: string;
  number: string;
  invoiceNumber: string;
  amount: string;
  reason: string;
  pdf: Buffer;
}): OutgoingMail {
  const input = printableMailInput(raw);
  return {
    kind: 'credit_note',
    to: input.to,
    subject: `Credit note ${input.number} against invoice ${input.invoiceNumber}: ${input.amount}`,
    text:
      `Hello,\n\n${input.labName} has issued credit note ${input.number} to ${input.customer} against invoice ${input.invoiceNumber}: ` +
      `${input.amount} (${input.reason}). The credit note is attached as a PDF.`,
    attachments: [{ filename: `${raw.number}.pdf`, content: raw.pdf, contentType: 'application/pdf' }],
  };
}

export function invoiceOverdueMail(raw: {
  to: string[];
  labName: string;
  customer: string;
  number: string;
  dueDate: string;
  balance: string;
  invoiceUrl: string;
}): OutgoingMail {
  const input = printableMailInput(raw);
  return {
    kind: 'invoice_overdue',
    to: input.to,
    subject: `Reminder: invoice ${input.number} was due ${input.dueDate}`,
    text:
      `Hello,\n\nThis is a reminder from ${input.labName} that invoice ${input.number} to ${input.customer} was due on ${input.dueDate} ` +
      `and ${input.balance} of it is still open. If you have paid it in the last few days, please disregard this message.\n\n` +
      `The invoice, and the button to pay it by card: ${input.invoiceUrl}`,
    links: [input.invoiceUrl],
  };
}
