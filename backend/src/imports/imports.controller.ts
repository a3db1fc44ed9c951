import { Controller, Get, Param, Post, Query, Req, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiConsumes, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { ImportProgress, ImportReport } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { ImportQueryDto } from './dto/import-query.dto.js';
import { ImportProgressService } from './import-progress.service.js';
import { ImportsService } from './imports.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('imports')
@ApiBearerAuth()
@Controller()
export class ImportsController {
  constructor(
    private readonly imports: ImportsService,
    private readonly progress: ImportProgressService,
  ) {}

  /** Multipart field `file` (.csv or .tsv), optional field `mapping`; see ImportReport for the answer. */
  @Roles(...LAB_ROLES)
  @ApiConsumes('multipart/form-data')
  @Post('runs/:id/imports')
  import(
    @CurrentUser() user: AuthUser,
    @IdParam('id') id: number,
    @Query() query: ImportQueryDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<ImportReport> {
    return this.imports.import(user, id, query, req, res);
  }

  /** The import's state now, for a page opened or reloaded mid-import (the live socket pushes every change: LIVE_EVENTS.importProgress). */
  @Roles(...LAB_ROLES)
  @Get('imports/:importId/progress')
  getProgress(@CurrentUser() user: AuthUser, @Param('importId') importId: string): Promise<ImportProgress> {
    return this.progress.get(importId, user.id);
  }
}
