import type { EntityManager } from 'typeorm';
import { analyseCalibration, MetrologyError } from '@kilocycle/common/math';
import { RESULTS_CSV_COLUMNS, type InstrumentRange, type RunKind } from '@kilocycle/common/types';
import { csvLine } from './csv.js';

/** One calibration run as the results CSV lists it: its range's dial law and tolerance, and its readings in sequence. */
export type ResultsCsvRun = {
  id: number;
  kind: RunKind;
  range: Pick<InstrumentRange, 'label' | 'dialUnit' | 'dialLaw' | 'tolerance'>;
  readings: Array<{ dial: number | null; frequency: number; excluded: boolean }>;
};

/**
 * A job's results as CSV: per calibration run (as-found, as-left) and dial setting, the nominal, the mean
 * of the included readings, n, SD, the error in Hz, ppm and %, the tolerance and the outlier flag, by
 * common's analyseCalibration on the range's dial law and tolerance. Pure: the runs come in the order listed.
 */
export function resultsCsvText(jobNumber: string, runs: readonly ResultsCsvRun[]): string {
  let body = csvLine(RESULTS_CSV_COLUMNS);
  for (const run of runs) {
    const base = [jobNumber, run.id, run.kind, run.range.label, null, run.range.dialUnit];
    const usable = run.readings.filter((r) => r.dial !== null).map((r) => ({ dial: Number(r.dial), frequency: r.frequency, excluded: r.excluded }));
    if (usable.filter((r) => !r.excluded).length === 0) {
      body += csvLine([...base, null, null, 0, null, null, null, null, null, null, 'no included readings with a dial setting']);
      continue;
    }
    try {
      const analysis = analyseCalibration({ law: run.range.dialLaw, tolerance: run.range.tolerance, readings: usable });
      for (const p of analysis.points) {
        body += csvLine([
          jobNumber,
          run.id,
          run.kind,
          run.range.label,
          p.dial,
          run.range.dialUnit,
          p.nominal,
          p.measured,
          p.n,
          p.sd,
          p.errorHz,
          p.errorPpm,
          p.errorPercent,
          p.toleranceHz,
          p.outlier,
          null,
        ]);
      }
    } catch (error) {
      if (!(error instanceof MetrologyError)) throw error;
      body += csvLine([...base, null, null, usable.length, null, null, null, null, null, null, error.message]);
    }
  }
  return body;
}

/**
 * Where the results CSV's rows come from: the owners' readers (runs' RunResultsReader, instruments'
 * RangeResultsReader, readings' ReadingResultsReader), in the caller's transaction when a manager is given.
 * Declared by shape here so that both the certificates module (the signed record keeps the CSV) and the
 * exports module (the download) build it without importing each other.
 */
export type ResultsCsvSources = {
  runs: { calibrationRuns(jobId: number, manager?: EntityManager): Promise<Array<{ id: number; kind: RunKind; rangeId: number }>> };
  ranges: { ranges(instrumentId: number, manager?: EntityManager): Promise<Array<ResultsCsvRun['range'] & { id: number }>> };
  readings: {
    readings(
      runIds: readonly number[],
      manager?: EntityManager,
    ): Promise<Array<{ runId: number; dial: number | null; frequency: number; excludedReason: string | null }>>;
  };
};

/** The job's results CSV (resultsCsvText) over its as-found and as-left runs, by range order, start and id. */
export async function resultsCsv(
  sources: ResultsCsvSources,
  job: { id: number; number: string; instrumentId: number },
  manager?: EntityManager,
): Promise<string> {
  const [runs, ranges] = await Promise.all([sources.runs.calibrationRuns(job.id, manager), sources.ranges.ranges(job.instrumentId, manager)]);
  const position = new Map(ranges.map((g, i) => [g.id, i]));
  // Oldest first from the reader; a stable sort by the range's position keeps that order within a range.
  const listed = runs.filter((r) => position.has(r.rangeId)).sort((a, b) => position.get(a.rangeId)! - position.get(b.rangeId)!);
  const readings = await sources.readings.readings(
    listed.map((r) => r.id),
    manager,
  );
  return resultsCsvText(
    job.number,
    listed.map((r) => ({
      id: r.id,
      kind: r.kind,
      range: ranges[position.get(r.rangeId)!]!,
      readings: readings.filter((x) => x.runId === r.id).map((x) => ({ dial: x.dial, frequency: x.frequency, excluded: x.excludedReason !== null })),
    })),
  );
}
