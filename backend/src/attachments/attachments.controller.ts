import { Controller, Delete, Get, HttpCode, Post, Query, Req, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiConsumes, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { Attachment as AttachmentView, ListResponse } from '@kilocycle/common/types';
import { BENCH_ROLES, MANAGER_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { AttachmentsService } from './attachments.service.js';
import { ServeAttachmentQueryDto } from './dto/attachment.dto.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('attachments')
@ApiBearerAuth()
@Controller()
export class AttachmentsController {
  constructor(private readonly attachments: AttachmentsService) {}

  /** Multipart: field `file`, optional field `caption`. */
  @Roles(...BENCH_ROLES)
  @ApiConsumes('multipart/form-data')
  @Post('instruments/:id/attachments')
  attachToInstrument(
    @CurrentUser() user: AuthUser,
    @IdParam('id') id: number,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<AttachmentView> {
    return this.attachments.upload(user, 'instrument', id, req, res);
  }

  @Roles(...BENCH_ROLES)
  @ApiConsumes('multipart/form-data')
  @Post('jobs/:id/attachments')
  attachToJob(
    @CurrentUser() user: AuthUser,
    @IdParam('id') id: number,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<AttachmentView> {
    return this.attachments.upload(user, 'job', id, req, res);
  }

  @Get('instruments/:id/attachments')
  listForInstrument(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<ListResponse<AttachmentView>> {
    return this.attachments.list(user, 'instrument', id);
  }

  @Get('jobs/:id/attachments')
  listForJob(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<ListResponse<AttachmentView>> {
    return this.attachments.list(user, 'job', id);
  }

  /** The bytes, with the type found at upload; ?download=true to save instead of show. */
  @Get('attachments/:id')
  serve(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Query() query: ServeAttachmentQueryDto, @Res() res: Response): Promise<void> {
    return this.attachments.serve(user, id, query.download === true, res);
  }

  @Roles(...MANAGER_ROLES)
  @HttpCode(204)
  @Delete('attachments/:id')
  remove(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<void> {
    return this.attachments.remove(user, id);
  }
}
