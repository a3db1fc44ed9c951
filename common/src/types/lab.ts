import type { AlignLCResult } from '../math/align-lc.js';
import type { CalibrationFit, CalibrationPoint, TrackingSummary } from '../math/analyse-calibration.js';
import type { GapReport } from '../math/detect-gaps.js';
import type { DialLaw } from '../math/dial-law.js';
import type { RunBridge } from './captures.js';
import type { DriftWindow } from '../math/drift-rate-windows.js';
import type { WarmupFit } from '../math/fit-warmup.js';
import type { WarmupSettling } from '../math/warmup-settling.js';
import type { KeyingShift } from '../math/keying-shift.js';
import type { StabilityPoint } from '../math/overlapping-adev.js';
import type { AmateurBand, ItuRegion } from '../math/amateur-bands.js';
import type { BandPlanRow } from '../math/plan-bands.js';
import type { Tolerance } from '../math/tolerance.js';
import type { WarmupSummary } from '../math/warmup-summary.js';
import type { FrequencyUnit } from '../units/frequency-unit.js';
import type { CertificateRelease } from './billing.js';
import type { ListQuery } from './list.js';
import type { StabilityAnalysisQuery, StabilityToolkit } from './studies.js';

export type { DialLaw, Tolerance, FrequencyUnit };

/** A dial marked in a frequency unit, or in plain divisions (then its law is a table). */
export type DialUnit = FrequencyUnit | 'div';
export const DIAL_UNITS: readonly DialUnit[] = ['Hz', 'kHz', 'MHz', 'div'];

export type InstrumentRange = {
  id: number;
  position: number;
  label: string;
  dialUnit: DialUnit;
  dialLaw: DialLaw;
  dialMin: number;
  dialMax: number;
  freqMinHz: number;
  freqMaxHz: number;
  tolerance: Tolerance;
  multipliers: number[];
};

export type RangeInput = Omit<InstrumentRange, 'id' | 'position'> & { id?: number };

/** What a bench or a capture needs to know of a range: its label, dial and frequency span. */
export type RangeSpan = Pick<InstrumentRange, 'label' | 'dialUnit' | 'dialMin' | 'dialMax' | 'freqMinHz' | 'freqMaxHz'>;

export type Instrument = {
  id: number;
  organizationId: number;
  organizationName: string;
  make: string;
  model: string;
  serial: string;
  assetTag: string | null;
  description: string | null;
  recallIntervalMonths: number;
  nextDueDate: string | null;
  ranges: InstrumentRange[];
  createdAt: string;
};

export type CreateInstrumentRequest = {
  organizationId: number;
  make: string;
  model: string;
  serial: string;
  assetTag?: string | null;
  description?: string | null;
  recallIntervalMonths?: number;
  nextDueDate?: string | null;
  ranges?: RangeInput[];
};
export type UpdateInstrumentRequest = Partial<Omit<CreateInstrumentRequest, 'organizationId'>>;

export const STANDARD_KINDS = ['counter', 'reference'] as const;
export type StandardKind = (typeof STANDARD_KINDS)[number];

export type ReferenceStandard = {
  id: number;
  name: string;
  kind: StandardKind;
  makeModel: string;
  serial: string;
  certificateNumber: string;
  dueDate: string;
  /** Time-base accuracy, ± ppm (half-width of a rectangular distribution). */
  timebaseAccuracyPpm: number;
  /** Resolution: one count, in Hz, at the gate time the lab uses. */
  resolutionHz: number;
  /** Expanded uncertainty of the standard's own calibration, relative (ppm), and its coverage factor. */
  calibrationUPpm: number;
  calibrationK: number;
  active: boolean;
  /** Derived: the due date has passed. */
  overdue: boolean;
  /** 1 when created; every edit makes the next version (jobs signed earlier keep the one they used). */
  version: number;
};
export type CreateStandardRequest = Omit<ReferenceStandard, 'id' | 'active' | 'overdue' | 'version'>;
export type UpdateStandardRequest = Partial<CreateStandardRequest> & { active?: boolean };

export type Bench = {
  id: number;
  name: string;
  location: string | null;
  defaultStandardId: number | null;
  defaultStandardName: string | null;
  hasToken: boolean;
  tokenIssuedAt: string | null;
  active: boolean;
};
export type CreateBenchRequest = { name: string; location?: string | null; defaultStandardId?: number | null };
export type UpdateBenchRequest = Partial<CreateBenchRequest> & { active?: boolean };
/** Shown once, when an admin issues a bench token. */
export type BenchTokenResponse = { benchId: number; token: string };

export const JOB_STATUSES = ['received', 'in_progress', 'in_review', 'returned', 'approved', 'issued'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export type Job = {
  id: number;
  number: string;
  instrumentId: number;
  instrumentLabel: string;
  organizationId: number;
  organizationName: string;
  status: JobStatus;
  receivedDate: string;
  conditionReceived: string | null;
  technicianId: number | null;
  technicianName: string | null;
  ambientTempC: number | null;
  humidityPct: number | null;
  notes: string | null;
  createdAt: string;
  updatedAt: string;
  runCount: number;
  /** The lead's comment when the job was last returned for rework (null unless status is returned). */
  returnComment: string | null;
  /** For a client, once the job's certificate is issued: whether its PDF may be downloaded now, and if not why. */
  release?: CertificateRelease;
};
export type CreateJobRequest = {
  instrumentId: number;
  receivedDate: string;
  conditionReceived?: string | null;
  technicianId?: number | null;
  ambientTempC?: number | null;
  humidityPct?: number | null;
  notes?: string | null;
};
export type UpdateJobRequest = Partial<Omit<CreateJobRequest, 'instrumentId'>> & { status?: JobStatus; comment?: string };

export const RUN_KINDS = ['as_found', 'as_left', 'warmup', 'stability', 'supply_sensitivity', 'keying'] as const;
export type RunKind = (typeof RUN_KINDS)[number];
export const CALIBRATION_RUN_KINDS: readonly RunKind[] = ['as_found', 'as_left'];
/**
 * What a run's readings hold: frequency in Hz (every kind), or phase — the time interval in seconds measured
 * by a time-interval counter against a reference (stability runs only). A run holds one kind, named when it
 * is opened; a reading of the other kind is refused (a mixed run).
 */
export const RUN_DATA_KINDS = ['frequency', 'phase'] as const;
export type RunDataKind = (typeof RUN_DATA_KINDS)[number];
/** How the page and the CSV name each kind's value. */
export const RUN_DATA_KIND_NAMES: Readonly<Record<RunDataKind, { value: string; unit: string; field: 'frequency' | 'timeInterval' }>> = {
  frequency: { value: 'Frequency', unit: 'Hz', field: 'frequency' },
  phase: { value: 'Time interval', unit: 's', field: 'timeInterval' },
};
/** A phase reading's time interval may be at most this many seconds either side of zero. */
export const MAX_TIME_INTERVAL_S = 1e4;
export const RUN_STATUSES = ['open', 'closed'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

export type Run = {
  id: number;
  jobId: number;
  jobNumber: string;
  jobStatus: JobStatus;
  organizationId: number;
  instrumentId: number;
  instrumentLabel: string;
  rangeId: number;
  rangeLabel: string;
  kind: RunKind;
  /** What its readings hold: frequency (Hz) or phase (time interval, s; stability runs only). */
  dataKind: RunDataKind;
  status: RunStatus;
  benchId: number | null;
  benchName: string | null;
  standardId: number | null;
  standardName: string | null;
  standardOverrideReason: string | null;
  supplyVoltage: number | null;
  configuration: string | null;
  notes: string | null;
  startedAt: string;
  endedAt: string | null;
  createdById: number;
  createdByName: string;
  readingCount: number;
  excludedCount: number;
  lastSeq: number;
  /** Why the run takes no readings now (closed, job in review…), null when it does. */
  refusal: string | null;
  /** Whether a bench bridge feeds the run now (types/captures.ts). */
  bridge: RunBridge;
};
export type CreateRunRequest = {
  rangeId: number;
  kind: RunKind;
  /** Default 'frequency'; 'phase' for a stability run fed by a time-interval counter. */
  dataKind?: RunDataKind;
  benchId?: number | null;
  standardId?: number | null;
  /** Required when the standard is past its due date (lead only); kept in the audit log. */
  standardOverrideReason?: string;
  supplyVoltage?: number | null;
  configuration?: string | null;
  notes?: string | null;
};
/**
 * PATCH /api/runs/:id. `status: 'closed'` closes the run. The run's details (standard, supply voltage,
 * configuration, notes) are corrected while the job is open (received, in progress or returned), each
 * correction with a `reason` kept in the audit trail with the values from and to.
 */
export type UpdateRunRequest = {
  status?: 'closed';
  standardId?: number | null;
  /** Required when the new standard is past its due date (lead only); kept in the audit log. */
  standardOverrideReason?: string;
  supplyVoltage?: number | null;
  configuration?: string | null;
  notes?: string | null;
  /** Why the details are corrected; required whenever one of them changes. */
  reason?: string;
};
/** The run details a correction may change. */
export const RUN_CORRECTABLE_FIELDS = ['standardId', 'supplyVoltage', 'configuration', 'notes'] as const;

export const READING_SOURCES = ['bridge', 'manual', 'import'] as const;
export type ReadingSource = (typeof READING_SOURCES)[number];

/**
 * Who or what entered a reading: a person (typed at the bench page or imported from a file) or a
 * bench (streamed by its bridge). Null for readings stored before authors were kept.
 */
export type ReadingAuthor = { kind: 'user' | 'bench'; id: number; name: string };

export type Reading = {
  id: number;
  seq: number;
  /** Seconds since the run started (power-on for warm-up studies). */
  t: number;
  dial: number | null;
  /** The reading's value: frequency in Hz, or in a phase run (Run.dataKind 'phase') the time interval in seconds. */
  frequency: number;
  /** Supply voltage or key state for sensitivity and keying runs, else null. */
  aux: number | null;
  source: ReadingSource;
  receivedAt: string;
  excluded: boolean;
  excludedReason: string | null;
  /** Who or what entered it (the source says how). */
  author: ReadingAuthor | null;
};

/** One reading as sent by the bench page, an import or the bridge. Frequency in Hz, or as typed ("1.735 MHz"). */
export type ReadingInput = {
  seq?: number;
  dial?: number | string | null;
  /** A frequency run's reading (required there; refused in a phase run). */
  frequency?: number | string;
  /** A phase run's reading: the time interval in seconds, as a number or text ("12.5e-9", "12.5 ns"); refused in a frequency run. */
  timeInterval?: number | string;
  t?: number;
  aux?: number | null;
  /**
   * The person has seen that the frequency lies outside the range's span (by more than the margin of
   * `spanLimits` in common/units) and stores it as given. Honoured for readings typed through the API;
   * a bench (the bridge) has no one to confirm, so its readings outside the span are always refused.
   */
  confirmed?: boolean;
};
export type AppendReadingsRequest = { readings: ReadingInput[] };

/** The acknowledgement of a batch (REST and the bench socket alike). */
export type IngestAck = {
  accepted: number;
  duplicates: number;
  /** `confirmable`: refused only for lying outside the range's span; sent again with `confirmed: true` it is stored. */
  rejected: Array<{ seq: number | null; index: number; field: string; reason: string; confirmable?: boolean }>;
  lastSeq: number;
};

/** The answer to POST /api/runs/:id/readings: the acknowledgement, plus the readings as stored (with their ids). */
export type AppendReadingsResponse = IngestAck & { stored: Reading[] };

export type ExcludeReadingRequest = { reason: string };

export type AuditEventView = {
  id: number;
  actorId: number | null;
  actorName: string | null;
  at: string;
  entity: string;
  entityId: string;
  action: string;
  changes: Record<string, unknown> | null;
};

// ---- List filters (query parameters on top of ListQuery) ----

export type ListInstrumentsQuery = ListQuery & {
  organizationId?: number;
  /** Next due date on or before this date (YYYY-MM-DD). */
  dueBefore?: string;
  /** Next due date already past. */
  overdue?: boolean;
};
export type ListStandardsQuery = ListQuery & { kind?: StandardKind; active?: boolean; overdue?: boolean; dueBefore?: string };
export type ListJobsQuery = ListQuery & {
  organizationId?: number;
  instrumentId?: number;
  technicianId?: number;
  /** One status, or several separated by commas ("in_progress,returned"). */
  status?: string;
};
export type ListRunsQuery = ListQuery & {
  organizationId?: number;
  instrumentId?: number;
  jobId?: number;
  rangeId?: number;
  benchId?: number;
  kind?: RunKind;
  status?: RunStatus;
};
/** Readings of one run; sort on seq (default), t, dial or frequency. */
export type ListReadingsQuery = Omit<ListQuery, 'q'> & { excluded?: boolean };
/** entity + entityId for one record's history; jobId for a job with its runs and reading exclusions. */
export type ListAuditQuery = ListQuery & { entity?: string; entityId?: string; jobId?: number; action?: string };

// ---- Analysis of a run (GET /api/runs/:id/analysis) ----

/** Query parameters of the analysis; each applies to the run kinds named. */
export type RunAnalysisQuery = {
  /** calibration: low-end tuning capacitance (pF), to give the alignment move in pF. */
  tuningCapLowPf?: number;
  /** warmup: settled when within this many Hz of f∞ (default 5). */
  withinHz?: number;
  /** warmup: settled when drifting slower than this (Hz/min, default 1). */
  rateHzPerMin?: number;
  /** warmup: length of the drift-rate windows, s (default 600). */
  windowSeconds?: number;
  /** warmup: add a linear term c·t to the model (default false). */
  linear?: boolean;
  /** stability: reference frequency for y = (f − f_ref)/f_ref (default the mean of the readings). */
  referenceHz?: number;
} & StabilityAnalysisQuery;

/** Counts every analysis carries: what it was computed from. */
export type AnalysisBasis = {
  runId: number;
  runKind: RunKind;
  readingCount: number;
  excludedCount: number;
  /** Readings the computation used (included ones). */
  usedCount: number;
};

/** An analysis that was worked out from the run's readings. */
export type ReadyAnalysisBasis = AnalysisBasis & { state: 'ready' };

/**
 * A run with no included reading yet (none recorded, or every one excluded): nothing to compute, which is a
 * state of the run and not an error. Every run kind answers this way; readingCount and excludedCount say which.
 */
export type EmptyRunAnalysis = AnalysisBasis & { state: 'empty'; analysis: 'none' };

/** A time series for a chart, LTTB-downsampled on the server to at most MAX_SERIES_POINTS points. */
export type AnalysisSeries = { t: number[]; frequency: number[] };
export const MAX_SERIES_POINTS = 2000;

export type AlignmentEnd = { dial: number; target: number; measured: number };
export type RunAlignment = AlignLCResult & { low: AlignmentEnd; high: AlignmentEnd; mid: AlignmentEnd | null };

export type CalibrationRunAnalysis = ReadyAnalysisBasis & {
  analysis: 'calibration';
  range: Pick<InstrumentRange, 'id' | 'label' | 'dialUnit' | 'dialMin' | 'dialMax' | 'freqMinHz' | 'freqMaxHz' | 'tolerance'>;
  points: CalibrationPoint[];
  fit: CalibrationFit | null;
  tracking: { bestFit: TrackingSummary; endPoint: TrackingSummary } | null;
  corrections: Array<{ dial: number; nominal: number; measured: number; correctionHz: number }>;
  /** Settings whose studentised residual exceeds the limit (flagged, never removed). */
  outliers: Array<{ dial: number; studentised: number }>;
  /** The LC alignment from the two range ends; null (with alignmentNote) when the run does not cover both ends. */
  alignment: RunAlignment | null;
  alignmentNote: string | null;
};

export type WarmupRunAnalysis = ReadyAnalysisBasis & {
  analysis: 'warmup';
  fit: WarmupFit;
  summary: WarmupSummary;
  /** Both settling times, each marked when it lies beyond the last reading (an extrapolation of the fit). */
  settling: WarmupSettling;
  drift: { windowSeconds: number; windows: DriftWindow[] };
  /** Readings (downsampled) and the fitted curve at the same times. */
  series: AnalysisSeries & { fitted: number[] };
};

export type StabilityRunAnalysis = ReadyAnalysisBasis & {
  analysis: 'stability';
  /** Basic interval τ0 (s): the median spacing of the readings. */
  tau0: number;
  /** The frequency the fractional frequency is taken against; null for a phase run (its readings are already time error). */
  referenceHz: number | null;
  adev: StabilityPoint[];
  mdev: StabilityPoint[];
  gaps: GapReport;
  series: AnalysisSeries;
  /** The deviations at each τ with noise, edf and intervals, the drift, the segment analysed and the MAD screen. */
  toolkit: StabilityToolkit;
};

export type SupplySensitivityRunAnalysis = ReadyAnalysisBasis & {
  analysis: 'supply_sensitivity';
  sensitivity: { hzPerVolt: number; seHzPerVolt: number; n: number };
  series: AnalysisSeries;
};

export type KeyingRunAnalysis = ReadyAnalysisBasis & {
  analysis: 'keying';
  shift: KeyingShift;
  series: AnalysisSeries;
};

export type RunAnalysis =
  CalibrationRunAnalysis | WarmupRunAnalysis | StabilityRunAnalysis | SupplySensitivityRunAnalysis | KeyingRunAnalysis | EmptyRunAnalysis;

// ---- Band planner (GET /api/instruments/:id/band-plan?region=2&wantedHz=…) ----

export type BandPlanQuery = { region?: ItuRegion; wantedHz?: number };
export type BandPlanSetting = {
  rangeId: number;
  rangeLabel: string;
  multiplier: number;
  /** wantedHz / multiplier: what the range itself must produce. */
  fundamentalHz: number;
  /** Dial setting from the dial law alone. */
  nominalDial: number;
  /** Dial setting from the latest calibration run's measured points, null when there is none covering it. */
  correctedDial: number | null;
  correctionRunId: number | null;
};
export type BandPlanResponse = {
  instrumentId: number;
  region: ItuRegion;
  /** The region's band table the rows were planned against, with each band's status and note. */
  bands: AmateurBand[];
  /** Where the band edges come from (AMATEUR_BANDS_SOURCE). */
  source: string;
  /** Said beside the bands: national allocations differ (NATIONAL_RULES_NOTE). */
  nationalNote: string;
  rows: Array<BandPlanRow & { rangeId: number }>;
  /** Present when wantedHz was given: every range × multiplier that reaches it. */
  wanted: { outputHz: number; settings: BandPlanSetting[] } | null;
};
