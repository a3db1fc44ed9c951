import { formatMoney } from '@kilocycle/common/money';
import { printableLine, printableText } from '@kilocycle/common/text';
import type { BillingLine, DocumentTotals, PaymentTerms, PriceUnit } from '@kilocycle/common/types';
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
  PAGE,
  ROW_FILL,
  RULE,
  type Align,
  type Doc,
} from '../shared/pdf-house-style.js';

/** Everything printed on a quote. */
export type QuotePdfData = {
  number: string;
  /** A draft is printed with a banner saying it was not sent. */
  draft: boolean;
  lab: { name: string; address: string; contactEmail: string | null };
  customer: { name: string; contactEmail: string | null };
  job: { number: string; receivedDate: string; instrument: string };
  currency: string;
  taxExempt: boolean;
  taxRegistration: string | null;
  lines: BillingLine[];
  totals: DocumentTotals;
  validityDays: number;
  /** YYYY-MM-DD; null on a draft. */
  validUntil: string | null;
  /** The date printed as the quote's date. */
  date: Date;
  paymentTerms: PaymentTerms;
  netDays: number;
  notes: string | null;
};

const UNIT_WORDS: Record<PriceUnit, string> = { per_range: 'range', per_hour: 'hour', per_job: 'job' };

/** A quantity in thousandths as people write it: 3, 1.25. */
function quantityText(milli: number): string {
  return (milli / 1000).toLocaleString('en-GB', { maximumFractionDigits: 3 });
}

/** Basis points as a percentage: 2000 → "20 %", 1750 → "17.5 %". */
export function rateText(basisPoints: number): string {
  return `${(basisPoints / 100).toLocaleString('en-GB', { maximumFractionDigits: 2 })} %`;
}

function termsText(terms: PaymentTerms, netDays: number): string {
  return terms === 'on_account'
    ? `On account: the invoice is due ${netDays} day${netDays === 1 ? '' : 's'} after its date.`
    : 'Payment before release: the certificate is released once the invoice is paid.';
}

type LineColumn = { title: string; width: number; align: Align };

function lineColumns(): LineColumn[] {
  const columns: LineColumn[] = [
    { title: 'Code', width: 58, align: 'left' },
    { title: 'Description', width: 0, align: 'left' },
    { title: 'Qty', width: 40, align: 'right' },
    { title: 'Unit', width: 38, align: 'left' },
    { title: 'Unit price', width: 66, align: 'right' },
    { title: 'Tax', width: 38, align: 'right' },
    { title: 'Net', width: 72, align: 'right' },
  ];
  columns[1]!.width = CONTENT_WIDTH - columns.reduce((w, c) => w + c.width, 0);
  return columns;
}

const ROW = 12.5;

function drawLinesHeader(doc: Doc, columns: readonly LineColumn[]): void {
  const y = doc.y;
  doc.rect(MARGIN.left, y, CONTENT_WIDTH, 15).fill(HEADER_FILL);
  doc.font('medium').fontSize(7).fillColor(MUTED);
  let x = MARGIN.left;
  for (const c of columns) {
    doc.text(c.title, x + 3, y + 4.5, { width: c.width - 6, align: c.align, lineBreak: false });
    x += c.width;
  }
  doc.y = y + 17;
}

/** The lines: code, description (wrapped), quantity, unit, unit price, tax rate, net; every other row shaded. */
function linesTable(layout: Layout, data: QuotePdfData): void {
  const doc = layout.doc;
  const columns = lineColumns();
  layout.ensure(17 + ROW * 3);
  drawLinesHeader(doc, columns);
  data.lines.forEach((line, index) => {
    doc.font('sans').fontSize(7.8);
    const height = Math.max(ROW, doc.heightOfString(line.description, { width: columns[1]!.width - 6 }) + 3.5);
    if (doc.y + height > PAGE.height - MARGIN.bottom) {
      doc.addPage();
      doc.y = MARGIN.top;
      drawLinesHeader(doc, columns);
    }
    const y = doc.y;
    if (index % 2 === 1) doc.rect(MARGIN.left, y - 1.5, CONTENT_WIDTH, height).fill(ROW_FILL);
    const cells = [
      line.code ?? '',
      line.description,
      quantityText(line.quantityMilli),
      UNIT_WORDS[line.unit],
      formatMoney(line.unitPriceMinor, data.currency),
      data.taxExempt ? 'exempt' : rateText(line.taxRateBasisPoints),
      formatMoney(line.netMinor, data.currency),
    ];
    let x = MARGIN.left;
    cells.forEach((cell, i) => {
      const c = columns[i]!;
      if (i === 1) {
        doc
          .font('sans')
          .fontSize(7.8)
          .fillColor(INK)
          .text(cell, x + 3, y + 1, { width: c.width - 6 });
      } else {
        doc.font(i === 0 || i >= 2 ? 'mono' : 'sans').fillColor(INK);
        fitText(doc, cell, x + 3, y + 1, c.width - 6, c.align, 7.4);
      }
      x += c.width;
    });
    doc.y = y + height;
  });
  doc
    .moveTo(MARGIN.left, doc.y)
    .lineTo(MARGIN.left + CONTENT_WIDTH, doc.y)
    .lineWidth(0.4)
    .strokeColor(RULE)
    .stroke();
  doc.y += 4;
}

/** Net and tax per rate, then the totals, right-aligned under the lines. */
function totalsBlock(layout: Layout, data: QuotePdfData): void {
  const doc = layout.doc;
  const rows: Array<[string, string, boolean]> = [];
  if (data.taxExempt) {
    rows.push(['Net', formatMoney(data.totals.netMinor, data.currency), false]);
    rows.push([`Tax: exempt${data.taxRegistration ? ` (registration ${data.taxRegistration})` : ''}`, formatMoney(0, data.currency), false]);
  } else {
    for (const group of data.totals.byRate) {
      rows.push([`Net at ${rateText(group.rateBasisPoints)}`, formatMoney(group.netMinor, data.currency), false]);
      rows.push([`Tax at ${rateText(group.rateBasisPoints)}`, formatMoney(group.taxMinor, data.currency), false]);
    }
    if (data.totals.byRate.length > 1) rows.push(['Net total', formatMoney(data.totals.netMinor, data.currency), false]);
  }
  rows.push([`Total (${data.currency})`, formatMoney(data.totals.grossMinor, data.currency), true]);
  layout.ensure(rows.length * 12 + 10);
  const labelX = MARGIN.left + CONTENT_WIDTH - 300;
  for (const [label, value, strong] of rows) {
    const y = doc.y;
    if (strong) {
      doc
        .moveTo(labelX, y)
        .lineTo(MARGIN.left + CONTENT_WIDTH, y)
        .lineWidth(0.6)
        .strokeColor(ACCENT)
        .stroke();
      doc.y = y + 3;
    }
    doc
      .font(strong ? 'bold' : 'sans')
      .fontSize(strong ? 9.5 : 8)
      .fillColor(strong ? ACCENT : MUTED)
      .text(label, labelX, doc.y, { width: 200, align: 'right', lineBreak: false });
    doc
      .font(strong ? 'monoBold' : 'mono')
      .fontSize(strong ? 9.5 : 8)
      .fillColor(INK)
      .text(value, labelX + 200, doc.y, { width: 100, align: 'right', lineBreak: false });
    doc.y += strong ? 14 : 11.5;
  }
  doc.x = MARGIN.left;
}

function printable(input: QuotePdfData): QuotePdfData {
  const line = (s: string) => printableLine(s);
  return {
    ...input,
    number: line(input.number),
    lab: { name: line(input.lab.name), address: printableText(input.lab.address), contactEmail: input.lab.contactEmail && line(input.lab.contactEmail) },
    customer: { name: line(input.customer.name), contactEmail: input.customer.contactEmail && line(input.customer.contactEmail) },
    job: { number: line(input.job.number), receivedDate: input.job.receivedDate, instrument: line(input.job.instrument) },
    taxRegistration: input.taxRegistration && line(input.taxRegistration),
    lines: input.lines.map((l) => ({ ...l, code: l.code && line(l.code), description: line(l.description) })),
    notes: input.notes && printableText(input.notes),
  };
}

/** Draws the quote in the house look of the certificates (shared/pdf-house-style.ts). */
export async function renderQuotePdf(input: QuotePdfData): Promise<Buffer> {
  const data = printable(input);
  const date = data.date.toISOString().slice(0, 10);
  const { doc, finished } = houseDocument({
    Title: `Quote ${data.number}`,
    Author: data.lab.name,
    Subject: `Quote ${data.number} for job ${data.job.number}, ${data.job.instrument}`,
    CreationDate: data.date,
  });
  const layout = new Layout(doc);

  doc.font('bold').fontSize(20).fillColor(INK).text('Quotation', MARGIN.left, MARGIN.top, { width: CONTENT_WIDTH });
  doc
    .font('mono')
    .fontSize(10)
    .fillColor(ACCENT)
    .text(`${data.number}  ·  job ${data.job.number}`, MARGIN.left, doc.y + 2);
  doc
    .font('sans')
    .fontSize(8.5)
    .fillColor(MUTED)
    .text(
      data.validUntil ? `Dated ${date} by ${data.lab.name}; valid until ${data.validUntil}` : `Prepared ${date} by ${data.lab.name}`,
      MARGIN.left,
      doc.y + 2,
    );
  if (data.draft) {
    doc
      .font('bold')
      .fontSize(8.5)
      .fillColor(ALERT)
      .text('Draft: not yet sent to the customer, and not an offer.', MARGIN.left, doc.y + 2);
  }
  doc.fillColor(INK);

  layout.heading('Laboratory and customer', 90);
  layout.fields([
    ['Laboratory', `${data.lab.name}\n${data.lab.address}`],
    ['Laboratory contact', data.lab.contactEmail ?? ''],
    ['Customer', data.customer.name],
    ['Customer contact', data.customer.contactEmail ?? ''],
    ['Tax', data.taxExempt ? `Exempt, registration ${data.taxRegistration ?? 'not given'}` : 'Charged at the rate shown on each line'],
  ]);

  layout.heading('Work quoted', 70);
  layout.fields([
    ['Job', data.job.number],
    ['Instrument', data.job.instrument],
    ['Received', data.job.receivedDate],
  ]);

  layout.heading('Prices', 80);
  if (data.lines.length === 0) layout.paragraph('No lines yet.');
  else linesTable(layout, data);
  totalsBlock(layout, data);

  layout.heading('Terms', 70);
  layout.fields([
    ['Validity', data.validUntil ? `${data.validityDays} days, until ${data.validUntil}` : `${data.validityDays} days from the day it is sent`],
    ['Payment', termsText(data.paymentTerms, data.netDays)],
    ['Rounding', "Each line's net and tax are rounded to the smallest unit of the currency, halves away from zero; the totals are the sums of the lines."],
    ...(data.notes ? ([['Notes', data.notes]] as Array<[string, string]>) : []),
  ]);
  layout.paragraph('To accept or decline, use the customer portal or reply to the e-mail this quote came with. Work starts once the quote is accepted.', 8);

  drawPageFrames(doc, {
    labName: data.lab.name,
    subtitle: 'Frequency calibration',
    reference: `Quote ${data.number}`,
    footer: `Prices in ${data.currency}. ${data.validUntil ? `Valid until ${data.validUntil}.` : 'Draft.'}`,
    footerReference: (page, count) => `${data.number} · ${page}/${count}`,
  });
  doc.end();
  return finished;
}
