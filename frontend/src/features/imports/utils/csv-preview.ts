import { IMPORT_COLUMNS, type ImportColumn } from '@kilocycle/common/types';

// The preview only: the first lines of the file, split simply (quotes honoured, no multi-line cells).
// The server parses the whole file itself and is the judge of every row.

export type Delimiter = ',' | '\t' | ';';

export type CsvPreview = {
  delimiter: Delimiter;
  header: string[];
  /** Each row with its line in the file (the header is line 1). */
  rows: Array<{ line: number; cells: string[] }>;
  /** The file goes on beyond the rows shown. */
  more: boolean;
};

export const PREVIEW_ROWS = 20;
/** Enough of the file for twenty lines of any sensible width. */
export const PREVIEW_BYTES = 64 * 1024;

/** Tab, semicolon or comma: whichever the first line has most of outside quotes (a .tsv name prefers tab). */
export function detectDelimiter(firstLine: string, fileName: string): Delimiter {
  const counts: Record<Delimiter, number> = { ',': 0, '\t': 0, ';': 0 };
  let quoted = false;
  for (const c of firstLine) {
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === ',' || c === '\t' || c === ';')) counts[c]++;
  }
  const order: Delimiter[] = /\.(tsv|tab)$/i.test(fileName) ? ['\t', ',', ';'] : [',', '\t', ';'];
  let best = order[0]!;
  for (const d of order) if (counts[d] > counts[best]) best = d;
  return best;
}

/** One line split on the delimiter; "quoted, cells" keep their delimiters and "" is a quote. */
export function splitLine(line: string, delimiter: Delimiter): string[] {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"' && cell.trim() === '') {
      quoted = true;
      cell = '';
    } else if (c === delimiter) {
      cells.push(cell.trim());
      cell = '';
    } else cell += c;
  }
  cells.push(cell.trim());
  return cells;
}

/** The header and first rows of a file's beginning (a BOM and Windows or old Mac line ends are fine). */
export function parsePreview(text: string, fileName: string, truncated: boolean, maxRows = PREVIEW_ROWS): CsvPreview {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split(/\r\n|\n|\r/);
  // A cut-off read ends in the middle of a line: that part is not shown.
  if (truncated && lines.length > 1) lines.pop();
  const numbered = lines.map((text, i) => ({ text, line: i + 1 })).filter((l) => l.text.trim() !== '');
  const headerLine = numbered[0]?.text ?? '';
  const delimiter = detectDelimiter(headerLine, fileName);
  const rows = numbered.slice(1, maxRows + 1).map((l) => ({ line: l.line, cells: splitLine(l.text, delimiter) }));
  return { delimiter, header: splitLine(headerLine, delimiter), rows, more: truncated || numbered.length > maxRows + 1 };
}

// First words of a header, per column, as the server reads them ("Frequency (kHz)" → frequency).
const ALIASES: Record<ImportColumn, readonly string[]> = {
  time: ['time', 't', 'ts', 's', 'sec', 'secs', 'second', 'seconds', 'elapsed', 'timestamp', 'min', 'mins', 'minutes'],
  dial: ['dial', 'setting', 'settings', 'mark', 'div', 'division', 'divisions', 'scale'],
  frequency: ['frequency', 'freq', 'f', 'counter', 'measured', 'reading', 'output', 'hz', 'khz', 'mhz'],
  unit: ['unit', 'units'],
  aux: ['aux', 'supply', 'voltage', 'volts', 'v', 'key', 'keying', 'keystate'],
};

/** The column a header most likely holds, or null. */
export function guessColumn(header: string): ImportColumn | null {
  const words = header
    .toLowerCase()
    .replace(/[([].*?[)\]]/g, ' ')
    .split(/[^a-z0-9µ]+/)
    .filter((w) => w !== '');
  const first = words[0];
  if (first === undefined) return null;
  for (const column of IMPORT_COLUMNS) if (ALIASES[column].includes(first) || ALIASES[column].includes(words.join(''))) return column;
  return null;
}

export type ColumnMapping = Record<ImportColumn, string>;

/** Each column prefilled with the first header that looks like it ('' where none does). */
export function guessMapping(header: readonly string[]): ColumnMapping {
  const mapping: ColumnMapping = { time: '', dial: '', frequency: '', unit: '', aux: '' };
  for (const name of header) {
    const column = guessColumn(name);
    if (column && mapping[column] === '') mapping[column] = name;
  }
  return mapping;
}

/** Reads the beginning of a file and previews it. */
export async function previewFile(file: File): Promise<CsvPreview> {
  const truncated = file.size > PREVIEW_BYTES;
  const text = await file.slice(0, PREVIEW_BYTES).text();
  return parsePreview(text, file.name, truncated);
}

/** The refused rows as a CSV report (line, column, reason). */
export function rejectionsCsv(rejected: ReadonlyArray<{ line: number; column: string; reason: string }>): string {
  const cell = (value: string | number) => {
    const text = String(value);
    return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
  };
  return ['line,column,reason', ...rejected.map((r) => [r.line, r.column, r.reason].map(cell).join(','))].join('\r\n') + '\r\n';
}
