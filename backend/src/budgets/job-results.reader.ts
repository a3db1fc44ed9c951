import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DecisionRule, ExtraComponent, RunKind, StandardReference } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { CaptureResultsReader } from '../ingest/capture-results.reader.js';
import { RangeResultsReader, type ResultsRange } from '../instruments/range-results.reader.js';
import { JobResultsJobReader, type JobHead } from '../jobs/job-results.reader.js';
import { ReadingResultsReader, type ResultsReading } from '../readings/reading-results.reader.js';
import { RunResultsReader } from '../runs/run-results.reader.js';
import { StandardResultsReader } from '../standards/standard-results.reader.js';
import { jsonColumn } from '../shared/json-column.js';

export type ProcedureFigures = {
  id: number;
  /** The procedure's version these figures are (open jobs use the newest). */
  version: number;
  name: string;
  method: string;
  decisionRule: DecisionRule;
  dialHalfDivisionPercentOfSpan: number;
  driftPpm: number;
  driftHz: number;
  extraComponents: ExtraComponent[];
};

export type RunOverrides = {
  dialHalfDivision: number | null;
  driftPpm: number | null;
  driftHz: number | null;
  counterResolutionHz: number | null;
  extraComponents: ExtraComponent[] | null;
};

export type CalibrationRunRow = {
  id: number;
  kind: RunKind;
  rangeId: number;
  startedAt: Date;
  standard: StandardReference | null;
  /** The version of the standard's row read here (the newest: the job is open). */
  standardVersion: number | null;
  standardOverrideReason: string | null;
  overrides: RunOverrides | null;
};

/** Everything a job's results are computed from, read in one go (pure reads: safe inside the signing transaction). */
export type JobResultsInput = {
  job: JobHead;
  procedure: ProcedureFigures;
  runs: CalibrationRunRow[];
  ranges: ResultsRange[];
  readings: ResultsReading[];
  /** Counter-assisted settings: the id of the reading holding the mean → the counter readings behind it, in sequence. */
  counterSamples: Map<number, number[]>;
};

/**
 * The read model of a job's results: budgets' own tables (procedures, job_procedures, run_budgets) by SQL,
 * the job, its runs, their standards, the instrument's ranges, the readings and the counter captures through
 * their owners' readers, all on the caller's manager when one is given.
 */
@Injectable()
export class JobResultsReader {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobResultsJobReader,
    private readonly runs: RunResultsReader,
    private readonly standards: StandardResultsReader,
    private readonly ranges: RangeResultsReader,
    private readonly readings: ReadingResultsReader,
    private readonly captures: CaptureResultsReader,
  ) {}

  /** The reader with its owners' readers over one data source, for code run outside Nest (the demo seed). */
  static over(dataSource: DataSource): JobResultsReader {
    return new JobResultsReader(
      dataSource,
      new JobResultsJobReader(dataSource),
      new RunResultsReader(dataSource),
      new StandardResultsReader(dataSource),
      new RangeResultsReader(dataSource),
      new ReadingResultsReader(dataSource),
      new CaptureResultsReader(dataSource),
    );
  }

  async load(jobId: number, manager?: EntityManager): Promise<JobResultsInput> {
    const job = await this.jobs.head(jobId, manager);
    if (!job) throw new Error(`job ${jobId} not found`);
    const procedure = await this.procedure(jobId, manager);
    const runs = await this.calibrationRuns(jobId, manager);
    const ranges = await this.ranges.ranges(job.instrumentId, manager);
    const runIds = runs.map((r) => r.id);
    const readings = await this.readings.readings(runIds, manager);
    const counterSamples = await this.counterSamples(runIds, manager);
    return { job, procedure, runs, ranges, readings, counterSamples };
  }

  /** The procedure a job uses: its chosen one, else the default, else the first active one. */
  async procedure(jobId: number, manager?: EntityManager): Promise<ProcedureFigures> {
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT p.* FROM procedures p LEFT JOIN job_procedures jp ON jp.procedure_id = p.id AND jp.job_id = ?
        ORDER BY (jp.job_id IS NOT NULL) DESC, p.is_default DESC, p.active DESC, p.id ASC LIMIT 1`,
      [jobId],
    );
    const row = rows[0];
    if (!row) throw new Error('no calibration procedure is defined; a lead must create one first');
    return {
      id: Number(row.id),
      version: Number(row.version),
      name: String(row.name),
      method: String(row.method),
      decisionRule: row.decision_rule as DecisionRule,
      dialHalfDivisionPercentOfSpan: Number(row.dial_half_division_pct),
      driftPpm: Number(row.drift_ppm),
      driftHz: Number(row.drift_hz),
      extraComponents: jsonColumn<ExtraComponent[]>(row.extra_components) ?? [],
    };
  }

  /** The job's as-found and as-left runs with their standards and budget overrides. */
  private async calibrationRuns(jobId: number, manager?: EntityManager): Promise<CalibrationRunRow[]> {
    const runs = await this.runs.calibrationRuns(jobId, manager);
    const standards = await this.standards.references(
      runs.flatMap((r) => (r.standardId === null ? [] : [r.standardId])),
      manager,
    );
    const overrides = await this.overrides(
      runs.map((r) => r.id),
      manager,
    );
    return runs.map((run) => {
      const standard = run.standardId === null ? undefined : standards.get(run.standardId);
      return {
        id: run.id,
        kind: run.kind,
        rangeId: run.rangeId,
        startedAt: run.startedAt,
        standardOverrideReason: run.standardOverrideReason,
        standardVersion: standard ? standard.version : null,
        standard: standard ? standard.reference : null,
        overrides: overrides.get(run.id) ?? null,
      };
    });
  }

  private async overrides(runIds: readonly number[], manager?: EntityManager): Promise<Map<number, RunOverrides>> {
    if (runIds.length === 0) return new Map();
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      'SELECT run_id, dial_half_division, drift_ppm, drift_hz, counter_resolution_hz, extra_components FROM run_budgets WHERE run_id IN (?)',
      [runIds],
    );
    const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
    return new Map(
      rows.map((row) => [
        Number(row.run_id),
        {
          dialHalfDivision: num(row.dial_half_division),
          driftPpm: num(row.drift_ppm),
          driftHz: num(row.drift_hz),
          counterResolutionHz: num(row.counter_resolution_hz),
          extraComponents: row.extra_components === null ? null : jsonColumn<ExtraComponent[]>(row.extra_components),
        },
      ]),
    );
  }

  /**
   * A setting taken with the counter's help is one reading (the mean) linked to the counter readings behind
   * it: the budget's repeatability takes their spread (s/√n over those n), not that of the one mean.
   */
  private async counterSamples(runIds: readonly number[], manager?: EntityManager): Promise<Map<number, number[]>> {
    const links = await this.captures.samples(runIds, manager);
    const frequencies = await this.readings.frequencies([...new Set(links.map((l) => l.sampleReadingId))], manager);
    const meanOf = new Map<number, number[]>();
    for (const link of links) meanOf.set(link.sampleReadingId, [...(meanOf.get(link.sampleReadingId) ?? []), link.readingId]);
    const samples = new Map<number, number[]>();
    // In the samples' sequence order, as they were read.
    for (const { id, frequency } of frequencies) {
      for (const readingId of meanOf.get(id) ?? []) samples.set(readingId, [...(samples.get(readingId) ?? []), frequency]);
    }
    return samples;
  }
}
