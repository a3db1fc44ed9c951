import type { CalibrationFit, TrackingSummary } from '../math/analyse-calibration.js';
import type { Decision, DecisionRule } from '../math/decide.js';
import type { CaptureSettings } from './captures.js';
import type { DialUnit, InstrumentRange, JobStatus, RunKind, Tolerance } from './lab.js';
import type { CertificateRelease } from './billing.js';
import type { ListQuery } from './list.js';

export type { Decision, DecisionRule };
export const DECISION_RULES: readonly DecisionRule[] = ['simple', 'guarded_binary', 'guarded'];

// ---- Procedures and budgets ----

export const COMPONENT_DISTRIBUTIONS = ['normal', 'rectangular', 'triangular', 'u_shaped'] as const;
export type ComponentDistribution = (typeof COMPONENT_DISTRIBUTIONS)[number];

/**
 * An extra budget line a procedure (or a run) adds to the standard six: e.g. "coupling and cabling".
 * value is a half-width (rectangular, triangular, U-shaped) or, for normal, a quoted expanded U with
 * its k as divisor (divisor 1: value is already a standard uncertainty); in Hz, or ppm of the nominal.
 */
export type ExtraComponent = {
  name: string;
  distribution: ComponentDistribution;
  value: number;
  unit: 'Hz' | 'ppm';
  /** Only for normal: the coverage factor the value is quoted at (default 1). */
  divisor?: number;
  /** Degrees of freedom, null or absent = infinite. */
  dof?: number | null;
};

/** The budget figures a procedure sets as defaults; a run may override each one. */
export type BudgetDefaults = {
  /** Half a dial division (the reading resolution) as a percentage of the range's dial span. */
  dialHalfDivisionPercentOfSpan: number;
  /** Drift allowance during the measurement: ± ppm of the nominal (rectangular half-width) … */
  driftPpm: number;
  /** … plus ± Hz. */
  driftHz: number;
  extraComponents: ExtraComponent[];
};

export type Procedure = BudgetDefaults & {
  id: number;
  name: string;
  /** Method text printed on the certificate (identification of the method, ISO/IEC 17025 7.8.2.1 f). */
  method: string;
  decisionRule: DecisionRule;
  /** The procedure a job uses when none is chosen. Exactly one procedure is the default. */
  isDefault: boolean;
  active: boolean;
  updatedAt: string;
  /** 1 when created; every edit makes the next version (jobs signed earlier keep the one they used). */
  version: number;
} & CaptureSettings;
/** The counter-assisted capture settings may be left out: CAPTURE_DEFAULTS then apply. */
export type CreateProcedureRequest = Omit<Procedure, 'id' | 'active' | 'updatedAt' | 'isDefault' | 'version' | keyof CaptureSettings> & {
  isDefault?: boolean;
} & Partial<CaptureSettings>;
export type UpdateProcedureRequest = Partial<CreateProcedureRequest> & { active?: boolean };
export type ListProceduresQuery = ListQuery & { active?: boolean };

/** Per-run overrides; null (or absent) keeps the procedure's figure or the standard's. */
export type RunBudgetOverrides = {
  /** Half a dial division in the dial's own unit (kHz, MHz or divisions). */
  dialHalfDivision: number | null;
  driftPpm: number | null;
  driftHz: number | null;
  /** ± one count at the gate time actually used, Hz (replaces the standard's resolution). */
  counterResolutionHz: number | null;
  /** Replaces the procedure's extra components when not null. */
  extraComponents: ExtraComponent[] | null;
  note: string | null;
};
export type RunBudget = RunBudgetOverrides & {
  runId: number;
  /** The figures that apply after the overrides (what the results are computed from). */
  effective: {
    procedureId: number;
    procedureName: string;
    dialHalfDivision: number;
    driftPpm: number;
    driftHz: number;
    counterResolutionHz: number | null;
    extraComponents: ExtraComponent[];
  };
  updatedAt: string | null;
  updatedByName: string | null;
  /** False once the job is signed: PUT then answers 409. */
  editable: boolean;
};
export type UpdateRunBudgetRequest = Partial<RunBudgetOverrides>;
export type SetJobProcedureRequest = { procedureId: number };

// ---- Results (GET /api/jobs/:id/results) ----

export type BudgetLine = {
  name: string;
  kind: 'A' | 'B';
  distribution: ComponentDistribution;
  /** Half-width (or quoted U, or standard uncertainty with divisor 1), in `unit`. */
  value: number;
  unit: string;
  divisor: number;
  /** Sensitivity coefficient, Hz per `unit`. */
  sensitivity: number;
  /** value / divisor, in `unit`. */
  standardUncertainty: number;
  /** |sensitivity| × standard uncertainty, Hz. */
  contributionHz: number;
  /** null = infinite. */
  dof: number | null;
};

export type PointBudget = {
  lines: BudgetLine[];
  /** Combined standard uncertainty u_c, Hz. */
  ucHz: number;
  /** Welch–Satterthwaite ν_eff; null = infinite. */
  nuEff: number | null;
  k: number;
  /** Expanded uncertainty, two significant digits, Hz. */
  U: number;
  Uunrounded: number;
  coverage: number;
  notes: string[];
};

/** One setting as measured in one run (as found or as left). */
export type MeasuredPoint = {
  runId: number;
  /** Mean of the included readings, Hz. */
  measured: number;
  n: number;
  sd: number | null;
  errorHz: number;
  errorPpm: number;
  /** Error rounded to the last digit of U (GUM 7.2.6) and the decimals to print it with. */
  errorRounded: number;
  decimals: number;
  outlier: boolean;
  studentised: number | null;
  budget: PointBudget | null;
  decision: Decision | null;
  /** Tolerance / U. */
  tur: number | null;
  turFlag: boolean;
  guardBandHz: number | null;
  acceptanceLimitHz: number | null;
  /** Why there is no budget or decision (no standard, a bad figure…), else null. */
  problem: string | null;
};

export type PointResult = {
  dial: number;
  nominal: number;
  toleranceHz: number;
  asFound: MeasuredPoint | null;
  asLeft: MeasuredPoint | null;
};

export type RunFitSummary = {
  runId: number;
  fit: CalibrationFit | null;
  tracking: { bestFit: TrackingSummary; endPoint: TrackingSummary } | null;
};

export type StandardReference = {
  id: number;
  name: string;
  makeModel: string;
  serial: string;
  certificateNumber: string;
  dueDate: string;
  timebaseAccuracyPpm: number;
  resolutionHz: number;
  calibrationUPpm: number;
  calibrationK: number;
};

export type RangeResult = {
  rangeId: number;
  position: number;
  label: string;
  dialUnit: DialUnit;
  dialMin: number;
  dialMax: number;
  freqMinHz: number;
  freqMaxHz: number;
  tolerance: Tolerance;
  asFoundRunId: number | null;
  asLeftRunId: number | null;
  asFoundFit: RunFitSummary | null;
  asLeftFit: RunFitSummary | null;
  points: PointResult[];
  /** Worst decision of the final (as-left, else as-found) points; null when none could be decided. */
  decision: Decision | null;
  problems: string[];
};

export const REVIEW_FLAG_KINDS = [
  'outlier',
  'excluded_reading',
  'standard_override',
  'standard_overdue',
  'tur_low',
  'no_standard',
  'no_calibration_run',
  'no_as_left',
  'extra_run',
  'point_not_conforming',
  'computation',
  'self_captured',
] as const;
export type ReviewFlagKind = (typeof REVIEW_FLAG_KINDS)[number];

/**
 * One thing a person did to a job's data, as the audit trail and the record show it: what the
 * no-self-sign rule looks at (a signatory must not have captured or shaped the data they sign).
 */
export type SignerDeed =
  | { kind: 'opened_run'; runId: number }
  | { kind: 'entered'; runId: number; readings: number }
  | { kind: 'imported'; runId: number; readings: number }
  | { kind: 'excluded'; runId: number; seq: number }
  | { kind: 'edited_budget'; runId: number };

/** Something the lead should look at; 'blocker' flags stop signing. */
export type ReviewFlag = {
  kind: ReviewFlagKind;
  severity: 'info' | 'warning' | 'blocker';
  message: string;
  runId?: number;
  rangeId?: number;
  dial?: number;
  readingId?: number;
};

/**
 * One of a job's two outcomes (as found, before any adjustment; as left, after it), over every setting
 * measured in runs of that kind on every range. Made by common's jobOutcomes().
 */
export type JobOutcome = {
  /** Worst decision of the settings (fail > conditional fail > conditional pass > pass); null when none was decided. */
  decision: Decision | null;
  /** Settings measured. */
  settings: number;
  pass: number;
  conditionalPass: number;
  conditionalFail: number;
  fail: number;
  /** Settings out of tolerance: fail plus conditional fail. */
  outOfTolerance: number;
  /** Settings with a conditional decision (pass or fail): the error lies within U of the tolerance limit. */
  conditional: number;
  /** Settings with no decision (no uncertainty could be stated). */
  undecided: number;
  /** Plain words: "out of tolerance at 3 of 10 settings", "within tolerance". */
  words: string;
};

/** The job's two outcomes. asFound or asLeft is null when no run of that kind has results. */
export type JobOutcomes = {
  asFound: JobOutcome | null;
  asLeft: JobOutcome | null;
  /** Labels of the ranges measured as found and not as left: there the as-found results are the final ones. */
  asFoundFinalRanges: string[];
  /** Both outcomes in one plain sentence: "As found: out of tolerance at 3 of 10 settings; as left: within tolerance." */
  summary: string;
};

export type JobResults = {
  jobId: number;
  jobNumber: string;
  jobStatus: JobStatus;
  procedure: Pick<Procedure, 'id' | 'name' | 'method' | 'decisionRule'>;
  decisionRule: DecisionRule;
  /** The rule in words, as printed on the certificate. */
  decisionRuleText: string;
  ranges: RangeResult[];
  standards: StandardReference[];
  /** Worst decision over every range's final points; null when nothing could be decided. */
  decision: Decision | null;
  /** The as-found and the as-left outcome (results stored before this field existed lack it: readers derive it with jobOutcomes). */
  outcomes: JobOutcomes;
  flags: ReviewFlag[];
};

// ---- The signed record (what a signature covers) ----

/** A procedure as one version of it stood: an edit makes a new version, and only open jobs use the newest. */
export type ProcedureVersion = BudgetDefaults & Pick<Procedure, 'id' | 'name' | 'method' | 'decisionRule'> & { version: number };

/** A reference standard as one version of it stood (its certificate, due date and accuracy). */
export type StandardVersion = StandardReference & { version: number };

/**
 * Everything a job's results and certificate depend on, captured in the signing transaction and stored
 * with the certificate revision (ISO/IEC 17025:2017 7.8; our design 7.1 "signed means frozen"). Every view
 * of a signed job (results, CSV, review, portal, public verification) reads this, never the live rows.
 */
export type SignedRecord = {
  schema: 1;
  job: {
    id: number;
    number: string;
    receivedDate: string;
    conditionReceived: string | null;
    technicianName: string | null;
    ambientTempC: number | null;
    humidityPct: number | null;
    supplyVoltages: number[];
    calibrationDates: { first: string; last: string };
  };
  instrument: {
    id: number;
    make: string;
    model: string;
    serial: string;
    assetTag: string | null;
    description: string | null;
    /** "make model, serial N", as printed. */
    label: string;
    ranges: InstrumentRange[];
  };
  customer: { id: number; name: string; contactEmail: string | null };
  lab: { name: string; address: string | null; place: string | null };
  procedure: ProcedureVersion;
  standards: StandardVersion[];
  results: JobResults;
  /** Deviations from the method stated on the certificate. */
  deviations: string[];
  /** GET /api/jobs/:id/results.csv as it stood at signing. */
  resultsCsv: string;
  signatory: { id: number; name: string; role: string; meaning: string; signedAt: string };
};

// ---- Review (GET /api/reviews/:jobId) and sign-off ----

export const REVIEW_ACTIONS = ['submit', 'return', 'sign', 'sign_refused', 'amend', 'withdraw'] as const;
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];

export type ReviewEvent = {
  id: number;
  action: ReviewAction;
  actorId: number | null;
  actorName: string | null;
  comment: string | null;
  at: string;
};

export type ReviewRun = {
  id: number;
  kind: RunKind;
  rangeId: number;
  rangeLabel: string;
  status: string;
  standardId: number | null;
  standardName: string | null;
  standardDueDate: string | null;
  standardOverrideReason: string | null;
  createdById: number;
  createdByName: string;
  startedAt: string;
  endedAt: string | null;
  readingCount: number;
  excludedCount: number;
  /** True when this run is the one the results use for its range and kind. */
  used: boolean;
};

export type ExcludedReading = {
  readingId: number;
  runId: number;
  seq: number;
  dial: number | null;
  frequency: number;
  reason: string;
  excludedById: number;
  excludedByName: string | null;
  excludedAt: string;
};

export type JobReview = {
  job: {
    id: number;
    number: string;
    status: JobStatus;
    organizationId: number;
    organizationName: string;
    instrumentId: number;
    instrumentLabel: string;
    receivedDate: string;
    conditionReceived: string | null;
    technicianId: number | null;
    technicianName: string | null;
    ambientTempC: number | null;
    humidityPct: number | null;
  };
  results: JobResults;
  runs: ReviewRun[];
  excludedReadings: ExcludedReading[];
  flags: ReviewFlag[];
  history: ReviewEvent[];
  /** The pending amendment, when the job was reopened from an issued certificate. */
  amendment: { certificateNumber: string; revision: number; replacesRevision: number; reason: string } | null;
  /** Whether the signed-in user may sign now, and if not, why. */
  canSign: boolean;
  signBlockers: string[];
};

export const SIGNING_MEANING = 'reviewed and approved for issue';
export type SubmitJobRequest = { comment?: string };
export type ReturnJobRequest = { comment: string };
/** meaning must be SIGNING_MEANING (the words the signatory agrees to). */
export type SignJobRequest = { password: string; meaning: string };

// ---- Certificates ----

export const CERTIFICATE_STATUSES = ['draft', 'issued', 'superseded', 'withdrawn'] as const;
export type CertificateStatus = (typeof CERTIFICATE_STATUSES)[number];

export type Certificate = {
  id: number;
  number: string;
  revision: number;
  status: CertificateStatus;
  jobId: number;
  jobNumber: string;
  organizationId: number;
  organizationName: string;
  instrumentId: number;
  instrumentLabel: string;
  signedById: number | null;
  signedByName: string | null;
  signedAt: string | null;
  signingMeaning: string | null;
  issuedAt: string | null;
  sha256: string | null;
  /** Download path (GET, signed in, scoped): /api/certificates/:id/pdf. Null for a draft. */
  pdfUrl: string | null;
  /** The public verification page. */
  verifyUrl: string;
  replacesRevision: number | null;
  amendmentReason: string | null;
  withdrawnReason: string | null;
  withdrawnAt: string | null;
  supersededAt: string | null;
  /** Overall decision printed on the certificate: the final one (as left, else as found). */
  decision: Decision | null;
  /** The as-found outcome, before any adjustment (worst as-found decision); null when not measured or not decided. */
  asFoundDecision: Decision | null;
  /** For a client: whether the PDF may be downloaded now, and if not why (the invoice that releases it). Absent for staff. */
  release?: CertificateRelease;
};

/** GET /api/certificates/:id adds the results exactly as printed (stored at signing, never recomputed). */
export type CertificateDetail = Certificate & { results: JobResults | null; revisions: Array<Pick<Certificate, 'id' | 'revision' | 'status' | 'issuedAt'>> };

export type ListCertificatesQuery = ListQuery & {
  organizationId?: number;
  instrumentId?: number;
  jobId?: number;
  /** One status or several separated by commas. */
  status?: string;
};

/**
 * rework (default true): the job goes back to in_progress for the technician, then through review and
 * signing again; false: the job goes straight to in_review so the lead can re-sign at once (e.g. after
 * correcting the customer's details). Either way the next signing issues revision N+1.
 */
export type AmendCertificateRequest = { reason: string; rework?: boolean };
export type WithdrawCertificateRequest = { reason: string };

// ---- Public verification (no sign-in) ----

export type PublicCertificate = {
  number: string;
  revision: number;
  status: CertificateStatus;
  /** Make, model and serial. */
  instrument: string;
  customer: string;
  issuedAt: string | null;
  sha256: string | null;
  /** Every revision of the number, newest first (no measurement data). */
  revisions: Array<{ revision: number; status: CertificateStatus; issuedAt: string | null; sha256: string | null }>;
  // Nothing about drafts: whether an amendment is being prepared is the lab's business, not an anonymous visitor's.
};

export type CertificateCheckResult = {
  match: boolean;
  revision?: number;
  status?: CertificateStatus;
  /** SHA-256 of the uploaded file. */
  sha256: string;
  /** The server's Ed25519 signature of the stored hash verified. */
  signatureValid?: boolean;
};

export type CertificateSigningKey = { algorithm: 'Ed25519'; keyId: string; publicKeyPem: string };

// ---- Settings (admin) ----

export type CertificateSettings = {
  /** A lead may sign a job whose runs they captured themselves. */
  allowSelfSign: boolean;
  /** Certificate numbers: PREFIX-YYYY-NNNN. */
  certificatePrefix: string;
  labAddress: string;
  /** Where the work is done, printed on the certificate. */
  calibrationPlace: string;
  /** Days before the due date the recall reminder goes out. */
  recallNoticeDays: number;
};
export type UpdateCertificateSettingsRequest = Partial<CertificateSettings>;

// ---- Mail (admin outbox: what the mail server the app talks to captured) ----

export type MailAttachmentView = { filename: string | null; contentType: string; size: number };

export type MailMessageSummary = {
  id: number;
  /** certificate_issued, job_returned, recall_reminder or other (from the X-Kilocycle-Kind header). */
  kind: string;
  from: string;
  to: string[];
  subject: string;
  size: number;
  attachmentCount: number;
  receivedAt: string;
};
export type MailMessageView = MailMessageSummary & {
  messageId: string | null;
  text: string | null;
  html: string | null;
  attachments: MailAttachmentView[];
  headers: Array<{ name: string; value: string }>;
};
export type ListMailQuery = ListQuery & { kind?: string };

// ---- Recall ----

export type RecallNotice = {
  id: number;
  instrumentId: number;
  instrumentLabel: string;
  organizationId: number;
  organizationName: string;
  dueDate: string;
  recipients: string[];
  sentAt: string;
};
export type RecallRunResult = { checked: number; sent: number; skipped: number; notices: RecallNotice[] };
