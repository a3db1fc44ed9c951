import { Body, Controller, Get, Patch, Post, Put, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { JobResults, ListResponse, Procedure, RunBudget } from '@kilocycle/common/types';
import { BUDGET_ROLES, LAB_ROLES, MANAGER_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { BudgetsService } from './budgets.service.js';
import { CreateProcedureDto, ListProceduresQueryDto, SetJobProcedureDto, UpdateProcedureDto, UpdateRunBudgetDto } from './dto/budget.dto.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('budgets')
@ApiBearerAuth()
@Controller()
export class BudgetsController {
  constructor(private readonly budgets: BudgetsService) {}

  @Roles(...LAB_ROLES)
  @Get('procedures')
  listProcedures(@Query() query: ListProceduresQueryDto): Promise<ListResponse<Procedure>> {
    return this.budgets.listProcedures(query);
  }

  @Roles(...LAB_ROLES)
  @Get('procedures/:id')
  getProcedure(@IdParam('id') id: number): Promise<Procedure> {
    return this.budgets.getProcedure(id);
  }

  @Roles(...MANAGER_ROLES)
  @Post('procedures')
  createProcedure(@CurrentUser() user: AuthUser, @Body() body: CreateProcedureDto): Promise<Procedure> {
    return this.budgets.createProcedure(user, body);
  }

  @Roles(...MANAGER_ROLES)
  @Patch('procedures/:id')
  updateProcedure(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateProcedureDto): Promise<Procedure> {
    return this.budgets.updateProcedure(user, id, body);
  }

  @Roles(...LAB_ROLES)
  @Get('jobs/:id/procedure')
  jobProcedure(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Procedure> {
    return this.budgets.jobProcedure(user, id);
  }

  @Roles(...BUDGET_ROLES)
  @Put('jobs/:id/procedure')
  setJobProcedure(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: SetJobProcedureDto): Promise<Procedure> {
    return this.budgets.setJobProcedure(user, id, body.procedureId);
  }

  @Roles(...LAB_ROLES)
  @Get('runs/:id/budget')
  runBudget(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<RunBudget> {
    return this.budgets.runBudget(user, id);
  }

  @Roles(...BUDGET_ROLES)
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
