import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { JobStatus } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { dateOnly } from '../shared/dto-helpers.js';
import { Job } from './job.entity.js';

/** A job as its review, submission, return and signing read it. */
export type ReviewedJob = {
  id: number;
  number: string;
  status: JobStatus;
  organizationId: number;
  instrumentId: number;
  technicianId: number | null;
  /** YYYY-MM-DD */
  receivedDate: string;
  conditionReceived: string | null;
  ambientTempC: number | null;
  humidityPct: number | null;
};

const toReviewed = (j: Job): ReviewedJob => ({
  id: j.id,
  number: j.number,
  status: j.status,
  organizationId: j.organizationId,
  instrumentId: j.instrumentId,
  technicianId: j.technicianId,
  receivedDate: dateOnly(j.receivedDate)!,
  conditionReceived: j.conditionReceived,
  ambientTempC: j.ambientTempC,
  humidityPct: j.humidityPct,
});

/** Jobs for the reviews module (inside the caller's transaction when a manager is given). */
@Injectable()
export class ReviewJobsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The job, or null; with `lock` its row is locked (FOR UPDATE) until the caller's transaction ends. */
  async job(jobId: number, manager?: EntityManager, lock = false): Promise<ReviewedJob | null> {
    const found = await (manager ?? this.dataSource.manager).findOne(Job, {
      where: { id: jobId },
      ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
    });
    return found ? toReviewed(found) : null;
  }
}
