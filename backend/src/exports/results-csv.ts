import type { EntityManager } from 'typeorm';
import { analyseCalibration, MetrologyError } from '@kilocycle/common/math';
import { RESULTS_CSV_COLUMNS, type DialLaw, type RunKind, type Tolerance } from '@kilocycle/common/types';
import { csvLine } from '../shared/csv.js';
import { jsonColumn } from '../shared/json-column.js';


/**
 * A job's results as CSV: per calibration run (as-found, as-left) and dial setting, the nominal, the mean
 * of the included readings, n, SD, the error in Hz, ppm and %, the tolerance and the outlier flag, by
 * common's analyseCalibration on the range's dial law and tolerance. Pure reads: the signing transaction
 * stores its output with the signed record.
 */
export async function resultsCsv(manager: EntityManager, jobId: number, jobNumber: string): Promise<string> {
  const job = { number: jobNumber };
  const query = (sql: string, values: unknown[]) => manager.query(sql, values);
  const runs: Array<Record<string, unknown>> = await query(
    `SELECT r.id, r.kind, g.label, g.dial_unit, g.dial_law, g.tolerance
       FROM runs r JOIN instrument_ranges g ON g.id = r.range_id
      WHERE r.job_id = ? AND r.kind IN ('as_found', 'as_left') ORDER BY g.position, r.started_at, r.id`,
    [jobId],
  );
  let body = csvLine(RESULTS_CSV_COLUMNS);
  for (const run of runs) {
    const readings: Array<{ dial: number | null; frequency_hz: number; excluded: number }> = await query(
      `SELECT r.dial, r.frequency_hz, (x.reading_id IS NOT NULL) AS excluded
         FROM readings r LEFT JOIN reading_exclusions x ON x.reading_id = r.id WHERE r.run_id = ? ORDER BY r.seq`,
      [run.id],
    );
    const base = [job.number, Number(run.id), run.kind as RunKind, run.label, null, run.dial_unit];
    const usable = readings.filter((r) => r.dial !== null).map((r) => ({ dial: Number(r.dial), frequency: Number(r.frequency_hz), excluded: Number(r.excluded) === 1 }));
    if (usable.filter((r) => !r.excluded).length === 0) {
      body += csvLine([...base, null, null, 0, null, null, null, null, null, null, 'no included readings with a dial setting']);
      continue;
    }
    try {
      const analysis = analyseCalibration({ law: jsonColumn<DialLaw>(run.dial_law), tolerance: jsonColumn<Tolerance>(run.tolerance), readings: usable });
      for (const p of analysis.points) {
        body += csvLine([
          job.number, Number(run.id), run.kind, run.label, p.dial, run.dial_unit, p.nominal, p.measured, p.n, p.sd,
          p.errorHz, p.errorPpm, p.errorPercent, p.toleranceHz, p.outlier, null,
        ]);
      }
    } catch (error) {
      if (!(error instanceof MetrologyError)) throw error;
      body += csvLine([...base, null, null, usable.length, null, null, null, null, null, null, error.message]);
    }
  }
  return body;
}
