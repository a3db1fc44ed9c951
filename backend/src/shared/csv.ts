/** Characters that make a spreadsheet read a text cell as a formula (CSV injection). */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * One CSV cell (RFC 4180): numbers as the shortest text that reads back to the same double, text
 * quoted when it holds a comma, quote or line break, and text that a spreadsheet would run as a
 * formula prefixed with an apostrophe. null and undefined are empty cells.
 */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (value instanceof Date) return value.toISOString();
  let text = String(value);
  if (FORMULA_START.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A CSV line with its CRLF ending. */
export function csvLine(values: readonly unknown[]): string {
  return values.map(csvCell).join(',') + '\r\n';
}

/** Content-Disposition for a download, with an ASCII fallback name and the UTF-8 one (RFC 6266). */
export function attachmentDisposition(fileName: string, disposition: 'attachment' | 'inline' = 'attachment'): string {
  const fallback = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `${disposition}; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
