import { Body, Controller, Delete, Get, HttpCode, Patch, Post, Query, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { ComparisonResult, InstrumentSensitivity, ListResponse, SavedComparison } from '@kilocycle/common/types';
import { LAB_ROLES, STUDY_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { attachmentDisposition } from '../shared/csv.js';
import { comparisonCsv } from './comparison-csv.js';
import { ComparisonsService } from './comparisons.service.js';
import { ComputeComparisonDto, CreateComparisonDto, ListComparisonsQueryDto, UpdateComparisonDto } from './dto/comparison.dto.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('comparisons')
@ApiBearerAuth()
@Roles(...LAB_ROLES)
@Controller()
export class ComparisonsController {
  constructor(private readonly comparisons: ComparisonsService) {}

  /** The comparison of 2–6 warm-up or stability runs of one instrument, computed now (nothing saved). */
  @HttpCode(200)
  @Post('comparisons/compute')
  compute(@Body() body: ComputeComparisonDto): Promise<ComparisonResult> {
    return this.comparisons.compute(body);
  }

  @Get('comparisons')
  list(@Query() query: ListComparisonsQueryDto): Promise<ListResponse<SavedComparison>> {
    return this.comparisons.list(query);
  }

  @Roles(...STUDY_ROLES)
  @Post('comparisons')
  create(@CurrentUser() user: AuthUser, @Body() body: CreateComparisonDto): Promise<SavedComparison> {
    return this.comparisons.create(user, body);
  }

  @Get('comparisons/:id')
  get(@IdParam('id') id: number): Promise<SavedComparison> {
    return this.comparisons.get(id);
  }

  /** A saved comparison computed now from its runs, labels and options. */
  @Get('comparisons/:id/result')
  async result(@IdParam('id') id: number): Promise<ComparisonResult> {
    return (await this.comparisons.result(id)).result;
  }

  /** The comparison table as CSV (see COMPARISON_CSV_COLUMNS). */
  @ApiProduces('text/csv')
  @Get('comparisons/:id/export.csv')
  async exportCsv(@IdParam('id') id: number, @Res() res: Response): Promise<void> {
    const { saved, result } = await this.comparisons.result(id);
    const slug =
      saved.title
        .toLowerCase()
        .replace(/[^a-z0-9]+/g, '-')
        .replace(/^-|-$/g, '')
        .slice(0, 60) || 'comparison';
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', attachmentDisposition(`comparison-${id}-${slug}.csv`));
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(comparisonCsv(result));
  }

  @Roles(...STUDY_ROLES)
  @Patch('comparisons/:id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateComparisonDto): Promise<SavedComparison> {
    return this.comparisons.update(user, id, body);
  }

  @Roles(...STUDY_ROLES)
  @HttpCode(204)
  @Delete('comparisons/:id')
  remove(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<void> {
    return this.comparisons.remove(user, id);
  }

  /** Supply sensitivity (Hz/V) and keying shift from the instrument's supply_sensitivity and keying runs. */
  @Get('instruments/:id/sensitivity')
  sensitivity(@IdParam('id') id: number): Promise<InstrumentSensitivity> {
    return this.comparisons.sensitivity(id);
  }
}
