import { Controller, Get, NotFoundException, Query, Res, StreamableFile } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { DataSource } from 'typeorm';
import type { ListResponse, MailMessageSummary, MailMessageView } from '@kilocycle/common/types';
import { Roles } from '../shared/decorators.js';
import { likePattern, paginate } from '../shared/paginate.js';
import { ListMailQueryDto } from './dto/mail.dto.js';
import { MailMessage } from './mail-message.entity.js';
import { parseMessage } from './read-message.js';
import { IdParam } from '../shared/id-param.decorator.js';

function toSummary(m: MailMessage): MailMessageSummary {
  return {
    id: m.id,
    kind: m.kind,
    from: m.mailFrom,
    to: m.rcptTo,
    subject: m.subject,
    size: m.size,
    attachmentCount: m.attachmentCount,
    receivedAt: m.receivedAt.toISOString(),
  };
}

const SORTABLE = { id: 'm.id', receivedAt: 'm.receivedAt', subject: 'm.subject', kind: 'm.kind', size: 'm.size' };

/** The admin's outbox: every message the local mail fake captured. */
@ApiTags('mail')
@ApiBearerAuth()
@Roles('admin')
@Controller('mail')
export class MailController {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  @Get()
  list(@Query() query: ListMailQueryDto): Promise<ListResponse<MailMessageSummary>> {
    const qb = this.dataSource
      .getRepository(MailMessage)
      .createQueryBuilder('m')
      .select(['m.id', 'm.kind', 'm.mailFrom', 'm.rcptTo', 'm.subject', 'm.size', 'm.attachmentCount', 'm.receivedAt']);
    if (query.kind) qb.andWhere('m.kind = :kind', { kind: query.kind });
    if (query.q) qb.andWhere('(m.subject LIKE :q OR m.rcpt_to LIKE :q OR m.mail_from LIKE :q)', { q: likePattern(query.q) });
    return paginate(qb, query, SORTABLE, '-id', toSummary);
  }

  @Get(':id')
  async get(@IdParam('id') id: number): Promise<MailMessageView> {
    const m = await this.find(id);
    const parsed = await parseMessage(m.raw);
    return {
      ...toSummary(m),
      messageId: parsed.messageId,
      text: parsed.text,
      html: parsed.html,
      attachments: parsed.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.body.length })),
      headers: parsed.headers,
    };
  }

  /** The message as received (message/rfc822), for a mail program. */
  @Get(':id/raw')
  async raw(@IdParam('id') id: number, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const m = await this.find(id);
    res.set({ 'Content-Type': 'message/rfc822', 'Content-Disposition': `attachment; filename="message-${id}.eml"` });
    return new StreamableFile(Buffer.from(m.raw, 'utf8'));
  }

  /** One attachment, by its position in the list GET /api/mail/:id gives (0 first). */
  @Get(':id/attachments/:index')
  async attachment(@IdParam('id') id: number, @IdParam('index') index: number, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const part = (await parseMessage((await this.find(id)).raw)).attachments[index];
    if (!part) throw new NotFoundException(`Message ${id} has no attachment ${index}`);
    const name = (part.filename ?? `attachment-${index}`).replace(/[^\w.\- ]/g, '_');
    res.set({ 'Content-Type': part.contentType, 'Content-Disposition': `attachment; filename="${name}"` });
    return new StreamableFile(part.body);
  }

  private async find(id: number): Promise<MailMessage> {
    const m = await this.dataSource.getRepository(MailMessage).findOneBy({ id });
    if (!m) throw new NotFoundException(`Message ${id} not found`);
    return m;
  }
}
