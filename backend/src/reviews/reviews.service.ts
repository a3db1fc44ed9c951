import { BadRequestException, ConflictException, ForbiddenException, Inject, Injectable, Logger, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import {
  SIGNING_MEANING,
  type SignedRecord,
  type CertificateDetail,
  type JobReview as JobReviewView,
  type JobStatus,
  type ReviewEvent,
  type ReviewFlag,
} from '@kilocycle/common/types';
import { selfSignRefusal } from '@kilocycle/common/rules';
import { AuditLogService } from '../audit/audit-log.service.js';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { SignInThrottle } from '../auth/sign-in-throttle.service.js';
import { JobResultsService } from '../budgets/job-results.service.js';
import { ReadingResultsReader } from '../readings/reading-results.reader.js';
import { RunResultsReader } from '../runs/run-results.reader.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { StandardResultsReader } from '../standards/standard-results.reader.js';
import { ActorDirectory } from '../shared/actor-directory.js';
import { CertificateIssuer } from '../certificates/certificate-issuer.service.js';
import { CertificateSettingsReader } from '../certificates/certificate-settings.reader.js';
import { CertificatesService } from '../certificates/certificates.service.js';
import { SignedRecordReader } from '../certificates/signed-record.reader.js';
import { instrumentLabel } from '../shared/instrument-label.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { ReviewInstrumentsReader, type ReviewInstrument } from '../instruments/review-instruments.reader.js';
import { JobStatusWriter } from '../jobs/job-status.writer.js';
import { ReviewJobsReader, type ReviewedJob } from '../jobs/review-jobs.reader.js';
import { MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { AccountsReader } from '../users/accounts.reader.js';
import { missingStandards } from '@kilocycle/common/rules';
import { JobReview } from './job-review.entity.js';
import { readSignerDeeds, type SignerDeedSources } from './signer-deeds.js';

const SUBMITTABLE = ['in_progress', 'returned'] as const;

@Injectable()
export class ReviewsService {
  private readonly logger = new Logger('Reviews');
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly audit: AuditService,
    private readonly mail: MailService,
    private readonly certificates: CertificatesService,
    /** Wrong passwords at signing, per lead (numbers in auth/sign-in-throttle.service.ts). */
    private readonly signThrottle: SignInThrottle,
    private readonly jobResults: JobResultsService,
    private readonly runResults: RunResultsReader,
    private readonly readingResults: ReadingResultsReader,
    private readonly issuer: CertificateIssuer,
    private readonly certificateSettings: CertificateSettingsReader,
    private readonly signedRecords: SignedRecordReader,
    private readonly rangeResults: RangeResultsReader,
    private readonly standardResults: StandardResultsReader,
    private readonly actors: ActorDirectory,
    private readonly jobs: ReviewJobsReader,
    private readonly jobStatus: JobStatusWriter,
    private readonly instruments: ReviewInstrumentsReader,
    private readonly organizations: OrganizationsReader,
    private readonly accounts: AccountsReader,
    auditLog: AuditLogService,
  ) {
    this.deedSources = { runs: runResults, audit: auditLog, readings: readingResults };
  }

  private readonly deedSources: SignerDeedSources;

  /** A job the user may see; another organisation's job answers 404 as if it did not exist. With `lock`, its row is locked in the transaction. */
  private async scopedJob(user: AuthUser, jobId: number, manager?: EntityManager, lock = false): Promise<ReviewedJob> {
    const job = await this.jobs.job(jobId, manager, lock);
    const scope = organizationScope(user);
    if (!job || (scope !== null && job.organizationId !== scope)) throw new NotFoundException(`Job ${jobId} not found`);
    return job;
  }

  private async instrumentOf(job: ReviewedJob): Promise<ReviewInstrument> {
    const instrument = await this.instruments.instrument(job.instrumentId);
    if (!instrument) throw new Error(`instrument ${job.instrumentId} of job ${job.number} does not exist`);
    return instrument;
  }

  private async changeStatus(
    manager: EntityManager,
    actor: AuthUser,
    job: ReviewedJob,
    to: JobStatus,
    action: 'submit' | 'return',
    comment: string | null,
  ): Promise<void> {
    await this.jobStatus.setStatus(job.id, to, manager);
    await manager.insert(JobReview, { jobId: job.id, action, actorId: actor.id, comment });
    // Same shape as the jobs module's status changes, so its "returnComment" reads ours too.
    await this.audit.record({ actorId: actor.id, entity: 'job', entityId: job.id, action: 'status', changes: { from: job.status, to, comment } }, manager);
  }

  async submit(actor: AuthUser, jobId: number, comment: string | null): Promise<JobReviewView> {
    await this.dataSource.transaction(async (manager) => {
      const job = await this.scopedJob(actor, jobId, manager, true);
      if (!(SUBMITTABLE as readonly string[]).includes(job.status)) {
        throw new ConflictException(`job ${job.number} is ${job.status}: only a job in progress or returned can be submitted for review`);
      }
      // Results are stated against a standard: a calibration run without one cannot go to review.
      const runs = (await this.runResults.jobRuns(job.id, manager)).filter((r) => r.kind === 'as_found' || r.kind === 'as_left').sort((a, b) => a.id - b.id);
      const rangeLabels = new Map((await this.rangeResults.ranges(job.instrumentId, manager)).map((g) => [g.id, g.label]));
      const missing = missingStandards(runs.map((r) => ({ id: r.id, kind: r.kind, rangeLabel: rangeLabels.get(r.rangeId) ?? '', standardId: r.standardId })));
      if (missing) {
        throw new ConflictException(`job ${job.number} cannot go to review: ${missing}. Set the standard with "Correct run details" on the run's page.`);
      }
      const results = await this.jobResults.compute(job.id, manager);
      if (results.flags.some((f) => f.kind === 'no_calibration_run')) {
        throw new ConflictException(`job ${job.number} has no as-found or as-left run with readings: nothing to review yet`);
      }
      await this.changeStatus(manager, actor, job, 'in_review', 'submit', comment || null);
    });
    return this.review(actor, jobId);
  }

  async returnJob(actor: AuthUser, jobId: number, comment: string): Promise<JobReviewView> {
    const job = await this.dataSource.transaction(async (manager) => {
      const found = await this.scopedJob(actor, jobId, manager, true);
      if (found.status !== 'in_review') throw new ConflictException(`job ${found.number} is ${found.status}: only a job in review can be returned`);
      await this.changeStatus(manager, actor, found, 'returned', 'return', comment);
      return found;
    });
    await this.mailReturned(actor, job, comment);
    return this.review(actor, jobId);
  }

  /** The active account of this user, or null. */
  private async activeAccount(userId: number): Promise<{ email: string; name: string } | null> {
    const account = await this.accounts.byId(userId);
    return account?.active ? account : null;
  }

  private async mailReturned(actor: AuthUser, job: ReviewedJob, comment: string): Promise<void> {
    let technician = job.technicianId ? await this.activeAccount(job.technicianId) : null;
    if (!technician) {
      // No technician assigned: whoever captured the job's latest run.
      const latest = (await this.runResults.jobRuns(job.id)).at(-1);
      technician = latest ? await this.activeAccount(latest.createdBy) : null;
    }
    if (!technician) {
      this.logger.warn(`job ${job.number} returned, but it has no technician to tell`);
      return;
    }
    const instrument = await this.instrumentOf(job);
    await this.mail.sendJobReturned(
      {
        to: technician.email,
        technician: technician.name,
        lead: actor.name,
        jobNumber: job.number,
        instrument: instrumentLabel(instrument),
        comment,
        jobUrl: `${this.config.publicUrl}/jobs/${job.id}`,
      },
      { entity: 'job', entityId: job.id },
    );
  }

  private async refuse(actor: AuthUser, job: ReviewedJob, reason: string): Promise<void> {
    await this.dataSource.transaction(async (manager) => {
      await manager.insert(JobReview, { jobId: job.id, action: 'sign_refused', actorId: actor.id, comment: reason });
      await this.audit.record({ actorId: actor.id, entity: 'job', entityId: job.id, action: 'sign_refused', changes: { reason } }, manager);
    });
  }

  /** What the user did to the job's data, in words ("you entered 10 readings of run 12 …: another lead must sign"), or null. */
  private async selfCaptured(manager: EntityManager, jobId: number, userId: number): Promise<string | null> {
    return selfSignRefusal(await readSignerDeeds(this.deedSources, jobId, userId, manager));
  }

  /**
   * Signing: the lead's password again (403, audited, when wrong: not 401, which would end the session),
   * the agreed meaning, no self-signing unless the admin allows it; then CertificateIssuer.issue in one
   * transaction (the PDF file goes if it fails) and, after commit, the customer's mail with the PDF.
   */
  async sign(actor: AuthUser, jobId: number, password: string, meaning: string): Promise<CertificateDetail> {
    const job = await this.scopedJob(actor, jobId);
    if (meaning !== SIGNING_MEANING) throw new BadRequestException(`meaning must be "${SIGNING_MEANING}"`);
    await this.signThrottle.checkSignOff(actor.id);
    const passwordHash = await this.accounts.passwordHash(actor.id);
    if (!passwordHash || !(await bcrypt.compare(password, passwordHash))) {
      await this.signThrottle.recordSignOffFailure(actor.id);
      await this.refuse(actor, job, 'wrong password');
      throw new ForbiddenException('Password is not right: the job was not signed');
    }
    const settings = await this.certificateSettings.read();
    const captured = settings.allowSelfSign ? null : await this.selfCaptured(this.dataSource.manager, job.id, actor.id);
    if (captured) {
      await this.refuse(actor, job, captured);
      throw new ForbiddenException(`${captured.charAt(0).toUpperCase()}${captured.slice(1)} (or an admin allows self-signing)`);
    }
    const outcome = await this.issuer.issue({ jobId: job.id, signerId: actor.id, meaning });
    if (outcome.recipients.length === 0) {
      this.logger.warn(`certificate ${outcome.number} issued, but ${outcome.customer} has no contact address to mail`);
    } else {
      await this.mail.sendCertificateIssued(
        {
          to: outcome.recipients,
          labName: outcome.labName,
          number: outcome.number,
          revision: outcome.revision,
          replacesRevision: outcome.replacesRevision,
          instrument: outcome.instrumentLabel,
          customer: outcome.customer,
          verifyUrl: outcome.verifyUrl,
          outcomes: outcome.outcomes,
          pdf: outcome.pdf,
          fileName: outcome.downloadName,
        },
        { entity: 'certificate', entityId: outcome.certificateId },
      );
    }
    return this.certificates.get(actor, outcome.certificateId);
  }

  async review(user: AuthUser, jobId: number): Promise<JobReviewView> {
    const manager = this.dataSource.manager;
    const job = await this.scopedJob(user, jobId, manager);
    // A signed job is shown as it was signed: results, instrument, customer and standards from its record.
    const signed = await this.signedRecords.signedRecord(job.id, manager);
    const frozen = signed?.record ?? null;
    const [instrument, organization, technicianName, results, settings] = await Promise.all([
      this.instrumentOf(job),
      this.organizations.byId(job.organizationId, manager),
      job.technicianId ? this.actors.namesOf([job.technicianId]).then((names) => names.get(job.technicianId!) ?? null) : Promise.resolve(null),
      signed ? Promise.resolve(signed.results) : this.jobResults.compute(job.id, manager),
      this.certificateSettings.read(manager),
    ]);
    if (!organization) throw new Error(`organization ${job.organizationId} of job ${job.number} does not exist`);
    const { runs, excludedReadings } = await this.reviewRuns(job, results, frozen);
    const amendment = await this.certificates.pendingAmendment(job.id);
    const flags: ReviewFlag[] = [...results.flags];
    const selfCaptured = user.role === 'lead' ? await this.selfCaptured(manager, job.id, user.id) : null;
    if (selfCaptured) {
      flags.push({
        kind: 'self_captured',
        severity: settings.allowSelfSign ? 'info' : 'blocker',
        message: settings.allowSelfSign ? `${selfCaptured.replace(/: another lead must sign$/, '')}; self-signing is allowed by the admin` : selfCaptured,
      });
    }
    const signBlockers: string[] = [];
    if (user.role !== 'lead') signBlockers.push('only a lead may sign');
    if (job.status !== 'in_review' && job.status !== 'approved') signBlockers.push(`the job is ${job.status}, not in review`);
    for (const f of flags) if (f.severity === 'blocker') signBlockers.push(f.message);
    return {
      job: {
        id: job.id,
        number: job.number,
        status: job.status,
        organizationId: job.organizationId,
        organizationName: frozen?.customer.name ?? organization.name,
        instrumentId: job.instrumentId,
        instrumentLabel: frozen?.instrument.label ?? instrumentLabel(instrument),
        receivedDate: frozen?.job.receivedDate ?? job.receivedDate,
        conditionReceived: frozen ? frozen.job.conditionReceived : job.conditionReceived,
        technicianId: job.technicianId,
        technicianName: frozen ? frozen.job.technicianName : technicianName,
        ambientTempC: frozen ? frozen.job.ambientTempC : job.ambientTempC,
        humidityPct: frozen ? frozen.job.humidityPct : job.humidityPct,
      },
      results,
      runs,
      excludedReadings,
      flags,
      history: await this.history(job.id),
      amendment,
      canSign: signBlockers.length === 0,
      signBlockers,
    };
  }

  /**
   * The job's runs (range, standard, who captured them, reading counts, whether the results use them) and their
   * excluded readings, read from their owners; a signed job names its ranges and standards as they were signed.
   */
  private async reviewRuns(
    job: ReviewedJob,
    results: JobReviewView['results'],
    frozen: SignedRecord | null,
  ): Promise<Pick<JobReviewView, 'runs' | 'excludedReadings'>> {
    const runs = await this.runResults.jobRuns(job.id);
    const runIds = runs.map((r) => r.id);
    const [ranges, standards, exclusions] = await Promise.all([
      this.rangeResults.ranges(job.instrumentId),
      this.standardResults.references(runs.flatMap((r) => (r.standardId === null ? [] : [r.standardId]))),
      this.readingResults.exclusions(runIds),
    ]);
    const names = await this.actors.namesOf([...runs.map((r) => r.createdBy), ...exclusions.map((e) => e.excludedBy)]);
    const rangeLabels = new Map(ranges.map((g) => [g.id, g.label]));
    const signedStandards = new Map((frozen?.standards ?? []).map((s) => [s.id, s]));
    const used = new Set(results.ranges.flatMap((r) => [r.asFoundRunId, r.asLeftRunId]).filter((id): id is number => id !== null));
    return {
      runs: runs.map((r) => {
        const standard = r.standardId === null ? undefined : standards.get(r.standardId)?.reference;
        return {
          id: r.id,
          kind: r.kind,
          rangeId: r.rangeId,
          rangeLabel: frozen?.instrument.ranges.find((g) => g.id === r.rangeId)?.label ?? rangeLabels.get(r.rangeId) ?? '',
          status: r.status,
          standardId: r.standardId,
          standardName: signedStandards.get(Number(r.standardId))?.name ?? standard?.name ?? null,
          standardDueDate: signedStandards.get(Number(r.standardId))?.dueDate ?? standard?.dueDate ?? null,
          standardOverrideReason: r.standardOverrideReason,
          createdById: r.createdBy,
          createdByName: names.get(r.createdBy) ?? '',
          startedAt: r.startedAt.toISOString(),
          endedAt: r.endedAt ? r.endedAt.toISOString() : null,
          readingCount: r.readingCount,
          excludedCount: r.excludedCount,
          used: used.has(r.id),
        };
      }),
      excludedReadings: exclusions.map((e) => ({
        readingId: e.readingId,
        runId: e.runId,
        seq: e.seq,
        dial: e.dial,
        frequency: e.frequency,
        reason: e.reason,
        excludedById: e.excludedBy,
        excludedByName: names.get(e.excludedBy) ?? null,
        excludedAt: e.excludedAt.toISOString(),
      })),
    };
  }

  /** The job's review events, oldest first, with the actors' names. */
  private async history(jobId: number): Promise<ReviewEvent[]> {
    const rows: Array<Record<string, unknown>> = await this.dataSource.manager.query(
      'SELECT id, action, actor_id, comment, at FROM job_reviews WHERE job_id = ? ORDER BY id',
      [jobId],
    );
    const names = await this.actors.namesOf(rows.flatMap((h) => (h.actor_id === null ? [] : [Number(h.actor_id)])));
    return rows.map((h) => ({
      id: Number(h.id),
      action: h.action as ReviewEvent['action'],
      actorId: h.actor_id === null ? null : Number(h.actor_id),
      actorName: h.actor_id === null ? null : (names.get(Number(h.actor_id)) ?? null),
      comment: (h.comment as string | null) ?? null,
      at: new Date(h.at as string).toISOString(),
    }));
  }
}
