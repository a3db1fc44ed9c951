import type { BillingLine, Invoice as InvoiceView, PriceUnit } from '@kilocycle/common/types';
import { formatMoney } from '@kilocycle/common/money';
import { printableLine } from '@kilocycle/common/text';
import {
  ACCENT,
  ALERT,
  CONTENT_WIDTH,
  drawPageFrames,
  fitText,
  HEADER_FILL,
  houseDocument,
  INK,
  Layout,
  MARGIN,
  MUTED,
  ROW_FILL,
  RULE,
  type Align,
  type Doc,
} from '../shared/pdf-house-style.js';

/** The lab and the customer as printed (the lab's address from the certificate settings). */
export type BillingParties = {
  lab: { name: string; contactEmail: string | null; address?: string };
  customer: { name: string; contactEmail: string | null };
};

const UNIT_WORDS: Record<PriceUnit, string> = { per_range: 'range', per_hour: 'hour', per_job: 'job' };

/** Thousandths as a decimal, written from the digits (1500 → "1.5", 2000 → "2"). */
export function milliText(milli: number): string {
  const digits = String(Math.abs(milli)).padStart(4, '0');
  const whole = digits.slice(0, -3);
  const fraction = digits.slice(-3).replace(/0+$/, '');
  return `${milli < 0 ? '-' : ''}${whole}${fraction ? `.${fraction}` : ''}`;
}

/** Basis points as a percentage, from the digits (2000 → "20 %", 550 → "5.5 %"). */
export function rateText(basisPoints: number): string {
  const digits = String(basisPoints).padStart(3, '0');
  const fraction = digits.slice(-2).replace(/0+$/, '');
  return `${digits.slice(0, -2)}${fraction ? `.${fraction}` : ''} %`;
}

function dateText(iso: string | Date): string {
  return (typeof iso === 'string' ? iso : iso.toISOString()).slice(0, 10);
}

type Column = { title: string; width: number; align: Align };
const LINE_COLUMNS: Column[] = [
  { title: '#', width: 18, align: 'right' },
  { title: 'Code', width: 56, align: 'left' },
  { title: 'Description', width: 170, align: 'left' },
  { title: 'Quantity', width: 52, align: 'right' },
  { title: 'Unit price', width: 62, align: 'right' },
  { title: 'Net', width: 62, align: 'right' },
  { title: 'Tax', width: 30, align: 'right' },
  { title: 'Gross', width: 53.28, align: 'right' },
];

function drawRow(doc: Doc, cells: string[], y: number, font: string, size: number, fill: string | null): void {
  if (fill) doc.rect(MARGIN.left, y - 2, CONTENT_WIDTH, size + 6).fill(fill);
  let x = MARGIN.left;
  doc.font(font).fillColor(INK);
  LINE_COLUMNS.forEach((column, i) => {
    fitText(doc, cells[i] ?? '', x + 2, y, column.width - 4, column.align, size);
    x += column.width;
  });
}

function linesTable(layout: Layout, lines: readonly BillingLine[], currency: string): void {
  const doc = layout.doc;
  const rowHeight = 14;
  layout.ensure(rowHeight * 3);
  drawRow(
    doc,
    LINE_COLUMNS.map((c) => c.title),
    doc.y + 2,
    'bold',
    7.5,
    HEADER_FILL,
  );
  doc.y += rowHeight + 2;
  lines.forEach((line, i) => {
    layout.ensure(rowHeight + 2);
    const cells = [
      String(line.position),
      line.code ?? '',
      printableLine(line.description),
      `${milliText(line.quantityMilli)} ${UNIT_WORDS[line.unit]}${line.quantityMilli === 1000 ? '' : 's'}`,
      formatMoney(line.unitPriceMinor, currency),
      formatMoney(line.netMinor, currency),
      rateText(line.taxRateBasisPoints),
      formatMoney(line.grossMinor, currency),
    ];
    drawRow(doc, cells, doc.y + 2, 'sans', 7.5, i % 2 === 1 ? ROW_FILL : null);
    doc.y += rowHeight;
  });
  doc
    .moveTo(MARGIN.left, doc.y + 2)
    .lineTo(MARGIN.left + CONTENT_WIDTH, doc.y + 2)
    .lineWidth(0.4)
    .strokeColor(RULE)
    .stroke();
  doc.y += 6;
}

/** Label and amount pairs, right-aligned under the lines; the last one bold. */
function totalsBlock(layout: Layout, rows: Array<[string, string]>, strongLast = true): void {
  const doc = layout.doc;
  const width = 230;
  const x = MARGIN.left + CONTENT_WIDTH - width;
  layout.ensure(rows.length * 13 + 6);
  rows.forEach(([label, amount], i) => {
    const strong = strongLast && i === rows.length - 1;
    const y = doc.y;
    doc
      .font(strong ? 'bold' : 'sans')
      .fontSize(strong ? 9.5 : 8.5)
      .fillColor(strong ? INK : MUTED);
    doc.text(label, x, y, { width: width - 100, lineBreak: false });
    doc.font(strong ? 'monoBold' : 'mono').fillColor(INK);
    doc.text(amount, x + width - 100, y, { width: 100, align: 'right', lineBreak: false });
    doc.y = y + 13;
  });
  doc.x = MARGIN.left;
}

function title(layout: Layout, text: string, reference: string, subline: string, warning: string | null): void {
  const doc = layout.doc;
  doc.font('bold').fontSize(20).fillColor(INK).text(text, MARGIN.left, MARGIN.top, { width: CONTENT_WIDTH });
  doc
    .font('mono')
    .fontSize(10)
    .fillColor(ACCENT)
    .text(reference, MARGIN.left, doc.y + 2);
  doc
    .font('sans')
    .fontSize(8.5)
    .fillColor(MUTED)
    .text(subline, MARGIN.left, doc.y + 2);
  if (warning)
    doc
      .font('bold')
      .fontSize(8.5)
      .fillColor(ALERT)
      .text(warning, MARGIN.left, doc.y + 2, { width: CONTENT_WIDTH });
  doc.fillColor(INK);
  doc.moveDown(0.5);
}

function taxWords(invoice: { taxExempt: boolean; taxRegistration: string | null }, rateBasisPoints: number): string {
  if (invoice.taxExempt)
    return `Exempt${invoice.taxRegistration ? ` (customer's tax registration ${printableLine(invoice.taxRegistration)})` : ''}: no tax charged`;
  return `${rateText(rateBasisPoints)} on every line`;
}

/** An invoice in the house look: parties, terms, the lines as priced, totals per rate and the amount due. */
export async function renderInvoicePdf(data: BillingParties & { invoice: InvoiceView }): Promise<Buffer> {
  const inv = data.invoice;
  const labName = printableLine(data.lab.name);
  const customer = printableLine(data.customer.name);
  const reference = inv.number ?? `draft ${inv.id}`;
  const { doc, finished } = houseDocument({ Title: `Invoice ${reference}`, Author: labName, Subject: `Job ${inv.jobNumber} for ${customer}` });
  const layout = new Layout(doc);
  title(
    layout,
    'Invoice',
    inv.number ?? 'DRAFT — not issued',
    inv.issuedAt ? `Issued ${dateText(inv.issuedAt)} by ${labName}` : `Prepared by ${labName}`,
    inv.number ? null : 'This is a draft for checking. It is not a demand for payment.',
  );
  layout.heading('Laboratory and customer', 90);
  layout.fields([
    ['From', [labName, data.lab.address ? printableLine(data.lab.address) : null, data.lab.contactEmail].filter(Boolean).join('\n')],
    ['Bill to', [customer, data.customer.contactEmail].filter(Boolean).join('\n')],
    ['Job', inv.jobNumber],
  ]);
  layout.heading('Terms', 70);
  layout.fields([
    ['Invoice date', inv.issuedAt ? dateText(inv.issuedAt) : '—'],
    ['Due date', inv.dueDate ?? '—'],
    [
      'Payment terms',
      inv.paymentTerms === 'pay_before_release'
        ? 'Payment before release: the calibration certificate is released for download once this invoice is paid.'
        : 'On account: payment by the due date.',
    ],
    ['Tax', taxWords(inv, inv.lines[0]?.taxRateBasisPoints ?? 0)],
  ]);
  layout.heading('Lines', 80);
  linesTable(layout, inv.lines, inv.currency);
  const rows: Array<[string, string]> = [['Net', formatMoney(inv.totals.netMinor, inv.currency)]];
  for (const rate of inv.totals.byRate)
    rows.push([`Tax at ${rateText(rate.rateBasisPoints)} on ${formatMoney(rate.netMinor, inv.currency)}`, formatMoney(rate.taxMinor, inv.currency)]);
  rows.push([`Total (${inv.currency})`, formatMoney(inv.totals.grossMinor, inv.currency)]);
  totalsBlock(layout, rows);
  layout.paragraph(
    'Each line is rounded on its own (net to the cent, then its tax, halves away from zero); the totals are the sums of the lines as printed.',
    7,
  );
  layout.paragraph(`Please quote ${reference} with your payment. Corrections to an issued invoice are made by credit note.`, 8);
  drawPageFrames(doc, {
    labName,
    subtitle: 'Frequency calibration',
    reference: `Invoice ${reference}`,
    footer: `${labName} · invoice ${reference} · job ${inv.jobNumber} · ${customer}`,
    footerReference: (page, count) => `${reference} · ${page}/${count}`,
  });
  doc.end();
  return finished;
}

export type CreditNotePdfData = BillingParties & {
  number: string;
  invoiceNumber: string;
  jobNumber: string;
  currency: string;
  issuedAt: Date;
  reason: string;
  split: { netMinor: number; taxMinor: number; grossMinor: number };
  taxRateBasisPoints: number;
  taxExempt: boolean;
  taxRegistration: string | null;
  issuedByName: string | null;
  /** Made by a card refund. */
  refund: boolean;
};

/** A credit note in the house look: what it credits, why, and its net, tax and gross. */
export async function renderCreditNotePdf(data: CreditNotePdfData): Promise<Buffer> {
  const labName = printableLine(data.lab.name);
  const customer = printableLine(data.customer.name);
  const { doc, finished } = houseDocument({ Title: `Credit note ${data.number}`, Author: labName, Subject: `Against invoice ${data.invoiceNumber}` });
  const layout = new Layout(doc);
  title(layout, 'Credit note', data.number, `Issued ${dateText(data.issuedAt)} by ${labName}`, null);
  layout.heading('Laboratory and customer', 90);
  layout.fields([
    ['From', [labName, data.lab.address ? printableLine(data.lab.address) : null, data.lab.contactEmail].filter(Boolean).join('\n')],
    ['Credit to', [customer, data.customer.contactEmail].filter(Boolean).join('\n')],
    ['Against invoice', `${data.invoiceNumber} (job ${data.jobNumber})`],
    ['Reason', printableLine(data.reason)],
    ...(data.refund ? ([['Refund', 'Records money given back on a card payment.']] as Array<[string, string]>) : []),
    ...(data.issuedByName ? ([['Issued by', printableLine(data.issuedByName)]] as Array<[string, string]>) : []),
    ['Tax', taxWords(data, data.taxRateBasisPoints)],
  ]);
  layout.heading('Amount credited', 80);
  totalsBlock(layout, [
    ['Net', formatMoney(data.split.netMinor, data.currency)],
    [data.taxExempt ? 'Tax (exempt)' : `Tax at ${rateText(data.taxRateBasisPoints)}`, formatMoney(data.split.taxMinor, data.currency)],
    [`Total credited (${data.currency})`, formatMoney(data.split.grossMinor, data.currency)],
  ]);
  layout.paragraph('Net and tax are split in the proportion of the invoice they credit, so the credit note takes back the tax charged on it.', 7);
  drawPageFrames(doc, {
    labName,
    subtitle: 'Frequency calibration',
    reference: `Credit note ${data.number}`,
    footer: `${labName} · credit note ${data.number} against invoice ${data.invoiceNumber} · ${customer}`,
    footerReference: (page, count) => `${data.number} · ${page}/${count}`,
  });
  doc.end();
  return finished;
}
