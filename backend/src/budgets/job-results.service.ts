import { Injectable } from '@nestjs/common';
import type { JobResults } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { assembleJobResults } from './job-results.js';
import { JobResultsReader, type ProcedureFigures } from './job-results.reader.js';

export type { ProcedureFigures, RunOverrides } from './job-results.reader.js';
export { decisionRuleText, effectiveFigures, worstDecision } from './job-results.js';

/**
 * A job's results: load (JobResultsReader, one read model) → compute and assemble (job-results.ts, with
 * common's math). Reads only, on the caller's manager when given: safe inside the signing transaction.
 */
@Injectable()
export class JobResultsService {
  constructor(private readonly reader: JobResultsReader) {}

  /** The service over one data source, for code run outside Nest (the demo seed). */
  static over(dataSource: DataSource): JobResultsService {
    return new JobResultsService(JobResultsReader.over(dataSource));
  }

  async compute(jobId: number, manager?: EntityManager): Promise<JobResults> {
    return assembleJobResults(await this.reader.load(jobId, manager));
  }

  /** The procedure a job uses: its chosen one, else the default, else the first active one. */
  procedure(jobId: number, manager?: EntityManager): Promise<ProcedureFigures> {
    return this.reader.procedure(jobId, manager);
  }
}
