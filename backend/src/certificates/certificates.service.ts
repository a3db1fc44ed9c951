import { ConflictException, ForbiddenException, Inject, Injectable, NotFoundException, Optional } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, SelectQueryBuilder } from 'typeorm';
import type {
  Certificate as CertificateView,
  CertificateCheckResult,
  CertificateDetail,
  CertificateSettings,
  CertificateSigningKey,
  ListResponse,
  PublicCertificate,
} from '@kilocycle/common/types';
import { withOutcomes } from '@kilocycle/common/math';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { JobStatusWriter } from '../jobs/job-status.writer.js';
import { instrumentLabel } from '../shared/instrument-label.js';
import { CERTIFICATE_BILLING, type CertificateBilling } from '../shared/certificate-billing.js';
import { JobReviewEvents } from '../shared/job-review-events.js';
import { FileStore } from '../storage/file-store.service.js';
import { likePattern, paginate } from '../shared/paginate.js';
import { Certificate } from './certificate.entity.js';
import { readSettings, writeSettings } from './certificate-settings.js';
import type { AmendCertificateDto, ListCertificatesQueryDto, UpdateSettingsDto } from './dto/certificate.dto.js';
import { verifyUrl } from './issue-certificate.js';
import { loadSigningKey, sha256Hex, verifyCertificateSignature } from './signing-key.js';

const SORTABLE = {
  id: 'c.id',
  number: 'c.number',
  revision: 'c.revision',
  status: 'c.status',
  issuedAt: 'c.issuedAt',
  organizationName: 'o.name',
};

@Injectable()
export class CertificatesService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly audit: AuditService,
    private readonly jobs: JobScopeReader,
    private readonly jobStatus: JobStatusWriter,
    private readonly reviewEvents: JobReviewEvents,
    private readonly files: FileStore,
    // Provided by invoices when billing is on; without it nothing is held.
    @Optional() @Inject(CERTIFICATE_BILLING) private readonly billing: CertificateBilling | null = null,
  ) {}

  /** To a client, each certificate's release (held until its job's invoice is paid); the lab's staff are never held. */
  private async withReleases(user: Pick<AuthUser, 'role' | 'organizationId'>, views: CertificateView[]): Promise<CertificateView[]> {
    if (!this.billing || user.role !== 'client' || views.length === 0) return views;
    const releases = await this.billing.releasesFor(
      user,
      views.map((v) => v.jobId),
    );
    return views.map((v) => ({ ...v, release: releases.get(v.jobId) }));
  }

  toView(c: Certificate): CertificateView {
    return {
      id: c.id,
      number: c.number,
      revision: c.revision,
      status: c.status,
      jobId: c.jobId,
      jobNumber: c.job?.number ?? '',
      organizationId: c.organizationId,
      instrumentId: c.instrumentId,
      // As printed on the revision (kept at signing); a draft has none yet and shows the live instrument.
      organizationName: c.customerName ?? c.organization?.name ?? '',
      instrumentLabel: c.instrumentLabel ?? (c.instrument ? instrumentLabel(c.instrument) : ''),
      signedById: c.signedById,
      signedByName: c.signedBy?.name ?? null,
      signedAt: c.signedAt?.toISOString() ?? null,
      signingMeaning: c.signingMeaning,
      issuedAt: c.issuedAt?.toISOString() ?? null,
      sha256: c.sha256,
      pdfUrl: c.pdfFileId !== null ? `/api/certificates/${c.id}/pdf` : null,
      verifyUrl: verifyUrl(this.config.publicUrl, c.number),
      replacesRevision: c.replacesRevision,
      amendmentReason: c.amendmentReason,
      withdrawnReason: c.withdrawnReason,
      withdrawnAt: c.withdrawnAt?.toISOString() ?? null,
      supersededAt: c.supersededAt?.toISOString() ?? null,
      decision: c.decision,
      asFoundDecision: c.asFoundDecision,
    };
  }

  private query(user: Pick<AuthUser, 'role' | 'organizationId'>, withResults = false): SelectQueryBuilder<Certificate> {
    const columns = [
      'c.id',
      'c.number',
      'c.revision',
      'c.status',
      'c.jobId',
      'c.organizationId',
      'c.instrumentId',
      'c.signedById',
      'c.signedAt',
      'c.signingMeaning',
      'c.issuedAt',
      'c.pdfFileId',
      'c.sha256',
      'c.replacesRevision',
      'c.amendmentReason',
      'c.withdrawnReason',
      'c.withdrawnAt',
      'c.supersededAt',
      'c.decision',
      'c.asFoundDecision',
      'c.instrumentLabel',
      'c.customerName',
    ];
    const qb = this.dataSource
      .getRepository(Certificate)
      .createQueryBuilder('c')
      // The stored results are large: only the detail view reads them.
      .select([
        ...columns,
        ...(withResults ? ['c.results'] : []),
        'j.id',
        'j.number',
        'o.id',
        'o.name',
        'i.id',
        'i.make',
        'i.model',
        'i.serial',
        's.id',
        's.name',
      ])
      .innerJoin('c.job', 'j')
      .innerJoin('c.organization', 'o')
      .innerJoin('c.instrument', 'i')
      .leftJoin('c.signedBy', 's');
    const scope = organizationScope(user);
    // A client sees its own organisation's certificates, and never a draft (an amendment in preparation).
    if (scope !== null) qb.andWhere('c.organizationId = :scope', { scope }).andWhere("c.status <> 'draft'");
    return qb;
  }

  async list(user: AuthUser, query: ListCertificatesQueryDto): Promise<ListResponse<CertificateView>> {
    const qb = this.query(user);
    if (query.organizationId) qb.andWhere('c.organizationId = :org', { org: query.organizationId });
    if (query.instrumentId) qb.andWhere('c.instrumentId = :instrument', { instrument: query.instrumentId });
    if (query.jobId) qb.andWhere('c.jobId = :job', { job: query.jobId });
    if (query.status) qb.andWhere('c.status IN (:...statuses)', { statuses: query.status.split(',') });
    if (query.q) {
      qb.andWhere(
        '(c.number LIKE :q OR c.instrumentLabel LIKE :q OR c.customerName LIKE :q OR i.make LIKE :q OR i.model LIKE :q OR i.serial LIKE :q OR o.name LIKE :q)',
        { q: likePattern(query.q) },
      );
    }
    const page = await paginate(qb, query, SORTABLE, '-issuedAt', (c) => this.toView(c));
    return { ...page, items: await this.withReleases(user, page.items) };
  }

  private async find(user: Pick<AuthUser, 'role' | 'organizationId'>, id: number, withResults = false): Promise<Certificate> {
    const found = await this.query(user, withResults).andWhere('c.id = :id', { id }).getOne();
    if (!found) throw new NotFoundException(`Certificate ${id} not found`);
    return found;
  }

  async get(user: AuthUser, id: number): Promise<CertificateDetail> {
    const c = await this.find(user, id, true);
    const revisions = await this.query(user).andWhere('c.number = :number', { number: c.number }).orderBy('c.revision', 'DESC').getMany();
    const [view] = await this.withReleases(user, [this.toView(c)]);
    return {
      ...view!,
      // Results stored before the two outcomes were kept get them derived from their own points.
      results: c.results ? withOutcomes(c.results) : null,
      revisions: revisions.map((r) => ({ id: r.id, revision: r.revision, status: r.status, issuedAt: r.issuedAt?.toISOString() ?? null })),
    };
  }

  /** The stored PDF of a certificate the user may see, from the file store every node reads; nothing of the request names the file. */
  async pdf(user: AuthUser, id: number): Promise<{ data: Buffer; name: string }> {
    const c = await this.find(user, id);
    if (c.status === 'draft') throw new NotFoundException(`Certificate ${id} has no PDF yet (an amendment in preparation)`);
    // A client's download waits for the job's invoice (unless the customer is on account); staff are never asked.
    if (this.billing && user.role === 'client') {
      const release = await this.billing.releaseFor(user, c.jobId);
      if (!release.released) throw new ForbiddenException(release.heldReason ?? 'This certificate is held until the invoice for its job is paid.');
    }
    const data = c.pdfFileId !== null ? await this.files.get(c.pdfFileId, 'certificate-pdf') : null;
    if (!data) throw new NotFoundException(`The PDF of certificate ${c.number} revision ${c.revision} is missing from the store`);
    return { data, name: `${c.number}-rev${c.revision}.pdf` };
  }

  /**
   * Opens a new revision: the issued one becomes superseded at once (it stays downloadable), a draft of
   * revision N+1 records the reason, and the job goes back to in_progress for rework (or straight to
   * in_review when `rework` is false). The next signing issues the draft as "replaces revision N".
   */
  async amend(actor: AuthUser, id: number, body: AmendCertificateDto): Promise<CertificateDetail> {
    const draftId = await this.dataSource.transaction(async (manager) => {
      const c = await manager.findOne(Certificate, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!c) throw new NotFoundException(`Certificate ${id} not found`);
      if (c.status !== 'issued')
        throw new ConflictException(`certificate ${c.number} revision ${c.revision} is ${c.status}: only the issued revision can be amended`);
      const job = await this.jobs.scope(c.jobId, manager, true);
      if (!job) throw new NotFoundException(`Job ${c.jobId} not found`);
      const now = new Date();
      const to = body.rework === false ? 'in_review' : 'in_progress';
      await manager.update(Certificate, { id }, { status: 'superseded', supersededAt: now });
      const inserted = await manager.insert(Certificate, {
        number: c.number,
        revision: c.revision + 1,
        status: 'draft',
        jobId: c.jobId,
        organizationId: c.organizationId,
        instrumentId: c.instrumentId,
        replacesRevision: c.revision,
        amendmentReason: body.reason,
      });
      await this.jobStatus.setStatus(job.id, to, manager);
      await this.reviewEvents.record(
        { jobId: job.id, action: 'amend', actorId: actor.id, comment: `${c.number} revision ${c.revision + 1}: ${body.reason}`, at: now },
        manager,
      );
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'certificate',
          entityId: id,
          action: 'amend',
          changes: { status: { from: 'issued', to: 'superseded' }, reason: body.reason, newRevision: c.revision + 1 },
        },
        manager,
      );
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'job',
          entityId: job.id,
          action: 'status',
          changes: { from: job.status, to, comment: `amendment of ${c.number}: ${body.reason}` },
        },
        manager,
      );
      return inserted.identifiers[0].id as number;
    });
    return this.get(actor, draftId);
  }

  async withdraw(actor: AuthUser, id: number, reason: string): Promise<CertificateDetail> {
    await this.dataSource.transaction(async (manager) => {
      const c = await manager.findOne(Certificate, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!c) throw new NotFoundException(`Certificate ${id} not found`);
      if (c.status !== 'issued')
        throw new ConflictException(`certificate ${c.number} revision ${c.revision} is ${c.status}: only an issued revision can be withdrawn`);
      const now = new Date();
      await manager.update(Certificate, { id }, { status: 'withdrawn', withdrawnAt: now, withdrawnReason: reason });
      await this.reviewEvents.record(
        { jobId: c.jobId, action: 'withdraw', actorId: actor.id, comment: `${c.number} revision ${c.revision}: ${reason}`, at: now },
        manager,
      );
      await this.audit.record(
        { actorId: actor.id, entity: 'certificate', entityId: id, action: 'withdraw', changes: { status: { from: 'issued', to: 'withdrawn' }, reason } },
        manager,
      );
    });
    return this.get(actor, id);
  }

  /** The amendment in preparation for a job (its draft revision), or null: what a job's review shows of it. */
  async pendingAmendment(jobId: number): Promise<{ certificateNumber: string; revision: number; replacesRevision: number; reason: string } | null> {
    const draft = await this.dataSource.manager.findOne(Certificate, { where: { jobId, status: 'draft' } });
    return draft
      ? {
          certificateNumber: draft.number,
          revision: draft.revision,
          replacesRevision: draft.replacesRevision ?? draft.revision - 1,
          reason: draft.amendmentReason ?? '',
        }
      : null;
  }

  // ---- public ----

  private async revisionsOf(number: string): Promise<Certificate[]> {
    const rows = await this.dataSource
      .getRepository(Certificate)
      .createQueryBuilder('c')
      .select([
        'c.id',
        'c.number',
        'c.revision',
        'c.status',
        'c.issuedAt',
        'c.sha256',
        'c.signature',
        'c.keyId',
        'c.instrumentLabel',
        'c.customerName',
        'o.id',
        'o.name',
        'i.id',
        'i.make',
        'i.model',
        'i.serial',
      ])
      .innerJoin('c.organization', 'o')
      .innerJoin('c.instrument', 'i')
      .where('c.number = :number', { number })
      .orderBy('c.revision', 'DESC')
      .getMany();
    if (!rows.some((r) => r.status !== 'draft')) throw new NotFoundException(`No certificate numbered ${number}`);
    return rows;
  }

  async publicView(number: string): Promise<PublicCertificate> {
    const rows = await this.revisionsOf(number);
    const published = rows.filter((r) => r.status !== 'draft');
    const latest = published[0]!;
    return {
      number: latest.number,
      revision: latest.revision,
      status: latest.status,
      // As printed on the revision, never the live rows (a later edit must not change what the page says).
      instrument: latest.instrumentLabel ?? instrumentLabel(latest.instrument),
      customer: latest.customerName ?? latest.organization.name,
      issuedAt: latest.issuedAt?.toISOString() ?? null,
      sha256: latest.sha256,
      revisions: published.map((r) => ({ revision: r.revision, status: r.status, issuedAt: r.issuedAt?.toISOString() ?? null, sha256: r.sha256 })),
    };
  }

  /** Byte-for-byte check of an uploaded file against every revision's stored hash, and the server's seal. */
  async check(number: string, file: Buffer): Promise<CertificateCheckResult> {
    const rows = await this.revisionsOf(number);
    const sha256 = sha256Hex(file);
    const hit = rows.find((r) => r.status !== 'draft' && r.sha256 === sha256);
    if (!hit || !hit.signature) return { match: false, sha256 };
    const key = loadSigningKey(this.config);
    const signatureValid = hit.keyId === key.keyId && verifyCertificateSignature(key, hit.number, hit.revision, sha256, hit.signature);
    return { match: signatureValid, revision: hit.revision, status: hit.status, sha256, signatureValid };
  }

  signingKey(): CertificateSigningKey {
    const key = loadSigningKey(this.config);
    return { algorithm: 'Ed25519', keyId: key.keyId, publicKeyPem: key.publicKeyPem };
  }

  // ---- settings ----

  settings(): Promise<CertificateSettings> {
    return readSettings(this.dataSource.manager);
  }

  async updateSettings(actor: AuthUser, body: UpdateSettingsDto): Promise<CertificateSettings> {
    await this.dataSource.transaction(async (manager) => {
      const before = await readSettings(manager);
      const changes: Record<string, unknown> = {};
      for (const [key, value] of Object.entries(body)) {
        if (value !== undefined && before[key as keyof CertificateSettings] !== value)
          changes[key] = { from: before[key as keyof CertificateSettings], to: value };
      }
      if (Object.keys(changes).length === 0) return;
      await writeSettings(manager, body, actor.id);
      await this.audit.record({ actorId: actor.id, entity: 'settings', entityId: 'certificates', action: 'update', changes }, manager);
    });
    return this.settings();
  }
}
