import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { SignInThrottleModule } from '../auth/sign-in-throttle.module.js';
import { BudgetsModule } from '../budgets/budgets.module.js';
import { CertificatesModule } from '../certificates/certificates.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { StandardsModule } from '../standards/standards.module.js';
import { JobReviewEvents } from '../shared/job-review-events.js';
import { JobReview } from './job-review.entity.js';
import { JobReviewEventsWriter } from './job-review-events.writer.js';
import { ReviewsController } from './reviews.controller.js';
import { ReviewsService } from './reviews.service.js';

/**
 * Global so that certificates can inject JobReviewEvents (declared in shared/, provided here) without importing
 * this module: reviews depends on certificates to sign, never the other way.
 */
@Global()
@Module({
  imports: [
    TypeOrmModule.forFeature([JobReview]),
    CertificatesModule,
    SignInThrottleModule,
    BudgetsModule,
    RunsModule,
    InstrumentsModule,
    StandardsModule,
    JobsModule,
    OrganizationsModule,
  ],
  controllers: [ReviewsController],
  providers: [ReviewsService, JobReviewEventsWriter, { provide: JobReviewEvents, useExisting: JobReviewEventsWriter }],
  exports: [JobReviewEvents],
})
export class ReviewsModule {}
