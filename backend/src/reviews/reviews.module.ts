import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { SignInThrottleModule } from '../auth/sign-in-throttle.module.js';
import { BudgetsModule } from '../budgets/budgets.module.js';
import { CertificatesModule } from '../certificates/certificates.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { InstrumentsModule } from '../instruments/instruments.module.js';
import { StandardsModule } from '../standards/standards.module.js';
import { JobReview } from './job-review.entity.js';
import { ReviewsController } from './reviews.controller.js';
import { ReviewsService } from './reviews.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([JobReview]), CertificatesModule, SignInThrottleModule, BudgetsModule, RunsModule, InstrumentsModule, StandardsModule],
  controllers: [ReviewsController],
  providers: [ReviewsService],
})
export class ReviewsModule {}
