import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { JobResults } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { SignedResultsSource } from '../shared/signed-results.js';
import { loadSignedRecord } from './signed-record.js';

/** A signed job's results from its newest signed certificate (see loadSignedRecord), provided as SignedResultsSource. */
@Injectable()
export class SignedResultsReader extends SignedResultsSource {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {
    super();
  }

  async signedResults(jobId: number, manager?: EntityManager): Promise<JobResults | null> {
    return (await loadSignedRecord(manager ?? this.dataSource.manager, jobId))?.results ?? null;
  }
}
