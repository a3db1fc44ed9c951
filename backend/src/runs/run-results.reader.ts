import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { RunKind } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';

/** An as-found or as-left run as a job's results read it. */
export type CalibrationRunHead = {
  id: number;
  kind: RunKind;
  rangeId: number;
  startedAt: Date;
  standardId: number | null;
  standardOverrideReason: string | null;
};

/** A run as a job's review lists it. */
export type ReviewRunRow = {
  id: number;
  kind: RunKind;
  rangeId: number;
  status: string;
  standardId: number | null;
  standardOverrideReason: string | null;
  createdBy: number;
  startedAt: Date;
  endedAt: Date | null;
  /** The run's counters, kept by the readings write path. */
  readingCount: number;
  excludedCount: number;
};

/** Runs as job results, reviews and certificates read them (inside the caller's transaction when a manager is given). */
@Injectable()
export class RunResultsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The job's as-found and as-left runs, oldest first. */
  async calibrationRuns(jobId: number, manager?: EntityManager): Promise<CalibrationRunHead[]> {
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT id, kind, range_id, started_at, standard_id, standard_override_reason
         FROM runs WHERE job_id = ? AND kind IN ('as_found', 'as_left') ORDER BY started_at, id`,
      [jobId],
    );
    return rows.map((row) => ({
      id: Number(row.id),
      kind: row.kind as RunKind,
      rangeId: Number(row.range_id),
      startedAt: new Date(row.started_at as string),
      standardId: row.standard_id === null ? null : Number(row.standard_id),
      standardOverrideReason: (row.standard_override_reason as string | null) ?? null,
    }));
  }

  /** The calendar days each run began and ended (an open run: the day it began) and its supply voltage, for a certificate's dates. */
  async calibrationDays(runIds: readonly number[], manager?: EntityManager): Promise<Array<{ started: string; ended: string; supplyVoltage: number | null }>> {
    if (runIds.length === 0) return [];
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT DATE_FORMAT(started_at, '%Y-%m-%d') AS started, DATE_FORMAT(COALESCE(ended_at, started_at), '%Y-%m-%d') AS ended, supply_voltage
         FROM runs WHERE id IN (?)`,
      [runIds],
    );
    return rows.map((row) => ({
      started: String(row.started),
      ended: String(row.ended),
      supplyVoltage: row.supply_voltage === null ? null : Number(row.supply_voltage),
    }));
  }

  /** Every run of the job, oldest first, as the job's review lists them. */
  async jobRuns(jobId: number, manager?: EntityManager): Promise<ReviewRunRow[]> {
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT id, kind, range_id, status, standard_id, standard_override_reason, created_by, started_at, ended_at, reading_count, excluded_count
         FROM runs WHERE job_id = ? ORDER BY started_at, id`,
      [jobId],
    );
    return rows.map((row) => ({
      id: Number(row.id),
      kind: row.kind as RunKind,
      rangeId: Number(row.range_id),
      status: String(row.status),
      standardId: row.standard_id === null ? null : Number(row.standard_id),
      standardOverrideReason: (row.standard_override_reason as string | null) ?? null,
      createdBy: Number(row.created_by),
      startedAt: new Date(row.started_at as string),
      endedAt: row.ended_at === null ? null : new Date(row.ended_at as string),
      readingCount: Number(row.reading_count),
      excludedCount: Number(row.excluded_count),
    }));
  }
}
