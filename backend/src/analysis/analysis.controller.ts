import { Controller, Get, Query, UseFilters } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { BandPlanResponse, RunAnalysis } from '@kilocycle/common/types';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser } from '../shared/decorators.js';
import { BandPlanQueryDto } from '../instruments/dto/instrument.dto.js';
import { AnalysisService } from './analysis.service.js';
import { BandPlanService } from './band-plan.service.js';
import { RunAnalysisQueryDto } from './dto/analysis-query.dto.js';
import { MetrologyErrorFilter } from './metrology-error.filter.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('analysis')
@ApiBearerAuth()
@UseFilters(MetrologyErrorFilter)
@Controller()
export class AnalysisController {
  constructor(
    private readonly analysis: AnalysisService,
    private readonly bandPlan: BandPlanService,
  ) {}

  @Get('runs/:id/analysis')
  analyse(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Query() query: RunAnalysisQueryDto): Promise<RunAnalysis> {
    return this.analysis.analyse(user, id, query);
  }

  @Get('instruments/:id/band-plan')
  plan(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Query() query: BandPlanQueryDto): Promise<BandPlanResponse> {
    return this.bandPlan.plan(user, id, query.region ?? 2, query.wantedHz);
  }
}
