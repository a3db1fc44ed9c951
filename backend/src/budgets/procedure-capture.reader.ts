import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { CAPTURE_DEFAULTS, type CaptureSettings } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { CaptureSettingsSource } from '../shared/capture-settings.js';
import { jsonColumn } from '../shared/json-column.js';

/** A procedure's counter-capture settings as ingest's counter capture reads them (provided as CaptureSettingsSource). */
@Injectable()
export class ProcedureCaptureReader implements CaptureSettingsSource {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The procedure the job uses is picked as JobResultsReader.procedure picks it: its chosen one, else the default, else the first active one. */
  async forJob(jobId: number, manager?: EntityManager): Promise<CaptureSettings> {
    const [row] = (await (manager ?? this.dataSource).query(
      `SELECT p.capture_settle_count, p.capture_tolerance_hz, p.capture_timeout_s, p.dial_marks
         FROM procedures p LEFT JOIN job_procedures jp ON jp.procedure_id = p.id AND jp.job_id = ?
        ORDER BY (jp.job_id IS NOT NULL) DESC, p.is_default DESC, p.active DESC, p.id ASC LIMIT 1`,
      [jobId],
    )) as Array<Record<string, unknown>>;
    if (!row) return CAPTURE_DEFAULTS;
    return {
      captureSettleCount: Number(row.capture_settle_count),
      captureToleranceHz: Number(row.capture_tolerance_hz),
      captureTimeoutS: Number(row.capture_timeout_s),
      dialMarks: jsonColumn<number[]>(row.dial_marks) ?? [],
    };
  }
}
