import { Controller, Get, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser } from '../shared/decorators.js';
import { ExportsService } from './exports.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('exports')
@ApiBearerAuth()
@Controller()
export class ExportsController {
  constructor(private readonly exports: ExportsService) {}

  /** seq, t_s, dial, frequency_hz, aux, source, received_at, excluded, excluded_reason — one line per reading. */
  @ApiProduces('text/csv')
  @Get('runs/:id/readings.csv')
  readings(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Res() res: Response): Promise<void> {
    return this.exports.readings(user, id, res);
  }

  /** One line per calibration run and dial setting (see RESULTS_CSV_COLUMNS). */
  @ApiProduces('text/csv')
  @Get('jobs/:id/results.csv')
  results(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Res() res: Response): Promise<void> {
    return this.exports.results(user, id, res);
  }
}
