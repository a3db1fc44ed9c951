import { Body, Controller, Get, Patch, Post, Put, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { JobResults, ListResponse, Procedure, RunBudget } from '@kilocycle/common/types';
import type { AuthUser } from '../auth/auth-user.js';
import { CurrentUser, Roles } from '../auth/decorators.js';
import { BudgetsService } from './budgets.service.js';
import { CreateProcedureDto, ListProceduresQueryDto, SetJobProcedureDto, UpdateProcedureDto, UpdateRunBudgetDto } from './dto/budget.dto.js';
import { IdParam } from '../shared/id-param.decorator.js';

const LAB = ['admin', 'lead', 'technician', 'engineer'] as const;

@ApiTags('budgets')
@ApiBearerAuth()
@Controller()
export class BudgetsController {
  constructor(private readonly budgets: BudgetsService) {}

  @Roles(...LAB)
  @Get('procedures')
  listProcedures(@Query() query: ListProceduresQueryDto): Promise<ListResponse<Procedure>> {
    return this.budgets.listProcedures(query);
  }

  @Roles(...LAB)
  @Get('procedures/:id')
  getProcedure(@IdParam('id') id: number): Promise<Procedure> {
    return this.budgets.getProcedure(id);
  }

  @Roles('lead', 'admin')
  @Post('procedures')
  createProcedure(@CurrentUser() user: AuthUser, @Body() body: CreateProcedureDto): Promise<Procedure> {
    return this.budgets.createProcedure(user, body);
  }

  @Roles('lead', 'admin')
  @Patch('procedures/:id')
  updateProcedure(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateProcedureDto): Promise<Procedure> {
    return this.budgets.updateProcedure(user, id, body);
  }

  @Roles(...LAB)
  @Get('jobs/:id/procedure')
  jobProcedure(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Procedure> {
    return this.budgets.jobProcedure(user, id);
  }

  @Roles('lead', 'technician')
  @Put('jobs/:id/procedure')
  setJobProcedure(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: SetJobProcedureDto): Promise<Procedure> {
    return this.budgets.setJobProcedure(user, id, body.procedureId);
  }

  @Roles(...LAB)
  @Get('runs/:id/budget')
  runBudget(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<RunBudget> {
    return this.budgets.runBudget(user, id);
  }

  @Roles('lead', 'technician')
  @Put('runs/:id/budget')
  updateRunBudget(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateRunBudgetDto): Promise<RunBudget> {
    return this.budgets.updateRunBudget(user, id, body);
  }

  /** Any signed-in user; a client only for its own organisation's jobs. */
  @Get('jobs/:id/results')
  results(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<JobResults> {
    return this.budgets.results(user, id);
  }
}
