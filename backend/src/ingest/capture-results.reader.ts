import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';

/** Counter captures as job results read them (inside the signing transaction when a manager is given). */
@Injectable()
export class CaptureResultsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /**
   * For each counter-assisted setting of these runs: the reading that holds the mean, and the ids of the
   * counter readings behind it. The readings' values come from readings' reader.
   */
  async samples(runIds: readonly number[], manager?: EntityManager): Promise<Array<{ readingId: number; sampleReadingId: number }>> {
    if (runIds.length === 0) return [];
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT c.reading_id, cs.reading_id AS sample_id FROM counter_captures c
         JOIN counter_capture_samples cs ON cs.capture_id = c.id
        WHERE c.run_id IN (?)`,
      [runIds],
    );
    return rows.map((r) => ({ readingId: Number(r.reading_id), sampleReadingId: Number(r.sample_id) }));
  }
}
