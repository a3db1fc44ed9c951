import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { RunDataKind, RunKind } from '@kilocycle/common/types';
import type { DataSource } from 'typeorm';

/** A run as a comparison of runs describes it. */
export type ComparedRunRow = {
  id: number;
  kind: RunKind;
  dataKind: RunDataKind;
  jobId: number;
  rangeId: number;
  startedAt: Date;
  endedAt: Date | null;
  configuration: string | null;
  notes: string | null;
  supplyVoltage: number | null;
};

/** Runs as comparisons read them. */
@Injectable()
export class RunComparisonReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** These runs (ids not found are absent), in no particular order. */
  async runs(ids: readonly number[]): Promise<ComparedRunRow[]> {
    if (ids.length === 0) return [];
    return this.select('WHERE id IN (?)', [ids]);
  }

  /** The runs of these kinds on these jobs, newest first. */
  async ofJobs(jobIds: readonly number[], kinds: readonly RunKind[]): Promise<ComparedRunRow[]> {
    if (jobIds.length === 0 || kinds.length === 0) return [];
    return this.select('WHERE job_id IN (?) AND kind IN (?) ORDER BY started_at DESC, id DESC', [jobIds, kinds]);
  }

  private async select(where: string, parameters: unknown[]): Promise<ComparedRunRow[]> {
    const rows: Array<Record<string, unknown>> = await this.dataSource.query(
      `SELECT id, kind, data_kind, job_id, range_id, started_at, ended_at, configuration, notes, supply_voltage FROM runs ${where}`,
      parameters,
    );
    return rows.map((row) => ({
      id: Number(row.id),
      kind: row.kind as RunKind,
      dataKind: row.data_kind as RunDataKind,
      jobId: Number(row.job_id),
      rangeId: Number(row.range_id),
      startedAt: new Date(row.started_at as string),
      endedAt: row.ended_at === null ? null : new Date(row.ended_at as string),
      configuration: (row.configuration as string | null) ?? null,
      notes: (row.notes as string | null) ?? null,
      supplyVoltage: row.supply_voltage === null ? null : Number(row.supply_voltage),
    }));
  }
}
