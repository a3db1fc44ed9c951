import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import PDFDocument from 'pdfkit';

// The house look of every PDF the lab sends (certificates, quotes, invoices): shipped fonts, A4 with the same
// margins, colours, section headings, label/value rows, and the header and footer on every page.

const require = createRequire(import.meta.url);
function fontPath(pkg: string, file: string): string {
  return join(dirname(require.resolve(`@expo-google-fonts/${pkg}/package.json`)), file);
}
/** Full TTFs shipped with the app (OFL): every Latin, Greek and Cyrillic letter prints. */
export const FONTS = {
  sans: fontPath('roboto', '400Regular/Roboto_400Regular.ttf'),
  bold: fontPath('roboto', '700Bold/Roboto_700Bold.ttf'),
  medium: fontPath('roboto', '500Medium/Roboto_500Medium.ttf'),
  mono: fontPath('roboto-mono', '400Regular/RobotoMono_400Regular.ttf'),
  monoBold: fontPath('roboto-mono', '700Bold/RobotoMono_700Bold.ttf'),
};

export const PAGE = { width: 595.28, height: 841.89 };
export const MARGIN = { left: 46, right: 46, top: 74, bottom: 64 };
export const CONTENT_WIDTH = PAGE.width - MARGIN.left - MARGIN.right;
export const INK = '#1b1f24';
export const MUTED = '#5b6470';
export const RULE = '#c9ced6';
export const ACCENT = '#0f5c6e';
export const FOUND = '#9a6b1f';
export const ALERT = '#a3261b';
/** The shading of a table's header and of every other row. */
export const HEADER_FILL = '#eef1f4';
export const ROW_FILL = '#f7f8fa';

export type Doc = PDFKit.PDFDocument;
export type Align = 'left' | 'right' | 'center';

/**
 * A new A4 document in the house fonts. Pages are buffered so the frames ("Page x of y") are drawn at the end;
 * `finished` resolves with the bytes once `doc.end()` is called.
 */
export function houseDocument(info: PDFKit.DocumentInfo): { doc: Doc; finished: Promise<Buffer> } {
  const doc = new PDFDocument({ size: 'A4', margins: MARGIN, bufferPages: true, autoFirstPage: true, info: { Creator: 'Kilocycle', ...info } });
  for (const [name, path] of Object.entries(FONTS)) doc.registerFont(name, path);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  return { doc, finished };
}

export class Layout {
  constructor(readonly doc: Doc) {}

  get y(): number {
    return this.doc.y;
  }

  /** Starts a new page unless `height` points still fit on this one. */
  ensure(height: number): void {
    if (this.doc.y + height > PAGE.height - MARGIN.bottom) {
      this.doc.addPage();
      this.doc.y = MARGIN.top;
    }
  }

  heading(text: string, space = 60): void {
    this.ensure(space);
    const doc = this.doc;
    doc.moveDown(0.6);
    doc.font('bold').fontSize(10.5).fillColor(ACCENT).text(text, MARGIN.left, doc.y, { width: CONTENT_WIDTH });
    const y = doc.y + 1.5;
    doc
      .moveTo(MARGIN.left, y)
      .lineTo(MARGIN.left + CONTENT_WIDTH, y)
      .lineWidth(0.6)
      .strokeColor(ACCENT)
      .stroke();
    doc.y = y + 5;
    doc.fillColor(INK);
  }

  paragraph(text: string, size = 8.5, font = 'sans'): void {
    this.ensure(size * 3);
    this.doc.font(font).fontSize(size).fillColor(INK).text(text, MARGIN.left, this.doc.y, { width: CONTENT_WIDTH, lineGap: 1.5 });
    this.doc.moveDown(0.35);
  }

  /** Label/value rows: label in a narrow muted column, value beside it. */
  fields(rows: Array<[string, string]>, x = MARGIN.left, width = CONTENT_WIDTH, labelWidth = 118): void {
    const doc = this.doc;
    for (const [label, value] of rows) {
      doc.font('sans').fontSize(8.5);
      const h = Math.max(doc.heightOfString(value || '—', { width: width - labelWidth }), 10);
      this.ensure(h + 3);
      const y = doc.y;
      doc
        .font('sans')
        .fontSize(7.5)
        .fillColor(MUTED)
        .text(label, x, y + 0.8, { width: labelWidth - 6 });
      doc
        .font('sans')
        .fontSize(8.5)
        .fillColor(INK)
        .text(value || '—', x + labelWidth, y, { width: width - labelWidth });
      doc.y = y + h + 3;
    }
  }
}

/** Draws `text` in one line within `width`, stepping the size down (to 70 %) rather than letting it run over. */
export function fitText(doc: Doc, text: string, x: number, y: number, width: number, align: Align, size: number): void {
  let fontSize = size;
  doc.fontSize(fontSize);
  while (doc.widthOfString(text) > width && fontSize > size * 0.7) {
    fontSize -= 0.2;
    doc.fontSize(fontSize);
  }
  doc.text(text, x, y + (size - fontSize) * 0.6, { width, align, lineBreak: false });
}

/** What the header and footer of every page say. */
export type PageFrame = {
  /** Top left, bold: the lab's name. */
  labName: string;
  /** Top left, under the name. */
  subtitle: string;
  /** Top right: the document and its number. */
  reference: string;
  /** Footer, left. */
  footer: string;
  /** Footer, right: a short reference with the page, e.g. "Q-000004 · 1/2". */
  footerReference: (page: number, count: number) => string;
};

/** The header and footer on every page ("Page x of y" needs the page count, so they are drawn last). */
export function drawPageFrames(doc: Doc, frame: PageFrame): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0; // writing into the footer band must not start a new page
    const page = i - range.start + 1;
    doc.font('bold').fontSize(8.5).fillColor(INK).text(frame.labName, MARGIN.left, 30, { width: 300, lineBreak: false });
    doc.font('sans').fontSize(7).fillColor(MUTED).text(frame.subtitle, MARGIN.left, 41, { width: 300, lineBreak: false });
    doc
      .font('mono')
      .fontSize(8)
      .fillColor(INK)
      .text(frame.reference, PAGE.width - MARGIN.right - 260, 30, { width: 260, align: 'right', lineBreak: false });
    doc
      .font('mono')
      .fontSize(8)
      .fillColor(INK)
      .text(`Page ${page} of ${range.count}`, PAGE.width - MARGIN.right - 260, 41, { width: 260, align: 'right', lineBreak: false });
    doc
      .moveTo(MARGIN.left, 54)
      .lineTo(PAGE.width - MARGIN.right, 54)
      .lineWidth(0.6)
      .strokeColor(ACCENT)
      .stroke();
    const fy = PAGE.height - 46;
    doc
      .moveTo(MARGIN.left, fy)
      .lineTo(PAGE.width - MARGIN.right, fy)
      .lineWidth(0.4)
      .strokeColor(RULE)
      .stroke();
    doc
      .font('sans')
      .fontSize(6.5)
      .fillColor(MUTED)
      .text(frame.footer, MARGIN.left, fy + 5, { width: CONTENT_WIDTH - 115, lineBreak: false });
    doc
      .font('mono')
      .fontSize(6.5)
      .fillColor(MUTED)
      .text(frame.footerReference(page, range.count), PAGE.width - MARGIN.right - 110, fy + 5, { width: 110, align: 'right', lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}
