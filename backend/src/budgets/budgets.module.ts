import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BudgetsController } from './budgets.controller.js';
import { BudgetsService } from './budgets.service.js';
import { JobProcedure } from './job-procedure.entity.js';
import { ProcedureVersionRow } from './procedure-version.entity.js';
import { Procedure } from './procedure.entity.js';
import { RunBudget } from './run-budget.entity.js';

@Module({
  imports: [TypeOrmModule.forFeature([Procedure, ProcedureVersionRow, JobProcedure, RunBudget])],
  controllers: [BudgetsController],
  providers: [BudgetsService],
  exports: [BudgetsService],
})
export class BudgetsModule {}
