import { BadRequestException, ConflictException, ForbiddenException, Inject, Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import { SIGNING_MEANING, type SignedRecord, type CertificateDetail, type JobReview as JobReviewView, type ReviewEvent, type ReviewFlag } from '@kilocycle/common/types';
import { selfSignRefusal } from '@kilocycle/common/rules';
import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../shared/auth-user.js';
import { SignInThrottle } from '../auth/sign-in-throttle.service.js';
import { findScopedJob } from '../budgets/job-access.js';
import { JobResultsService } from '../budgets/job-results.service.js';
import { ReadingResultsReader } from '../readings/reading-results.reader.js';
import { RunResultsReader } from '../runs/run-results.reader.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { StandardResultsReader } from '../standards/standard-results.reader.js';
import { ActorDirectory } from '../shared/actor-directory.js';
import { RunReadingStatsSource } from '../shared/run-reading-stats.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import { Certificate } from '../certificates/certificate.entity.js';
import { readSettings } from '../certificates/certificate-settings.js';
import { CertificatesService } from '../certificates/certificates.service.js';
import { loadSignedRecord } from '../certificates/signed-record.js';
import { instrumentLabel, issueCertificate, withCertificateFile, type IssueReaders } from '../certificates/issue-certificate.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { Job } from '../jobs/job.entity.js';
import { certificateIssuedMail, jobReturnedMail } from '../mail/mail-templates.js';
import { MailService } from '../mail/mail.service.js';
import { Organization } from '../organizations/organization.entity.js';
import { User } from '../users/user.entity.js';
import { missingStandards } from '@kilocycle/common/rules';
import { JobReview } from './job-review.entity.js';
import { readSignerDeeds } from './signer-deeds.js';

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
    recipients: CertificateRecipientsReader,
    private readonly rangeResults: RangeResultsReader,
    private readonly standardResults: StandardResultsReader,
    private readonly readingStats: RunReadingStatsSource,
    private readonly actors: ActorDirectory,
  ) {
    this.issueReaders = { runs: runResults, readings: readingResults, recipients };
  }

  private readonly issueReaders: IssueReaders;

  private async changeStatus(manager: EntityManager, actor: AuthUser, job: Job, to: Job['status'], action: 'submit' | 'return', comment: string | null): Promise<void> {
    await manager.update(Job, { id: job.id }, { status: to });
    await manager.insert(JobReview, { jobId: job.id, action, actorId: actor.id, comment });
    // Same shape as the jobs module's status changes, so its "returnComment" reads ours too.
    await this.audit.record({ actorId: actor.id, entity: 'job', entityId: job.id, action: 'status', changes: { from: job.status, to, comment } }, manager);
  }

  async submit(actor: AuthUser, jobId: number, comment: string | null): Promise<JobReviewView> {
    await this.dataSource.transaction(async (manager) => {
      const job = await findScopedJob(manager, actor, jobId, true);
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
      const found = await findScopedJob(manager, actor, jobId, true);
      if (found.status !== 'in_review') throw new ConflictException(`job ${found.number} is ${found.status}: only a job in review can be returned`);
      await this.changeStatus(manager, actor, found, 'returned', 'return', comment);
      return found;
    });
    await this.mailReturned(actor, job, comment);
    return this.review(actor, jobId);
  }

  private async mailReturned(actor: AuthUser, job: Job, comment: string): Promise<void> {
    const manager = this.dataSource.manager;
    let technician = job.technicianId ? await manager.findOneBy(User, { id: job.technicianId, active: true }) : null;
    if (!technician) {
      // No technician assigned: whoever captured the job's latest run.
      const latest = (await this.runResults.jobRuns(job.id)).at(-1);
      technician = latest ? await manager.findOneBy(User, { id: latest.createdBy, active: true }) : null;
    }
    if (!technician) {
      this.logger.warn(`job ${job.number} returned, but it has no technician to tell`);
      return;
    }
    const instrument = await manager.findOneByOrFail(Instrument, { id: job.instrumentId });
    await this.mail.sendSafely(
      jobReturnedMail({
        to: technician.email,
        technician: technician.name,
        lead: actor.name,
        jobNumber: job.number,
        instrument: instrumentLabel(instrument),
        comment,
        jobUrl: `${this.config.publicUrl}/jobs/${job.id}`,
      }),
      { entity: 'job', entityId: job.id },
    );
  }

  private async refuse(actor: AuthUser, job: Job, reason: string): Promise<void> {
    await this.dataSource.transaction(async (manager) => {
      await manager.insert(JobReview, { jobId: job.id, action: 'sign_refused', actorId: actor.id, comment: reason });
      await this.audit.record({ actorId: actor.id, entity: 'job', entityId: job.id, action: 'sign_refused', changes: { reason } }, manager);
    });
  }

  /** What the user did to the job's data, in words ("you entered 10 readings of run 12 …: another lead must sign"), or null. */
  private async selfCaptured(manager: EntityManager, jobId: number, userId: number): Promise<string | null> {
    return selfSignRefusal(await readSignerDeeds(manager, jobId, userId));
  }

  /**
   * Signing: the lead's password again (403, audited, when wrong: not 401, which would end the session),
   * the agreed meaning, no self-signing unless the admin allows it; then issueCertificate in one
   * transaction (the PDF file goes if it fails) and, after commit, the customer's mail with the PDF.
   */
  async sign(actor: AuthUser, jobId: number, password: string, meaning: string): Promise<CertificateDetail> {
    const job = await findScopedJob(this.dataSource.manager, actor, jobId);
    if (meaning !== SIGNING_MEANING) throw new BadRequestException(`meaning must be "${SIGNING_MEANING}"`);
    await this.signThrottle.checkSignOff(actor.id);
    const me = await this.dataSource.getRepository(User).createQueryBuilder('u').addSelect('u.passwordHash').where('u.id = :id', { id: actor.id }).getOne();
    if (!me || !(await bcrypt.compare(password, me.passwordHash))) {
      await this.signThrottle.recordSignOffFailure(actor.id);
      await this.refuse(actor, job, 'wrong password');
      throw new ForbiddenException('Password is not right: the job was not signed');
    }
    const settings = await readSettings(this.dataSource.manager);
    const captured = settings.allowSelfSign ? null : await this.selfCaptured(this.dataSource.manager, job.id, actor.id);
    if (captured) {
      await this.refuse(actor, job, captured);
      throw new ForbiddenException(`${captured.charAt(0).toUpperCase()}${captured.slice(1)} (or an admin allows self-signing)`);
    }
    const outcome = await withCertificateFile(this.dataSource, (manager) => issueCertificate(manager, { config: this.config, results: this.jobResults, readers: this.issueReaders }, { jobId: job.id, signerId: actor.id, meaning }),
    );
    if (outcome.recipients.length === 0) {
      this.logger.warn(`certificate ${outcome.number} issued, but ${outcome.customer} has no contact address to mail`);
    } else {
      await this.mail.sendSafely(
        certificateIssuedMail({
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
        }),
        { entity: 'certificate', entityId: outcome.certificateId },
      );
    }
    return this.certificates.get(actor, outcome.certificateId);
  }

  async review(user: AuthUser, jobId: number): Promise<JobReviewView> {
    const manager = this.dataSource.manager;
    const job = await findScopedJob(manager, user, jobId);
    // A signed job is shown as it was signed: results, instrument, customer and standards from its record.
    const signed = await loadSignedRecord(manager, job.id);
    const frozen = signed?.record ?? null;
    const [instrument, organization, technician, results, settings] = await Promise.all([
      manager.findOneByOrFail(Instrument, { id: job.instrumentId }),
      manager.findOneByOrFail(Organization, { id: job.organizationId }),
      job.technicianId ? manager.findOneBy(User, { id: job.technicianId }) : Promise.resolve(null),
      signed ? Promise.resolve(signed.results) : this.jobResults.compute(job.id, manager),
      readSettings(manager),
    ]);
    const { runs, excludedReadings } = await this.reviewRuns(job, results, frozen);
    const draft = await manager.findOne(Certificate, { where: { jobId: job.id, status: 'draft' } });
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
        receivedDate: frozen?.job.receivedDate ?? (typeof job.receivedDate === 'string' ? job.receivedDate.slice(0, 10) : new Date(job.receivedDate).toISOString().slice(0, 10)),
        conditionReceived: frozen ? frozen.job.conditionReceived : job.conditionReceived,
        technicianId: job.technicianId,
        technicianName: frozen ? frozen.job.technicianName : (technician?.name ?? null),
        ambientTempC: frozen ? frozen.job.ambientTempC : job.ambientTempC,
        humidityPct: frozen ? frozen.job.humidityPct : job.humidityPct,
      },
      results,
      runs,
      excludedReadings,
      flags,
      history: await this.history(job.id),
      amendment: draft
        ? { certificateNumber: draft.number, revision: draft.revision, replacesRevision: draft.replacesRevision ?? draft.revision - 1, reason: draft.amendmentReason ?? '' }
        : null,
      canSign: signBlockers.length === 0,
      signBlockers,
    };
  }

  /**
   * The job's runs (range, standard, who captured them, reading counts, whether the results use them) and their
   * excluded readings, read from their owners; a signed job names its ranges and standards as they were signed.
   */
  private async reviewRuns(job: Job, results: JobReviewView['results'], frozen: SignedRecord | null): Promise<Pick<JobReviewView, 'runs' | 'excludedReadings'>> {
    const runs = await this.runResults.jobRuns(job.id);
    const runIds = runs.map((r) => r.id);
    const [ranges, standards, stats, exclusions] = await Promise.all([
      this.rangeResults.ranges(job.instrumentId),
      this.standardResults.references(runs.flatMap((r) => (r.standardId === null ? [] : [r.standardId]))),
      this.readingStats.statsFor(runIds),
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
          readingCount: stats.get(r.id)?.readingCount ?? 0,
          excludedCount: stats.get(r.id)?.excludedCount ?? 0,
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
    const rows: Array<Record<string, unknown>> = await this.dataSource.manager.query('SELECT id, action, actor_id, comment, at FROM job_reviews WHERE job_id = ? ORDER BY id', [jobId]);
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
