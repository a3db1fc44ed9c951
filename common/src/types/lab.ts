import type { DialLaw } from '../math/dial-law.js';
import type { Tolerance } from '../math/tolerance.js';
import type { FrequencyUnit } from '../units/frequency-unit.js';

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
};
export type CreateStandardRequest = Omit<ReferenceStandard, 'id' | 'active' | 'overdue'>;
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
export const RUN_STATUSES = ['open', 'closed'] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

export type Run = {
  id: number;
  jobId: number;
  jobNumber: string;
  instrumentId: number;
  rangeId: number;
  rangeLabel: string;
  kind: RunKind;
  status: RunStatus;
  benchId: number | null;
  standardId: number | null;
  standardName: string | null;
  standardOverrideReason: string | null;
  supplyVoltage: number | null;
  configuration: string | null;
  notes: string | null;
  startedAt: string;
  endedAt: string | null;
  createdById: number;
  readingCount: number;
  lastSeq: number;
};
export type CreateRunRequest = {
  rangeId: number;
  kind: RunKind;
  benchId?: number | null;
  standardId?: number | null;
  /** Required when the standard is past its due date (lead only); kept in the audit log. */
  standardOverrideReason?: string;
  supplyVoltage?: number | null;
  configuration?: string | null;
  notes?: string | null;
};
export type UpdateRunRequest = { status?: 'closed'; supplyVoltage?: number | null; configuration?: string | null; notes?: string | null };

export const READING_SOURCES = ['bridge', 'manual', 'import'] as const;
export type ReadingSource = (typeof READING_SOURCES)[number];

export type Reading = {
  id: number;
  seq: number;
  /** Seconds since the run started (power-on for warm-up studies). */
  t: number;
  dial: number | null;
  frequency: number;
  /** Supply voltage or key state for sensitivity and keying runs, else null. */
  aux: number | null;
  source: ReadingSource;
  receivedAt: string;
  excluded: boolean;
  excludedReason: string | null;
};

/** One reading as sent by the bench page, an import or the bridge. Frequency in Hz, or as typed ("1.735 MHz"). */
export type ReadingInput = { seq?: number; dial?: number | string | null; frequency: number | string; t?: number; aux?: number | null };
export type AppendReadingsRequest = { readings: ReadingInput[] };

/** The acknowledgement of a batch (REST and the bench socket alike). */
export type IngestAck = {
  accepted: number;
  duplicates: number;
  rejected: Array<{ seq: number | null; index: number; field: string; reason: string }>;
  lastSeq: number;
};

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
