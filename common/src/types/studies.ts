import type { StabilityTableRow } from '../math/stability-table.js';
import type { DriftWindow } from '../math/drift-rate-windows.js';
import type { WarmupFit } from '../math/fit-warmup.js';
import type { KeyingShift } from '../math/keying-shift.js';
import type { StabilityPoint } from '../math/overlapping-adev.js';
import type { RunDataKind, RunKind } from './lab.js';
import type { ListQuery } from './list.js';

// ---- Comparison of studies (PRODUCT §5.5; POST /api/comparisons/compute) ----

export const COMPARABLE_RUN_KINDS = ['warmup', 'stability'] as const;
export type ComparableRunKind = (typeof COMPARABLE_RUN_KINDS)[number];
export const MIN_COMPARED_RUNS = 2;
export const MAX_COMPARED_RUNS = 6;
/** Averaging times (s) of the Allan deviations in the comparison table. */
export const COMPARISON_ADEV_TAUS = [1, 10, 100] as const;
/** Confidence of every interval in a comparison. */
export const COMPARISON_CONFIDENCE = 0.95;
/** Default settling band: settled when the fitted curve is within this many Hz of f∞. */
export const DEFAULT_COMPARISON_WITHIN_HZ = 5;
/** Default window for the settled drift rate, s (shortened when a run's settled part is under three windows). */
export const DEFAULT_COMPARISON_WINDOW_SECONDS = 600;

export const COMPARISON_QUANTITIES = ['tau', 'amplitude', 'fInf', 'settledDriftRate', 'settlingTime', 'adev1s', 'adev10s', 'adev100s'] as const;
export type ComparisonQuantity = (typeof COMPARISON_QUANTITIES)[number];

export type ComparisonOptions = {
  /** Settled when the fit is within this many Hz of f∞ (default 5). */
  withinHz?: number;
  /** Length of the windows the settled drift rate is averaged over, s (default 600, see the answer's `options`). */
  windowSeconds?: number;
};

/** POST /api/comparisons/compute. Labels default to "run <id>"; when given there is one per run. */
export type ComputeComparisonRequest = ComparisonOptions & { runIds: number[]; labels?: string[] };

/** One run's value of a quantity, as an estimate with its standard error and degrees of freedom. */
export type ComparisonEstimate = {
  value: number;
  /** Standard error, in the quantity's unit. */
  se: number;
  /** Degrees of freedom of se (fit: n − p; window mean: k − 1; Allan deviation: its edf). */
  df: number;
  /** 95 % interval of the value itself (Student t; χ² for an Allan deviation, so not symmetric). */
  low: number;
  high: number;
};

/** A run's quantity minus the first run's, with its 95 % Welch interval and the sentence that says it. */
export type ComparisonDifference = {
  difference: number;
  low: number;
  high: number;
  se: number;
  /** Welch–Satterthwaite degrees of freedom (not rounded; Infinity when both are exact). */
  df: number;
  /** Student-t quantile used. */
  t: number;
  confidence: number;
  /** e.g. "after: settled drift rate lower by 4.1 Hz/min (95 % interval 2.9 to 5.3 Hz/min lower)". */
  sentence: string;
};

/** One row of the comparison table: a quantity for every run, and each run's difference to the first. */
export type ComparisonRow = {
  quantity: ComparisonQuantity;
  /** Plain name, e.g. "settled drift rate". */
  name: string;
  /** Unit of value, se and difference: "s", "Hz", "Hz/min", or "" (Allan deviation is a ratio). */
  unit: string;
  /** How the value, its standard error and degrees of freedom are obtained. */
  method: string;
  /** Per run, in the order of `runs`; null where the run's data do not give it. */
  values: Array<ComparisonEstimate | null>;
  /** Per run; always null for the first run (the reference) and where either value is missing. */
  differences: Array<ComparisonDifference | null>;
  /** Per run: why its value or difference is missing, else null. */
  problems: Array<string | null>;
};

/** A curve aligned at power-on: t since the run started (s), frequency (Hz) and frequency − the run's reference (Hz). */
export type ComparisonCurve = { t: number[]; frequency: number[]; deviation: number[] };

export type ComparedRun = {
  runId: number;
  label: string;
  kind: ComparableRunKind;
  jobId: number;
  jobNumber: string;
  rangeId: number;
  rangeLabel: string;
  startedAt: string;
  endedAt: string | null;
  configuration: string | null;
  notes: string | null;
  supplyVoltage: number | null;
  readingCount: number;
  /** Included readings the comparison used. */
  usedCount: number;
  /** Warm-up fit f∞ + A·e^(−t/τ) on every included reading; null with fitProblem when it cannot be fitted. */
  fit: WarmupFit | null;
  fitProblem: string | null;
  /** What `deviation` is measured from: the fit's f∞, or the mean of the readings when there is no fit. */
  reference: { kind: 'f_inf' | 'mean'; hz: number };
  /** Included readings, LTTB-downsampled to at most 2,000 points. */
  points: ComparisonCurve;
  /** The fitted model at 200 evenly spaced times from power-on to the last reading; null without a fit. */
  fitted: ComparisonCurve | null;
  /** Start of the settled part (s): the settling time of the fit, or 0 without a fit. Null when the run never settles within its record. */
  settledFromSeconds: number | null;
  /** The windows of the settled part that the settled drift rate is the mean of. */
  driftWindows: DriftWindow[];
  /**
   * Overlapping Allan deviation of the settled part at octaves (95 % χ² intervals), for the log-log plot: over its
   * longest continuous segment when it has gaps (as the run's own analysis by default), `count` readings analysed,
   * `leftOut` beyond the gaps, from `fromSeconds` to `toSeconds`.
   */
  stability: {
    tau0: number;
    fromSeconds: number;
    toSeconds: number;
    count: number;
    leftOut: number;
    referenceHz: number;
    gapCount: number;
    irregular: boolean;
    adev: StabilityPoint[];
  } | null;
  stabilityProblem: string | null;
};

/** Supply sensitivity of one `supply_sensitivity` run (aux = supply voltage). */
export type SupplySensitivityEntry = {
  runId: number;
  jobNumber: string;
  rangeLabel: string;
  startedAt: string;
  configuration: string | null;
  hzPerVolt: number | null;
  seHzPerVolt: number | null;
  n: number;
  problem: string | null;
};

/** Keying shift of one `keying` run (aux 0 = key up, 1 = key down). */
export type KeyingEntry = {
  runId: number;
  jobNumber: string;
  rangeLabel: string;
  startedAt: string;
  configuration: string | null;
  shift: KeyingShift | null;
  problem: string | null;
};

/** GET /api/instruments/:id/sensitivity, and part of every comparison: the instrument's newest 10 of each kind. */
export type InstrumentSensitivity = {
  instrumentId: number;
  instrumentLabel: string;
  supplySensitivity: SupplySensitivityEntry[];
  keying: KeyingEntry[];
};

export type ComparisonResult = {
  instrumentId: number;
  instrumentLabel: string;
  kind: ComparableRunKind;
  /** The options used, defaults filled in (windowSeconds as actually used for every run). */
  options: Required<ComparisonOptions>;
  confidence: number;
  runs: ComparedRun[];
  rows: ComparisonRow[];
  sensitivity: InstrumentSensitivity;
};

/** A saved comparison (GET/POST/PATCH /api/comparisons). */
export type SavedComparison = {
  id: number;
  title: string;
  notes: string | null;
  instrumentId: number;
  instrumentLabel: string;
  kind: ComparableRunKind;
  runIds: number[];
  labels: string[];
  /** Saved options (null: the defaults). */
  withinHz: number | null;
  windowSeconds: number | null;
  createdById: number;
  createdByName: string;
  createdAt: string;
  updatedAt: string;
};
export type CreateComparisonRequest = ComparisonOptions & { title: string; notes?: string | null; runIds: number[]; labels?: string[] };
/** Options sent as null go back to the defaults. */
export type UpdateComparisonRequest = Partial<Omit<CreateComparisonRequest, 'withinHz' | 'windowSeconds'>> & {
  withinHz?: number | null;
  windowSeconds?: number | null;
};
/** Sort on title, createdAt (default -createdAt) or updatedAt; q searches title and notes. */
export type ListComparisonsQuery = ListQuery & { instrumentId?: number };

// ---- CSV / TSV import of readings (POST /api/runs/:id/imports) ----

export const IMPORT_MODES = ['all', 'valid'] as const;
export type ImportMode = (typeof IMPORT_MODES)[number];
/** The columns an import reads; `unit` holds Hz, kHz or MHz for a bare number in the frequency column; `aux` is supply volts or key state. */
export const IMPORT_COLUMNS = ['time', 'dial', 'frequency', 'unit', 'aux'] as const;
export type ImportColumn = (typeof IMPORT_COLUMNS)[number];
/** Which header (as written in the file) or 1-based column number feeds each column; given ones override the detection. */
export type ImportMapping = Partial<Record<ImportColumn, string | number>>;
/** The import's default size limit (KC_IMPORT_MAX_MB overrides it). */
export const DEFAULT_IMPORT_MAX_MB = 200;
/** At most this many refused rows are listed in a report (rejectedCount has them all). */
export const MAX_REPORTED_REJECTIONS = 10_000;

/** Query of POST /api/runs/:id/imports (`mapping` may also come as a multipart field). */
export type ImportQuery = {
  mode?: ImportMode;
  importId?: string;
  /** JSON: which header or 1-based column feeds each column ({@link ImportMapping}). */
  mapping?: string;
  /**
   * true: rows whose frequency lies outside the range's span by more than the margin are stored as
   * given (the person has checked them); otherwise they are refused like any other bad row.
   */
  confirmed?: boolean;
};

/** One refused row: line in the file (header = line 1), the column as named in the file, and why. */
export type ImportRejection = { line: number; column: string; reason: string };

/** The answer to an import (and the body of its 400 when mode=all and a row is bad). */
export type ImportReport = {
  importId: string;
  runId: number;
  mode: ImportMode;
  /** Readings written (0 when mode=all refused the file). */
  imported: number;
  rejected: ImportRejection[];
  /** Every refused row, also those beyond the listed MAX_REPORTED_REJECTIONS. */
  rejectedCount: number;
  /** Data rows read (not counting the header and blank lines). */
  rowCount: number;
  /** The header each column was read from (null: not in the file). */
  columns: Record<ImportColumn, string | null>;
  delimiter: ',' | '\t' | ';';
  /** mode=valid with refused rows: the list was appended to the run's notes. */
  notesAppended: boolean;
};

export type ImportPhase = 'receiving' | 'validating' | 'writing' | 'done' | 'failed';

/** GET /api/imports/:importId/progress: the server side of the progress bar. */
export type ImportProgress = {
  importId: string;
  runId: number;
  phase: ImportPhase;
  /** Size of the upload (Content-Length while receiving, then the file's size). */
  bytesTotal: number | null;
  /** Bytes received (phase receiving) or read by the current pass. */
  bytesDone: number;
  /** Data rows read by the current pass. */
  rowsDone: number;
  rowsRejected: number;
  imported: number;
  /** Whole import 0 … 1: receiving 0–0.1, validating 0.1–0.3 (mode all), writing up to 1. */
  fraction: number;
  /** Why it failed, when it did. */
  message: string | null;
  updatedAt: string;
};

// ---- Exports ----

/** Columns of GET /api/runs/:id/readings.csv, in order; a phase run's value column is `time_interval_s` instead of `frequency_hz`. */
export const READINGS_CSV_COLUMNS = ['seq', 't_s', 'dial', 'frequency_hz', 'aux', 'source', 'received_at', 'excluded', 'excluded_reason'] as const;
/** The readings CSV's columns for a run holding this kind of data. */
export function readingsCsvColumns(dataKind: RunDataKind): readonly string[] {
  return dataKind === 'phase' ? READINGS_CSV_COLUMNS.map((c) => (c === 'frequency_hz' ? 'time_interval_s' : c)) : READINGS_CSV_COLUMNS;
}
/** Columns of GET /api/jobs/:id/results.csv, in order: one line per calibration run and dial setting. */
export const RESULTS_CSV_COLUMNS = [
  'job',
  'run_id',
  'run_kind',
  'range',
  'dial',
  'dial_unit',
  'nominal_hz',
  'measured_mean_hz',
  'n',
  'sd_hz',
  'error_hz',
  'error_ppm',
  'error_percent',
  'tolerance_hz',
  'outlier',
  'note',
] as const;

// ---- Attachments (photos and documents on instruments and jobs) ----

export const ATTACHMENT_CONTENT_TYPES = ['image/jpeg', 'image/png', 'image/gif', 'image/webp', 'application/pdf', 'text/plain'] as const;
export type AttachmentContentType = (typeof ATTACHMENT_CONTENT_TYPES)[number];
export type AttachmentOwner = 'instrument' | 'job';
/** The attachments' default size limit (KC_ATTACHMENT_MAX_MB overrides it). */
export const DEFAULT_ATTACHMENT_MAX_MB = 15;

export type Attachment = {
  id: number;
  owner: AttachmentOwner;
  instrumentId: number | null;
  jobId: number | null;
  originalName: string;
  caption: string | null;
  /** Found from the bytes, never from the name or the declared type. */
  contentType: AttachmentContentType;
  sizeBytes: number;
  sha256: string;
  uploadedById: number;
  uploadedByName: string;
  createdAt: string;
  /** GET this (with the bearer token) for the bytes; add ?download=1 to save rather than show. */
  url: string;
};

/** Kinds of run a comparison's sensitivity block reads. */
export const SENSITIVITY_RUN_KINDS: readonly RunKind[] = ['supply_sensitivity', 'keying'];

// ---- The stability toolkit of a stability run (part of GET /api/runs/:id/analysis; issue 19) ----

/** The deviations the analysis of a stability run gives at each τ, in the order shown. */
export const STABILITY_DEVIATIONS = ['adev', 'mdev', 'hdev', 'tdev', 'totdev'] as const;
export type StabilityDeviation = (typeof STABILITY_DEVIATIONS)[number];
/** Plain names, as the page and the CSV say them. */
export const STABILITY_DEVIATION_NAMES: Readonly<Record<StabilityDeviation, string>> = {
  adev: 'Overlapping Allan deviation',
  mdev: 'Modified Allan deviation',
  hdev: 'Overlapping Hadamard deviation',
  tdev: 'Time deviation',
  totdev: 'Total deviation',
};
/** Short names for columns and legends. */
export const STABILITY_DEVIATION_SHORT: Readonly<Record<StabilityDeviation, string>> = {
  adev: 'ADEV',
  mdev: 'MDEV',
  hdev: 'HDEV',
  tdev: 'TDEV',
  totdev: 'TOTDEV',
};
/** Averaging factors when no list is given: powers of two, or 1-2-5 per decade. */
export const STABILITY_FACTOR_SPACINGS = ['octaves', 'decades'] as const;
export type StabilityFactorSpacing = (typeof STABILITY_FACTOR_SPACINGS)[number];
/** kept: the readings as they are; removed: the least-squares frequency drift taken off first. */
export const STABILITY_DRIFT_CHOICES = ['kept', 'removed'] as const;
export type StabilityDriftChoice = (typeof STABILITY_DRIFT_CHOICES)[number];
/**
 * longest: the longest stretch without a gap (default); continuous: every reading, as if there were no gap (flagged;
 * refused for phase data, whose phase jumps across a gap); fill: phase data only, each gap bridged by a straight line
 * in phase, the number of points filled stated.
 */
export const STABILITY_GAP_CHOICES = ['longest', 'continuous', 'fill'] as const;
export type StabilityGapChoice = (typeof STABILITY_GAP_CHOICES)[number];
/** Confidence of every interval of the stability toolkit. */
export const STABILITY_CONFIDENCE = 0.95;
/** At most this many averaging factors in one `m` list. */
export const MAX_STABILITY_FACTORS = 40;
/** At most this many MAD-flagged readings are listed (flaggedCount has them all). */
export const MAX_LISTED_OUTLIERS = 200;
/** Columns of the deviation table's CSV, in order (one line per τ and deviation). */
export const DEVIATION_CSV_COLUMNS = [
  'tau_s',
  'm',
  'deviation',
  'value',
  'terms',
  'edf',
  'ci95_low',
  'ci95_high',
  'noise',
  'noise_method',
  'edf_noise',
  'data',
] as const;

/** Query of the analysis that applies to stability runs. */
export type StabilityAnalysisQuery = {
  /** Averaging factors, comma-separated positive whole numbers ("1,10,100"); overrides `factors`. */
  m?: string;
  /** Octaves (default) or decades, when no `m` is given. */
  factors?: StabilityFactorSpacing;
  /** Analyse with the linear frequency drift removed (default kept). */
  drift?: StabilityDriftChoice;
  /** What to do with reported gaps (default longest). */
  gaps?: StabilityGapChoice;
};

/** The readings the deviations were computed from. */
export type StabilitySegment = {
  choice: StabilityGapChoice;
  /** Readings analysed. */
  count: number;
  /** Included readings left out because they lie beyond a gap (0 with choice 'continuous'). */
  leftOut: number;
  /** Time of the first and last analysed reading, s. */
  fromSeconds: number;
  toSeconds: number;
  /** Gaps reported in the whole record; with 'continuous' the deviations run across them. */
  gapCount: number;
  /** Phase points filled by straight-line interpolation (choice 'fill'); 0 otherwise. */
  filled: number;
  /** One sentence saying what was analysed, e.g. "the longest continuous segment: 690 of 1,000 readings, 310 s to 999 s". */
  statement: string;
};

/** Linear frequency drift of the analysed readings: least squares on frequency (NIST SP 1065). */
export type StabilityDrift = {
  method: 'linear_frequency';
  /** Fractional frequency drift per second, and its standard error (null with no residual scatter to judge by). */
  perSecond: number;
  standardError: number | null;
  /** Readings the line was fitted to, and their span, s. */
  points: number;
  fromSeconds: number;
  toSeconds: number;
  /** The fit's window spans a reported gap (the times are taken as i·τ0, so the rate is then doubtful). */
  spansGap: boolean;
  /** Whether the deviations were computed from the residuals of this line. */
  removed: boolean;
  /**
   * The two phase-data estimates of SP 1065 beside the line, from the same readings (for frequency data from the
   * phase x = Σ y·τ0): the three-point fit (no standard error) and the bisection estimate. Null under 3 phase points.
   */
  phaseEstimates: { threePoint: { perSecond: number }; bisection: { perSecond: number } } | null;
};

/** One reading the median-absolute-deviation screen flags (never excluded by it: the engineer decides). */
/** `frequency` is the reading's value as stored (Hz; in a phase run the time interval, s, of the reading that ends the flagged interval). */
export type FlaggedReading = { readingId: number; seq: number; t: number; frequency: number };

export type StabilityOutlierScreen = {
  /** Multiple of the scaled MAD (1.4826·MAD) beyond which a reading is flagged. */
  k: number;
  /** Readings screened: the analysed ones (after drift removal when asked). */
  screened: number;
  /** Median of the screened fractional frequencies, and the distance from it beyond which a reading is flagged (k·1.4826·MAD). */
  median: number;
  threshold: number;
  flaggedCount: number;
  /** At most MAX_LISTED_OUTLIERS, in time order. */
  flagged: FlaggedReading[];
};

/** Everything the stability toolkit adds to a stability run's analysis. */
export type StabilityToolkit = {
  /** What kind of data the run holds, and so what the deviations were computed from. */
  dataKind: RunDataKind;
  /** One sentence saying how the data were turned into what each deviation needs (SP 1065's conversions). */
  conversion: string;
  confidence: number;
  /** The averaging factors: a spacing, or the list asked for with `m`. */
  factors: { spacing: StabilityFactorSpacing | 'list'; list: number[] };
  segment: StabilitySegment;
  /** Null when fewer than 3 readings are analysed. */
  drift: StabilityDrift | null;
  /** Deviations at each τ: ADEV, MDEV, HDEV, TDEV (s), TOTDEV, with terms, edf, 95 % interval and the noise named. */
  deviations: StabilityTableRow[];
  outliers: StabilityOutlierScreen | null;
};
