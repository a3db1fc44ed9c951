import { Body, Controller, Get, HttpCode, Post, UseInterceptors } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { CertificateDetail, JobReview } from '@kilocycle/common/types';
import { BENCH_ROLES, LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { RetryAfterInterceptor } from '../shared/too-many-attempts.js';
import { ReturnJobDto, SignJobDto, SubmitJobDto } from './dto/review.dto.js';
import { ReviewsService } from './reviews.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('reviews')
@ApiBearerAuth()
@Controller()
export class ReviewsController {
  constructor(private readonly reviews: ReviewsService) {}

  @Roles(...LAB_ROLES)
  @Get('reviews/:jobId')
  review(@CurrentUser() user: AuthUser, @IdParam('jobId') jobId: number): Promise<JobReview> {
    return this.reviews.review(user, jobId);
  }

  @Roles(...BENCH_ROLES)
  @Post('jobs/:id/submit')
  @HttpCode(200)
  submit(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: SubmitJobDto): Promise<JobReview> {
    return this.reviews.submit(user, id, body.comment ?? null);
  }

  @Roles('lead')
  @Post('jobs/:id/return')
  @HttpCode(200)
  returnJob(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: ReturnJobDto): Promise<JobReview> {
    return this.reviews.returnJob(user, id, body.comment);
  }

  @Roles('lead')
  @Post('jobs/:id/sign')
  @HttpCode(200)
  @UseInterceptors(RetryAfterInterceptor)
  sign(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: SignJobDto): Promise<CertificateDetail> {
    return this.reviews.sign(user, id, body.password, body.meaning);
  }
}
