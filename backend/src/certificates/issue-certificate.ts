import { ConflictException } from '@nestjs/common';
import type { DataSource, EntityManager } from 'typeorm';
import { SIGNING_MEANING, type JobOutcomes, type JobResults, type SignedRecord } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import type { JobResultsService } from '../budgets/job-results.service.js';
import { CertificateInstrumentWriter, type CertificateInstrument } from '../instruments/certificate-instrument.writer.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { JobStatusWriter } from '../jobs/job-status.writer.js';
import { ReviewJobsReader, type ReviewedJob } from '../jobs/review-jobs.reader.js';
import { OrganizationsReader, type OrganizationContact } from '../organizations/organizations.reader.js';
import { ReadingResultsReader } from '../readings/reading-results.reader.js';
import { RunResultsReader } from '../runs/run-results.reader.js';
import { RunStandardVersionWriter } from '../runs/run-standard-version.writer.js';
import { StandardResultsReader } from '../standards/standard-results.reader.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import type { FileStore } from '../storage/file-store.service.js';
import type { AppConfig } from '../config/config.module.js';
import { instrumentLabel } from '../shared/instrument-label.js';
import type { JobReviewEvent } from '../shared/job-review-events.js';
import { resultsCsv } from '../shared/results-csv.js';
import { Certificate } from './certificate.entity.js';
import { renderCertificatePdf, type CertificatePdfData } from './certificate-pdf.js';
import { readSettings } from './certificate-settings.js';
import { loadSigningKey, sha256Hex, signCertificate } from './signing-key.js';

export const SIGNATORY_ROLE = 'Calibration lead (authorised signatory)';

/** The owners' readers and writers issuing goes through (each on the signing transaction's manager). */
export type IssueReaders = {
  jobs: ReviewJobsReader;
  jobStatus: JobStatusWriter;
  instruments: CertificateInstrumentWriter;
  ranges: RangeResultsReader;
  organizations: OrganizationsReader;
  runs: RunResultsReader;
  runStandards: RunStandardVersionWriter;
  standards: StandardResultsReader;
  readings: ReadingResultsReader;
  recipients: CertificateRecipientsReader;
  audit: AuditService;
};
/** `files` keeps the PDF where every app node reads it, in the signing transaction. */
export type IssueDeps = {
  config: Pick<AppConfig, 'varDir' | 'signingKeyFile' | 'publicUrl'>;
  results: JobResultsService;
  readers: IssueReaders;
  files: FileStore;
};

/** The readers over one data source, for code run outside Nest (the demo seed). */
export function issueReadersOver(dataSource: DataSource): IssueReaders {
  return {
    jobs: new ReviewJobsReader(dataSource),
    jobStatus: new JobStatusWriter(),
    instruments: new CertificateInstrumentWriter(dataSource),
    ranges: new RangeResultsReader(dataSource),
    organizations: new OrganizationsReader(dataSource),
    runs: new RunResultsReader(dataSource),
    runStandards: new RunStandardVersionWriter(),
    standards: new StandardResultsReader(dataSource),
    readings: new ReadingResultsReader(dataSource),
    recipients: new CertificateRecipientsReader(dataSource),
    audit: AuditService.within(dataSource.manager),
  };
}
export type IssueInput = { jobId: number; signerId: number; meaning?: string; now?: Date };
export type IssueOutcome = {
  certificateId: number;
  number: string;
  revision: number;
  replacesRevision: number | null;
  pdf: Buffer;
  /** The PDF's id in the file store. */
  pdfFileId: number;
  downloadName: string;
  sha256: string;
  recipients: string[];
  labName: string;
  customer: string;
  instrumentLabel: string;
  verifyUrl: string;
  /** The job's as-found and as-left outcomes, for the customer's e-mail. */
  outcomes: JobOutcomes;
  /** The job's "sign" review event, for the caller to record in the same transaction (reviews owns that history). */
  reviewEvent: JobReviewEvent;
};

export function verifyUrl(publicUrl: string, number: string): string {
  return `${publicUrl}/verify/${encodeURIComponent(number)}`;
}

/** The next number of the year: PREFIX-YYYY-NNNN, under a lock on the year's highest number. */
async function nextNumber(manager: EntityManager, prefix: string, year: number): Promise<string> {
  const stem = `${prefix}-${year}-`;
  const rows: Array<{ number: string }> = await manager.query(
    'SELECT number FROM certificates WHERE number LIKE ? ORDER BY LENGTH(number) DESC, number DESC LIMIT 1 FOR UPDATE',
    [`${stem}%`],
  );
  const last = rows[0] ? Number(rows[0].number.slice(stem.length)) : 0;
  return `${stem}${String((Number.isFinite(last) ? last : 0) + 1).padStart(4, '0')}`;
}

function blockers(results: JobResults): string[] {
  return results.flags.filter((f) => f.severity === 'blocker').map((f) => f.message);
}

/**
 * Signs a job and issues its certificate, inside the caller's transaction: re-computes the results,
 * refuses when something blocks issue, moves the job in_review → approved → issued, numbers the
 * certificate (or takes the pending amendment's revision), renders the PDF once, hashes and seals it
 * with the server's Ed25519 key, stores it in the file store and records the certificate row naming it, the
 * review event and the audit trail, all in the caller's transaction (a failure leaves neither row nor file).
 * The caller mails after it commits. The seed uses this same path.
 */
export async function issueCertificate(manager: EntityManager, deps: IssueDeps, input: IssueInput): Promise<IssueOutcome> {
  const now = input.now ?? new Date();
  const meaning = input.meaning ?? SIGNING_MEANING;
  const { job, existing, draft } = await lockSignableJob(manager, deps.readers, input.jobId);
  const results = await deps.results.compute(job.id, manager);
  const blocking = blockers(results);
  if (blocking.length > 0) throw new ConflictException(`job ${job.number} cannot be signed: ${blocking.join('; ')}`);

  const { instrument, customer, lab, signer } = await issueParties(manager, deps.readers, job, input.signerId);
  const settings = await readSettings(manager);
  const labName = lab?.name ?? 'Calibration laboratory';
  const number = draft ? draft.number : await nextNumber(manager, settings.certificatePrefix, now.getUTCFullYear());
  const revision = draft ? draft.revision : 1;
  const replaced = draft?.replacesRevision ? (existing.find((c) => c.revision === draft.replacesRevision) ?? null) : null;

  const usedRunIds = results.ranges.flatMap((g) => [g.asFoundRunId, g.asLeftRunId]).filter((id): id is number => id !== null);
  const runRows = await deps.readers.runs.calibrationDays(usedRunIds, manager);
  const deviations = await issueDeviations(manager, deps.readers, results, usedRunIds);
  // Everything the signature covers, read in this transaction: every later view of the job reads it.
  const record = await captureRecord(manager, {
    deps,
    job,
    instrument,
    customer,
    lab: { name: labName, address: settings.labAddress, place: settings.calibrationPlace },
    results,
    deviations,
    usedRunIds,
    runRows,
    signer,
    meaning,
    now,
  });
  const url = verifyUrl(deps.config.publicUrl, number);
  const pdf = await renderCertificatePdf(pdfDataOf(record, { number, revision, draft, replaced, now, url }));
  const sha256 = sha256Hex(pdf);
  const key = loadSigningKey(deps.config);
  const signature = signCertificate(key, number, revision, sha256);
  // In this transaction: if anything below fails, the stored PDF goes with the certificate row.
  const stored = await deps.files.put('certificate-pdf', pdf, manager);
  const row = certificateRow({ number, revision, job, signer, meaning, now, pdfFileId: stored.id, sha256, signature, keyId: key.keyId, results, record });
  const certificateId = await storeCertificate(manager, draft, row, now);
  await recordIssue(manager, deps.readers, {
    job,
    instrument,
    signer,
    meaning,
    number,
    revision,
    certificateId,
    sha256,
    keyId: key.keyId,
    replacesRevision: draft?.replacesRevision ?? null,
    now,
  });
  const clientEmails = await deps.readers.recipients.clientEmails(job.organizationId, manager);
  const recipients = [...new Set([customer.contactEmail, ...clientEmails].filter((e): e is string => !!e))];
  return {
    certificateId,
    number,
    revision,
    replacesRevision: draft?.replacesRevision ?? null,
    pdf,
    pdfFileId: stored.id,
    downloadName: `${number}-rev${revision}.pdf`,
    sha256,
    recipients,
    labName,
    customer: customer.name,
    instrumentLabel: instrumentLabel(instrument),
    verifyUrl: url,
    outcomes: results.outcomes,
    reviewEvent: { jobId: job.id, action: 'sign', actorId: signer.id, comment: `${meaning} (certificate ${number} revision ${revision})`, at: now },
  };
}

type Signer = { id: number; name: string };

/** The instrument, its customer, the lab and the signer, from their owners in the signing transaction. */
async function issueParties(
  manager: EntityManager,
  readers: IssueReaders,
  job: ReviewedJob,
  signerId: number,
): Promise<{ instrument: CertificateInstrument; customer: OrganizationContact; lab: OrganizationContact | null; signer: Signer }> {
  const [instrument, customer, lab, names] = await Promise.all([
    readers.instruments.identity(job.instrumentId, manager),
    readers.organizations.byId(job.organizationId, manager),
    readers.organizations.lab(manager),
    readers.recipients.namesOf([signerId], manager),
  ]);
  // The job's foreign keys and the signed-in signer make these exist: a miss is a broken database, not bad input.
  if (!instrument || !customer || !names.has(signerId)) throw new Error(`job ${job.number}: its instrument, customer or signer is missing`);
  return { instrument, customer, lab, signer: { id: signerId, name: names.get(signerId)! } };
}

type RowInput = {
  number: string;
  revision: number;
  job: ReviewedJob;
  signer: Signer;
  meaning: string;
  now: Date;
  pdfFileId: number;
  sha256: string;
  signature: string;
  keyId: string;
  results: JobResults & { outcomes: JobOutcomes };
  record: SignedRecord;
};

/** The certificate row as issued: who signed and when, the file, its digest and seal, and the results and record signed. */
function certificateRow(input: RowInput): Partial<Certificate> {
  const { number, revision, job, signer, meaning, now, pdfFileId, sha256, signature, keyId, results, record } = input;
  return {
    number,
    revision,
    status: 'issued' as const,
    jobId: job.id,
    organizationId: job.organizationId,
    instrumentId: job.instrumentId,
    signedById: signer.id,
    signedAt: now,
    signingMeaning: meaning,
    issuedAt: now,
    pdfFileId,
    sha256,
    signature,
    keyId,
    decision: results.decision,
    asFoundDecision: results.outcomes.asFound?.decision ?? null,
    results,
    record,
    instrumentLabel: record.instrument.label,
    customerName: record.customer.name,
  };
}

/** The job, locked for the signing, with its certificates (newest revision first) and a pending amendment's draft; refuses a job not in review or already issued. */
async function lockSignableJob(
  manager: EntityManager,
  readers: IssueReaders,
  jobId: number,
): Promise<{ job: ReviewedJob; existing: Certificate[]; draft: Certificate | null }> {
  const job = await readers.jobs.job(jobId, manager, true);
  if (!job) throw new ConflictException(`job ${jobId} does not exist`);
  if (job.status !== 'in_review' && job.status !== 'approved') {
    throw new ConflictException(`job ${job.number} is ${job.status}: only a job in review can be signed`);
  }
  const existing = await manager.find(Certificate, { where: { jobId: job.id }, order: { revision: 'DESC' } });
  const draft = existing.find((c) => c.status === 'draft') ?? null;
  if (!draft && existing.some((c) => c.status === 'issued')) throw new ConflictException(`job ${job.number} already has an issued certificate`);
  return { job, existing, draft };
}

/** The certificate's remarks: excluded readings per run, standards used past due by override, ranges left unadjusted. */
async function issueDeviations(manager: EntityManager, readers: IssueReaders, results: JobResults, usedRunIds: number[]): Promise<string[]> {
  const deviations: string[] = [];
  for (const row of await readers.readings.exclusionSummary(usedRunIds, manager)) {
    deviations.push(`${row.count} reading${row.count === 1 ? '' : 's'} of run ${row.runId} excluded from the results: ${row.reasons}.`);
  }
  for (const flag of results.flags.filter((f) => f.kind === 'standard_override'))
    deviations.push(`Reference standard used past its due date by the lead's decision (run ${flag.runId}): ${flag.message.replace(/^.*override: /, '')}.`);
  for (const flag of results.flags.filter((f) => f.kind === 'no_as_left')) deviations.push(flag.message.replace(/^([^:]+): /, 'Range $1: ') + '.');
  return deviations;
}

type PdfIssue = { number: string; revision: number; draft: Certificate | null; replaced: Certificate | null; now: Date; url: string };

/** What the PDF prints: the signed record, with the number, the revision it replaces and the verification address. */
function pdfDataOf(record: SignedRecord, issue: PdfIssue): CertificatePdfData {
  const { number, revision, draft, replaced, now, url } = issue;
  return {
    number,
    revision,
    replaces: draft?.replacesRevision
      ? { revision: draft.replacesRevision, reason: draft.amendmentReason ?? '', issuedAt: replaced?.issuedAt?.toISOString() ?? null }
      : null,
    lab: { name: record.lab.name, address: record.lab.address ?? '', place: record.lab.place ?? '' },
    customer: { name: record.customer.name, contact: record.customer.contactEmail },
    instrument: record.instrument,
    job: { ...record.job, supplyVoltages: record.job.supplyVoltages },
    calibrationDates: record.job.calibrationDates,
    issuedAt: now,
    results: record.results,
    deviations: record.deviations,
    signatory: { name: record.signatory.name, role: record.signatory.role, meaning: record.signatory.meaning, signedAt: now },
    verifyUrl: url,
  };
}

/** Stores the certificate row (the amendment's draft becomes it) and makes sure no other revision of the number stays issued. */
async function storeCertificate(manager: EntityManager, draft: Certificate | null, row: Partial<Certificate>, now: Date): Promise<number> {
  let certificateId: number;
  if (draft) {
    await manager.update(Certificate, { id: draft.id }, row);
    certificateId = draft.id;
  } else {
    certificateId = (await manager.insert(Certificate, row)).identifiers[0].id as number;
  }
  // An amendment's earlier revisions are superseded already; make sure no other revision stays issued.
  await manager.query(
    "UPDATE certificates SET status = 'superseded', superseded_at = COALESCE(superseded_at, ?) WHERE number = ? AND id <> ? AND status = 'issued'",
    [now, row.number, certificateId],
  );
  return certificateId;
}

type IssueRecord = {
  job: ReviewedJob;
  instrument: CertificateInstrument;
  signer: Signer;
  meaning: string;
  number: string;
  revision: number;
  certificateId: number;
  sha256: string;
  keyId: string;
  replacesRevision: number | null;
  now: Date;
};

/** The job issued, the instrument's next due date and the audit trail, in the signing transaction (the caller records the review event). */
async function recordIssue(manager: EntityManager, readers: IssueReaders, issue: IssueRecord): Promise<void> {
  const { job, instrument, signer, meaning, number, revision, certificateId, sha256, now } = issue;
  await readers.jobStatus.setStatus(job.id, 'issued', manager);
  // The recall cycle restarts at issue: the next due date is the issue date plus the owner's interval.
  await readers.instruments.restartRecall(instrument, now, manager);
  const audit = readers.audit;
  await audit.record(
    { actorId: signer.id, entity: 'job', entityId: job.id, action: 'status', changes: { from: job.status, to: 'approved', meaning } },
    manager,
  );
  await audit.record(
    { actorId: signer.id, entity: 'job', entityId: job.id, action: 'status', changes: { from: 'approved', to: 'issued', certificate: number, revision } },
    manager,
  );
  await audit.record(
    {
      actorId: signer.id,
      entity: 'certificate',
      entityId: certificateId,
      action: 'issue',
      changes: { number, revision, sha256, keyId: issue.keyId, meaning, signedAt: now.toISOString(), replacesRevision: issue.replacesRevision },
    },
    manager,
  );
}

type CaptureInput = {
  job: ReviewedJob;
  deps: IssueDeps;
  instrument: CertificateInstrument;
  customer: OrganizationContact;
  lab: SignedRecord['lab'];
  results: JobResults;
  deviations: string[];
  usedRunIds: number[];
  runRows: Array<{ started: string; ended: string; supplyVoltage: number | null }>;
  signer: Signer;
  meaning: string;
  now: Date;
};

/**
 * The signed record: the instrument's identity and ranges, the customer, the procedure version and the
 * standards' versions the results were computed with, the results, deviations, the results CSV and the
 * signatory. Stamps each used run with the version of its standard.
 */
async function captureRecord(manager: EntityManager, input: CaptureInput): Promise<SignedRecord> {
  const { job, instrument, customer, results, now } = input;
  const { readers } = input.deps;
  const [procedure, ranges, technicianNames, csv, standards] = await Promise.all([
    input.deps.results.procedure(job.id, manager),
    readers.ranges.ranges(instrument.id, manager),
    readers.recipients.namesOf(job.technicianId ? [job.technicianId] : [], manager),
    resultsCsv(readers, job, manager),
    readers.standards.figures(
      results.standards.map((s) => s.id),
      manager,
    ),
  ]);
  await stampStandardVersions(manager, readers, job.id, input.usedRunIds);
  const technician = job.technicianId ? { name: technicianNames.get(job.technicianId) ?? null } : null;
  return {
    schema: 1,
    job: {
      id: job.id,
      number: job.number,
      receivedDate: typeof job.receivedDate === 'string' ? job.receivedDate.slice(0, 10) : new Date(job.receivedDate).toISOString().slice(0, 10),
      conditionReceived: job.conditionReceived,
      technicianName: technician?.name ?? null,
      ambientTempC: job.ambientTempC,
      humidityPct: job.humidityPct,
      supplyVoltages: input.runRows
        .map((r) => r.supplyVoltage)
        .filter((v): v is number => v !== null)
        .map(Number),
      calibrationDates: {
        first: input.runRows.map((r) => r.started).sort()[0] ?? now.toISOString().slice(0, 10),
        last:
          input.runRows
            .map((r) => r.ended)
            .sort()
            .at(-1) ?? now.toISOString().slice(0, 10),
      },
    },
    instrument: {
      id: instrument.id,
      make: instrument.make,
      model: instrument.model,
      serial: instrument.serial,
      assetTag: instrument.assetTag,
      description: instrument.description,
      label: instrumentLabel(instrument),
      ranges,
    },
    customer: { id: customer.id, name: customer.name, contactEmail: customer.contactEmail },
    lab: input.lab,
    procedure: {
      id: procedure.id,
      version: procedure.version,
      name: procedure.name,
      method: procedure.method,
      decisionRule: procedure.decisionRule,
      dialHalfDivisionPercentOfSpan: procedure.dialHalfDivisionPercentOfSpan,
      driftPpm: procedure.driftPpm,
      driftHz: procedure.driftHz,
      extraComponents: procedure.extraComponents,
    },
    standards,
    results,
    deviations: input.deviations,
    resultsCsv: csv,
    signatory: { id: input.signer.id, name: input.signer.name, role: SIGNATORY_ROLE, meaning: input.meaning, signedAt: now.toISOString() },
  };
}

/** Stamps each used run with the version its standard has now (the version the record names). */
async function stampStandardVersions(manager: EntityManager, readers: IssueReaders, jobId: number, usedRunIds: number[]): Promise<void> {
  if (usedRunIds.length === 0) return;
  const used = new Set(usedRunIds);
  const standardIds = (await readers.runs.calibrationRuns(jobId, manager)).flatMap((r) => (used.has(r.id) && r.standardId !== null ? [r.standardId] : []));
  const versions = await readers.standards.references(standardIds, manager);
  await readers.runStandards.stamp(usedRunIds, new Map([...versions].map(([id, s]) => [id, s.version])), manager);
}
