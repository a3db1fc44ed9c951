import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import type { JobStatus, RangeSpan, RunDataKind, RunKind, RunStatus } from '@kilocycle/common/types';

/** What the readings write path needs to know about a run; loaded in one query. */
export type RunWriteContext = {
  runId: number;
  jobId: number;
  kind: RunKind;
  /** What the readings hold: frequency (Hz) or phase (time interval, s). */
  dataKind: RunDataKind;
  status: RunStatus;
  jobStatus: JobStatus;
  benchId: number | null;
  organizationId: number;
  dialMin: number;
  dialMax: number;
  /** The range's nominal frequency span: readings far outside it are refused unless confirmed. */
  freqMinHz: number;
  freqMaxHz: number;
  startedAt: Date;
};

/** A run's reading counters as the write path keeps them (runs.reading_count, excluded_count, last_seq). */
export type RunCounters = { readingCount: number; excludedCount: number; lastSeq: number };

/** A run's place: whose it is and which job it belongs to (for scope checks and file names). */
export type RunScope = { runId: number; organizationId: number; jobNumber: string; dataKind: RunDataKind };

/**
 * A run as the modules that record into it (readings, ingest, imports, live, exports) need it, read by the
 * module that owns the runs table; the job and the range come from their owners' readers (jobs, instruments).
 * The write context is loaded for every batch a bench sends (`npm run bench:ingest` measures that path): three
 * owner calls instead of one joined query showed no difference beyond the machine's noise there (2026-12-04,
 * alternating runs, 20-bench ratio 0.65 / 0.48 / 0.59 split against 0.67 / 0.62 / 0.50 / 0.66 joined).
 */
@Injectable()
export class RunContextReader {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobScopeReader,
    private readonly ranges: RangeResultsReader,
  ) {}

  /** The run with its job's status and owner and its range's spans, or null when there is no such run. */
  async writeContext(runId: number, manager?: EntityManager): Promise<RunWriteContext | null> {
    const [run] = await (manager ?? this.dataSource).query(
      'SELECT id, job_id, range_id, kind, data_kind, status, bench_id, started_at FROM runs WHERE id = ?',
      [runId],
    );
    if (!run) return null;
    const [job, range] = await Promise.all([this.jobs.scope(Number(run.job_id), manager), this.ranges.range(Number(run.range_id), manager)]);
    if (!job || !range) return null;
    return {
      runId: Number(run.id),
      jobId: job.id,
      kind: run.kind as RunKind,
      dataKind: run.data_kind as RunDataKind,
      status: run.status as RunStatus,
      jobStatus: job.status,
      benchId: run.bench_id === null ? null : Number(run.bench_id),
      organizationId: job.organizationId,
      dialMin: range.dialMin,
      dialMax: range.dialMax,
      freqMinHz: range.freqMinHz,
      freqMaxHz: range.freqMaxHz,
      startedAt: new Date(run.started_at),
    };
  }

  /** Which job and range the run belongs to, or null (in the caller's transaction when a manager is given). */
  async place(runId: number, manager?: EntityManager): Promise<{ jobId: number; rangeId: number } | null> {
    const [row] = await (manager ?? this.dataSource).query('SELECT job_id, range_id FROM runs WHERE id = ?', [runId]);
    return row ? { jobId: Number(row.job_id), rangeId: Number(row.range_id) } : null;
  }

  /** One run's reading counters as the write path keeps them (no lock), or null when there is no such run. */
  async counters(runId: number, manager?: EntityManager): Promise<RunCounters | null> {
    const [row] = await (manager ?? this.dataSource).query('SELECT reading_count, excluded_count, last_seq FROM runs WHERE id = ?', [runId]);
    return row ? { readingCount: Number(row.reading_count), excludedCount: Number(row.excluded_count), lastSeq: Number(row.last_seq) } : null;
  }

  /** Locks the run and its job (FOR UPDATE, run first) and reads both statuses, in the caller's transaction; null when there is no such run. */
  async lockStatus(runId: number, manager: EntityManager): Promise<{ status: RunStatus; jobStatus: JobStatus } | null> {
    const [run] = await manager.query('SELECT status, job_id FROM runs WHERE id = ? FOR UPDATE', [runId]);
    if (!run) return null;
    const job = await this.jobs.scope(Number(run.job_id), manager, true);
    return job ? { status: run.status as RunStatus, jobStatus: job.status } : null;
  }

  /** The range a bench attaches to, as the attach acknowledgement states it (read through instruments, which owns ranges). */
  async range(runId: number): Promise<RangeSpan | null> {
    const place = await this.place(runId);
    const range = place ? await this.ranges.range(place.rangeId) : null;
    if (!range) return null;
    const { label, dialUnit, dialMin, dialMax, freqMinHz, freqMaxHz } = range;
    return { label, dialUnit, dialMin, dialMax, freqMinHz, freqMaxHz };
  }

  async scope(runId: number): Promise<RunScope | null> {
    const [run] = await this.dataSource.query('SELECT id, job_id, data_kind FROM runs WHERE id = ?', [runId]);
    const job = run ? await this.jobs.scope(Number(run.job_id)) : null;
    return job ? { runId: Number(run.id), organizationId: job.organizationId, jobNumber: job.number, dataKind: run.data_kind as RunDataKind } : null;
  }

  /** The newest calibration runs (as-found, as-left) on a range, newest first: at most `limit` ids. */
  async latestCalibrationRunIds(rangeId: number, limit: number): Promise<number[]> {
    const rows: Array<{ id: number }> = await this.dataSource.query(
      "SELECT id FROM runs WHERE range_id = ? AND kind IN ('as_found', 'as_left') ORDER BY started_at DESC, id DESC LIMIT ?",
      [rangeId, limit],
    );
    return rows.map((row) => Number(row.id));
  }
}
