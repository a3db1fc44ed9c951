import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { JobReviewEvents, type JobReviewEvent } from '../shared/job-review-events.js';
import { JobReview } from './job-review.entity.js';

/** Writes a job's review events for other modules (see JobReviewEvents, which it provides). */
@Injectable()
export class JobReviewEventsWriter extends JobReviewEvents {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {
    super();
  }

  async record(event: JobReviewEvent, manager?: EntityManager): Promise<void> {
    const { jobId, action, actorId, comment, at } = event;
    await (manager ?? this.dataSource.manager).insert(JobReview, { jobId, action, actorId, comment, ...(at ? { at } : {}) });
  }
}
