import {
  CALIBRATION_RUN_KINDS,
  IMPORT_COLUMNS,
  type FrequencyUnit,
  type ImportColumn,
  type ImportMapping,
  type ReadingInput,
  type RunDataKind,
  type RunKind,
} from '@kilocycle/common/types';
import { parseFrequency, parseNumber, parseTimeInterval } from '@kilocycle/common/units';

export type Delimiter = ',' | '\t' | ';';
export type Newline = '\r\n' | '\n' | '\r';

/** A problem with the file as a whole (header, mapping): 400, nothing written. */
export class ImportFileError extends Error {}

/** Which column of the file feeds each reading field, and the units its header states. */
export type ResolvedColumns = {
  index: Record<ImportColumn, number | null>;
  names: Record<ImportColumn, string | null>;
  /** Unit of bare numbers in the frequency column, from its header ("Frequency (kHz)", "freq_mhz"). */
  frequencyUnit: FrequencyUnit | null;
  /** Unit of bare numbers in the value column of a phase run, from its header ("Time interval (ns)"); seconds when none. */
  intervalUnit: string | null;
  /** Seconds per unit of a numeric time column ("time (min)" → 60). */
  timeScale: number;
};

// First words of headers, per column. "Frequency (kHz)" → words [frequency], unit hint kHz.
const ALIASES: Record<ImportColumn, readonly string[]> = {
  time: ['time', 't', 'ts', 's', 'sec', 'secs', 'second', 'seconds', 'elapsed', 'timestamp', 'min', 'mins', 'minutes'],
  dial: ['dial', 'setting', 'settings', 'mark', 'div', 'division', 'divisions', 'scale'],
  // The value column: a frequency, or in a phase run the time interval ("Time interval (ns)", "Phase", "TIC").
  frequency: ['frequency', 'freq', 'f', 'counter', 'measured', 'reading', 'output', 'hz', 'khz', 'mhz', 'timeinterval', 'interval', 'phase', 'tic', 'x'],
  unit: ['unit', 'units'],
  aux: ['aux', 'supply', 'voltage', 'volts', 'v', 'key', 'keying', 'keystate'],
};
const FREQUENCY_UNITS: Record<string, FrequencyUnit> = { hz: 'Hz', khz: 'kHz', mhz: 'MHz' };
/** Units a time-interval column may state (parseTimeInterval reads them). */
const INTERVAL_UNITS = new Set(['s', 'ms', 'us', 'µs', 'ns', 'ps']);
const TIME_UNITS: Record<string, number> = {
  ms: 0.001,
  s: 1,
  sec: 1,
  secs: 1,
  second: 1,
  seconds: 1,
  min: 60,
  mins: 60,
  minute: 60,
  minutes: 60,
  h: 3600,
  hr: 3600,
  hours: 3600,
};

function headerWords(header: string): { words: string[]; hint: string | null } {
  const lower = header.trim().toLowerCase();
  const bracket = /[([]\s*([a-zµ]+)\s*[)\]]/.exec(lower);
  const words = lower
    .replace(/[([].*?[)\]]/g, ' ')
    .split(/[^a-z0-9µ]+/)
    .filter((w) => w !== '');
  return { words, hint: bracket?.[1] ?? null };
}

/** The column a header names, by its first word ("Dial setting" → dial), or null. */
export function columnForHeader(header: string): ImportColumn | null {
  const { words } = headerWords(header);
  const first = words[0];
  if (first === undefined) return null;
  // The whole header, then its first two words, then its first word: "Time interval (ns)" and "time_interval_s" are the value column, not time.
  for (const key of [words.join(''), words.slice(0, 2).join(''), first]) {
    for (const column of IMPORT_COLUMNS) if (ALIASES[column].includes(key)) return column;
  }
  return null;
}

/**
 * The delimiter of a file from its first line: tab, semicolon or comma, whichever occurs most
 * outside quotes (a .tsv name breaks a tie in favour of tab; comma otherwise).
 */
export function detectDelimiter(firstLine: string, fileName: string): Delimiter {
  const counts: Record<Delimiter, number> = { ',': 0, '\t': 0, ';': 0 };
  let quoted = false;
  for (const c of firstLine) {
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === ',' || c === '\t' || c === ';')) counts[c]++;
  }
  const preferTab = /\.(tsv|tab)$/i.test(fileName);
  const order: Delimiter[] = preferTab ? ['\t', ',', ';'] : [',', '\t', ';'];
  let best: Delimiter = order[0]!;
  for (const d of order) if (counts[d] > counts[best]) best = d;
  return best;
}

/** The line break of a file from its first one outside quotes: Windows (CRLF), Unix (LF) or old Mac (CR); LF when there is none. */
export function detectNewline(text: string): Newline {
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && c === '\r') return text[i + 1] === '\n' ? '\r\n' : '\r';
    else if (!quoted && c === '\n') return '\n';
  }
  return '\n';
}

/**
 * The index just after the last line break that ends a record — outside quotes, counting from the
 * start of `text`, which must itself be the start of a record — or −1 when there is none yet.
 */
export function lastRecordEnd(text: string, newline: Newline): number {
  const mark = newline.charCodeAt(0);
  const pair = newline.length === 2;
  let quoted = false;
  let last = -1;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 34) quoted = !quoted;
    else if (!quoted && c === mark && (!pair || text.charCodeAt(i + 1) === 10)) last = i + newline.length;
  }
  return last;
}

/** Parses the `mapping` parameter (JSON object of column → header name or 1-based column number). */
export function parseMapping(raw: string | undefined): ImportMapping | null {
  if (raw === undefined || raw.trim() === '') return null;
  let value: unknown;
  try {
    value = JSON.parse(raw);
  } catch {
    throw new ImportFileError('mapping must be JSON, e.g. {"time":"Elapsed","frequency":"Counter (kHz)"}');
  }
  if (value === null || typeof value !== 'object' || Array.isArray(value)) throw new ImportFileError('mapping must be a JSON object of column → header');
  const mapping: ImportMapping = {};
  for (const [key, target] of Object.entries(value as Record<string, unknown>)) {
    if (!(IMPORT_COLUMNS as readonly string[]).includes(key)) throw new ImportFileError(`mapping: "${key}" is not a column (use ${IMPORT_COLUMNS.join(', ')})`);
    if (target === null || target === '') continue;
    if (typeof target !== 'string' && !(typeof target === 'number' && Number.isInteger(target) && target >= 1)) {
      throw new ImportFileError(`mapping.${key} must be a header as written in the file, or a column number from 1`);
    }
    mapping[key as ImportColumn] = target;
  }
  return mapping;
}

/**
 * Decides which column feeds time, dial, frequency, unit and aux: from the mapping where it names
 * one, else from the header's words. Refuses a mapping to a header that is not there, two columns
 * claiming one field, and a file without a frequency column.
 */
export function resolveColumns(header: readonly string[], mapping: ImportMapping | null): ResolvedColumns {
  const names = header.map((h) => h.trim());
  const index: Record<ImportColumn, number | null> = { time: null, dial: null, frequency: null, unit: null, aux: null };
  const listed = () => names.map((n) => `"${n}"`).join(', ');
  for (const column of IMPORT_COLUMNS) {
    const target = mapping?.[column];
    if (target === undefined) continue;
    const found = typeof target === 'number' ? target - 1 : names.findIndex((n) => n.toLowerCase() === target.trim().toLowerCase());
    if (found < 0 || found >= names.length)
      throw new ImportFileError(
        `mapping.${column}: the file has no column ${typeof target === 'number' ? target : `"${target}"`} (its columns are ${listed()})`,
      );
    index[column] = found;
  }
  const claimed = new Set(Object.values(index).filter((i): i is number => i !== null));
  for (const column of IMPORT_COLUMNS) {
    if (index[column] !== null) continue;
    const matching = names.map((n, i) => (!claimed.has(i) && columnForHeader(n) === column ? i : -1)).filter((i) => i >= 0);
    if (matching.length > 1) {
      throw new ImportFileError(`the columns ${matching.map((i) => `"${names[i]}"`).join(' and ')} could both be ${column}: say which with a mapping`);
    }
    if (matching.length === 1) {
      index[column] = matching[0]!;
      claimed.add(matching[0]!);
    }
  }
  const used = Object.values(index).filter((i): i is number => i !== null);
  if (new Set(used).size !== used.length) throw new ImportFileError('the mapping uses one column for two fields');
  if (index.frequency === null) {
    throw new ImportFileError(
      `no frequency column: name one frequency, freq or counter (time interval or phase in a phase run), or give a mapping (the file's columns are ${listed()})`,
    );
  }
  const frequencyHeader = headerWords(names[index.frequency]!);
  const frequencyHint = frequencyHeader.hint ?? [...frequencyHeader.words].reverse().find((w) => w in FREQUENCY_UNITS) ?? null;
  let timeScale = 1;
  if (index.time !== null) {
    const timeHeader = headerWords(names[index.time]!);
    const unitWord = timeHeader.hint ?? (timeHeader.words.length > 1 ? timeHeader.words[timeHeader.words.length - 1]! : timeHeader.words[0]!);
    timeScale = TIME_UNITS[unitWord] ?? 1;
  }
  const columnNames = Object.fromEntries(IMPORT_COLUMNS.map((c) => [c, index[c] === null ? null : names[index[c]!]!])) as Record<ImportColumn, string | null>;
  const intervalHint = frequencyHeader.hint ?? [...frequencyHeader.words].reverse().find((w) => INTERVAL_UNITS.has(w)) ?? null;
  return {
    index,
    names: columnNames,
    frequencyUnit: frequencyHint ? (FREQUENCY_UNITS[frequencyHint] ?? null) : null,
    intervalUnit: intervalHint !== null && INTERVAL_UNITS.has(intervalHint) ? intervalHint : null,
    timeScale,
  };
}

/** Run kinds whose readings are a time series: each row needs its time. */
export function needsTime(kind: RunKind): boolean {
  return !CALIBRATION_RUN_KINDS.includes(kind);
}

export type ConvertedRow = { input: ReadingInput } | { column: ImportColumn; reason: string };

const ISO_TIME = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?$/i;
const CLOCK_TIME = /^(?:(\d+):)?(\d{1,2}):(\d{2}(?:[.,]\d+)?)$/;

function message(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/**
 * One data row → a reading for the write path, or the column and reason that refuse it.
 * Time: seconds (scaled by the header's unit), h:mm:ss since the start, or an ISO 8601 date and time
 * (UTC unless it names a zone) turned into seconds since the run started. Frequency: a number in the
 * row's unit column, the header's unit or Hz, or text with its own unit ("1735 kHz"). In a phase run the same
 * column is the time interval: seconds, or the row's, the header's or the text's own unit (s, ms, µs, ns, ps).
 */
export function convertRow(
  cells: readonly string[],
  columns: ResolvedColumns,
  run: { kind: RunKind; dataKind: RunDataKind; startedAtMs: number },
): ConvertedRow {
  const cell = (column: ImportColumn) => (columns.index[column] === null ? '' : (cells[columns.index[column]!] ?? '').trim());
  const input: ReadingInput = {};

  const timeText = cell('time');
  if (timeText === '') {
    if (needsTime(run.kind)) return { column: 'time', reason: `no time given (a ${run.kind} run needs the time of each reading)` };
    // The file does not say when: t = 0, not the seconds from the run's start to the upload (which
    // read as "30 h 26 min" for a file imported a day later). The readings table shows it as "—".
    input.t = 0;
  } else if (ISO_TIME.test(timeText)) {
    const zoned = /(Z|[+-]\d{2}:?\d{2})$/i.test(timeText) ? timeText : `${timeText.replace(' ', 'T')}Z`;
    const at = Date.parse(zoned.replace(' ', 'T'));
    if (!Number.isFinite(at)) return { column: 'time', reason: `'${timeText}' is not a date and time` };
    const seconds = (at - run.startedAtMs) / 1000;
    if (seconds < 0) return { column: 'time', reason: `${timeText} is before the run started (${new Date(run.startedAtMs).toISOString()})` };
    input.t = seconds;
  } else {
    const clock = CLOCK_TIME.exec(timeText);
    try {
      input.t = clock ? Number(clock[1] ?? 0) * 3600 + Number(clock[2]) * 60 + parseNumber(clock[3]!) : parseNumber(timeText) * columns.timeScale;
    } catch (error) {
      return { column: 'time', reason: message(error) };
    }
  }

  const dialText = cell('dial');
  if (dialText !== '') {
    try {
      input.dial = parseNumber(dialText);
    } catch (error) {
      return { column: 'dial', reason: message(error) };
    }
  }

  const unitText = cell('unit');
  const frequencyText = cell('frequency');
  if (run.dataKind === 'phase') {
    // A phase run's value column is a time interval: its own unit, the row's unit column, the header's, or seconds.
    const unitWord = unitText !== '' ? unitText : columns.intervalUnit;
    if (unitWord !== null && !INTERVAL_UNITS.has(unitWord.toLowerCase()) && unitWord !== 'µs') {
      return { column: 'unit', reason: `unknown unit '${unitWord}' for a time interval (use s, ms, µs, ns or ps)` };
    }
    if (frequencyText === '') return { column: 'frequency', reason: 'no time interval given' };
    try {
      input.timeInterval = parseTimeInterval(/[a-zA-Zµμ]$/.test(frequencyText) || unitWord === null ? frequencyText : `${frequencyText} ${unitWord}`);
    } catch (error) {
      return { column: 'frequency', reason: message(error) };
    }
  } else {
    let unit: FrequencyUnit | null = columns.frequencyUnit;
    if (unitText !== '') {
      unit = FREQUENCY_UNITS[unitText.toLowerCase()] ?? null;
      if (unit === null) return { column: 'unit', reason: `unknown unit '${unitText}' (use Hz, kHz or MHz)` };
    }
    if (frequencyText === '') return { column: 'frequency', reason: 'no frequency given' };
    try {
      input.frequency = parseFrequency(frequencyText, unit ?? 'Hz');
    } catch (error) {
      return { column: 'frequency', reason: message(error) };
    }
  }

  const auxText = cell('aux');
  if (auxText !== '') {
    try {
      input.aux = parseNumber(auxText);
    } catch (error) {
      return { column: 'aux', reason: message(error) };
    }
  }
  return { input };
}
