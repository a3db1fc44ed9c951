import { Body, Controller, Delete, Get, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { CaptureState, CounterCapture } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { IdParam } from '../shared/id-param.decorator.js';
import { CounterCaptureService } from './counter-capture.service.js';
import { StartCaptureDto } from './dto/start-capture.dto.js';

/** Counter-assisted capture on a run: the setting waiting for the counter (one at a time per run). */
@ApiTags('readings')
@ApiBearerAuth()
@Controller('runs/:runId/capture')
export class CapturesController {
  constructor(private readonly captures: CounterCaptureService) {}

  @Roles(...LAB_ROLES)
  @Get()
  current(@CurrentUser() user: AuthUser, @IdParam('runId') runId: number): Promise<CaptureState> {
    return this.captures.current(user, runId);
  }

  @Roles(...LAB_ROLES)
  @Post()
  start(@CurrentUser() user: AuthUser, @IdParam('runId') runId: number, @Body() body: StartCaptureDto): Promise<CounterCapture> {
    return this.captures.start(user, runId, body.dial);
  }

  @Roles(...LAB_ROLES)
  @Delete()
  abandon(@CurrentUser() user: AuthUser, @IdParam('runId') runId: number): Promise<CounterCapture> {
    return this.captures.abandon(user, runId);
  }
}
