import { BadRequestException, Inject, Injectable, NotFoundException, UnsupportedMediaTypeException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Request, Response } from 'express';
import { basename, join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { DataSource } from 'typeorm';
import {
  DEFAULT_ATTACHMENT_MAX_MB,
  type Attachment as AttachmentView,
  type AttachmentContentType,
  type AttachmentOwner,
  type ListResponse,
} from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { FileStore } from '../storage/file-store.service.js';
import { attachmentDisposition } from '../shared/csv.js';
import { megabytesFromEnv, readHead, receiveUpload, removeQuietly } from '../shared/multipart-upload.js';
import { Attachment } from './attachment.entity.js';
import { sniffContent } from '../shared/content-sniffer.js';

const MAX_CAPTION = 500;
const ACCEPTED_WORDS = 'JPEG, PNG, GIF or WebP images, PDF documents or plain text';

type AttachmentRow = Attachment & { uploadedByName: string };

function toView(row: AttachmentRow): AttachmentView {
  return {
    id: row.id,
    owner: row.instrumentId !== null ? 'instrument' : 'job',
    instrumentId: row.instrumentId,
    jobId: row.jobId,
    originalName: row.originalName,
    caption: row.caption,
    contentType: row.contentType,
    sizeBytes: row.sizeBytes,
    sha256: row.sha256,
    uploadedById: row.uploadedById,
    uploadedByName: row.uploadedByName,
    createdAt: row.createdAt.toISOString(),
    url: `/api/attachments/${row.id}`,
  };
}

/** A file name as the uploader had it, without any path and without control characters. */
function cleanName(name: string): string {
  const cleaned = basename(name.replace(/\\/g, '/'))
    .replace(/[\u0000-\u001f\u007f]/g, '')
    .trim();
  return (cleaned === '' ? 'attachment' : cleaned).slice(0, 255);
}

/**
 * Photos and documents on instruments and jobs. The type is decided from the file's bytes (magic
 * numbers, or UTF-8 text), never from its name or declared type. The upload waits in this node's var/tmp
 * while it is checked, then its bytes go to the file store (MariaDB, which every node reads) in the same
 * transaction as the attachment row; it is only ever served by id, after the same organisation check as the
 * record it belongs to.
 */
@Injectable()
export class AttachmentsService {
  readonly maxBytes = megabytesFromEnv('KC_ATTACHMENT_MAX_MB', DEFAULT_ATTACHMENT_MAX_MB);
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly files: FileStore,
  ) {}

  /** The owner's organisation, if the actor may see the owner; 404 otherwise. */
  private async visibleOwner(actor: AuthUser, owner: AttachmentOwner, id: number): Promise<number> {
    const table = owner === 'instrument' ? 'instruments' : 'jobs';
    const [row] = await this.dataSource.query(`SELECT organization_id FROM ${table} WHERE id = ?`, [id]);
    const scope = organizationScope(actor);
    if (!row || (scope !== null && Number(row.organization_id) !== scope))
      throw new NotFoundException(`${owner === 'instrument' ? 'Instrument' : 'Job'} ${id} not found`);
    return Number(row.organization_id);
  }

  async upload(actor: AuthUser, owner: AttachmentOwner, ownerId: number, req: Request, res: Response): Promise<AttachmentView> {
    await this.visibleOwner(actor, owner, ownerId);
    const upload = await receiveUpload(req, res, { dir: join(this.config.varDir, 'tmp'), maxBytes: this.maxBytes, field: 'file' });
    try {
      const sniffed = sniffContent(await readHead(upload.path));
      const contentType: AttachmentContentType | null = sniffed.contentType;
      if (contentType === null) throw new UnsupportedMediaTypeException(`attachments may be ${ACCEPTED_WORDS}; this file looks like ${sniffed.description}`);
      const caption = upload.fields.caption?.trim() || null;
      if (caption !== null && caption.length > MAX_CAPTION) throw new BadRequestException(`caption must be at most ${MAX_CAPTION} characters`);
      const originalName = cleanName(upload.originalName);
      const id = await this.dataSource.transaction(async (manager) => {
        // The bytes and the row that names them commit together: a failed insert leaves no stored file.
        const stored = await this.files.put('attachment', { path: upload.path }, manager);
        const sha256 = stored.sha256;
        const result = await manager.insert(Attachment, {
          instrumentId: owner === 'instrument' ? ownerId : null,
          jobId: owner === 'job' ? ownerId : null,
          fileId: stored.id,
          originalName,
          caption,
          contentType,
          sizeBytes: stored.sizeBytes,
          sha256,
          uploadedById: actor.id,
        });
        const newId = result.identifiers[0]!.id as number;
        await this.audit.record(
          {
            actorId: actor.id,
            entity: owner,
            entityId: ownerId,
            action: 'attach',
            changes: { attachmentId: newId, originalName, contentType, sizeBytes: stored.sizeBytes, sha256 },
          },
          manager,
        );
        return newId;
      });
      return this.view(id);
    } finally {
      await removeQuietly(upload.path);
    }
  }

  async list(actor: AuthUser, owner: AttachmentOwner, ownerId: number): Promise<ListResponse<AttachmentView>> {
    await this.visibleOwner(actor, owner, ownerId);
    const rows = await this.rows(owner === 'instrument' ? 'a.instrumentId = :ownerId' : 'a.jobId = :ownerId', { ownerId });
    return { items: rows.map(toView), total: rows.length };
  }

  /** Streams the bytes from the file store, part by part, with the type found at upload; 404 when the actor may not see the owner. */
  async serve(actor: AuthUser, id: number, download: boolean, res: Response): Promise<void> {
    const row = await this.visible(actor, id);
    const info = row.fileId !== null ? await this.files.info(row.fileId, 'attachment') : null;
    if (!info) throw new NotFoundException(`the file of attachment ${id} is missing from the store`);
    res.setHeader('Content-Type', row.contentType === 'text/plain' ? 'text/plain; charset=utf-8' : row.contentType);
    res.setHeader('Content-Length', String(info.sizeBytes));
    res.setHeader('Content-Disposition', attachmentDisposition(row.originalName, download ? 'attachment' : 'inline'));
    res.setHeader('Cache-Control', 'private, no-store');
    await pipeline(this.files.stream(info), res).catch((error: unknown) => {
      // A reader that goes away half-way is not a server error; anything before the first byte is.
      if (!res.headersSent) throw error;
    });
  }

  async remove(actor: AuthUser, id: number): Promise<void> {
    const row = await this.visible(actor, id);
    await this.dataSource.transaction(async (manager) => {
      await manager.delete(Attachment, { id });
      if (row.fileId !== null) await this.files.remove(row.fileId, manager);
      await this.audit.record(
        {
          actorId: actor.id,
          entity: row.instrumentId !== null ? 'instrument' : 'job',
          entityId: row.instrumentId ?? row.jobId!,
          action: 'detach',
          changes: { attachmentId: id, originalName: row.originalName, contentType: row.contentType, sizeBytes: row.sizeBytes, sha256: row.sha256 },
        },
        manager,
      );
    });
  }

  private async visible(actor: AuthUser, id: number): Promise<AttachmentRow> {
    const [row] = await this.rows('a.id = :id', { id });
    if (!row) throw new NotFoundException(`Attachment ${id} not found`);
    await this.visibleOwner(actor, row.instrumentId !== null ? 'instrument' : 'job', row.instrumentId ?? row.jobId!).catch(() => {
      throw new NotFoundException(`Attachment ${id} not found`);
    });
    return row;
  }

  private async view(id: number): Promise<AttachmentView> {
    const [row] = await this.rows('a.id = :id', { id });
    return toView(row!);
  }

  private async rows(where: string, parameters: Record<string, unknown>): Promise<AttachmentRow[]> {
    const found = await this.dataSource
      .getRepository(Attachment)
      .createQueryBuilder('a')
      .innerJoinAndSelect('a.uploadedBy', 'u')
      .where(where, parameters)
      .orderBy('a.createdAt', 'DESC')
      .addOrderBy('a.id', 'DESC')
      .getMany();
    return found.map((a) => Object.assign(a, { uploadedByName: a.uploadedBy.name }));
  }
}
