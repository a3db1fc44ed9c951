import type { ComparisonResult } from '@kilocycle/common/types';
import { csvLine } from '../shared/csv.js';

export const COMPARISON_CSV_COLUMNS = [
  'quantity',
  'unit',
  'run_id',
  'label',
  'value',
  'standard_error',
  'df',
  'low_95',
  'high_95',
  'difference_to_first',
  'difference_low_95',
  'difference_high_95',
  'welch_df',
  'statement',
  'note',
] as const;

/** The comparison table as CSV: one line per quantity and run, then the supply-sensitivity and keying runs. */
export function comparisonCsv(result: ComparisonResult): string {
  let text = csvLine(COMPARISON_CSV_COLUMNS);
  for (const row of result.rows) {
    result.runs.forEach((run, i) => {
      const value = row.values[i];
      const diff = row.differences[i];
      text += csvLine([
        row.name,
        row.unit,
        run.runId,
        run.label,
        value?.value,
        value?.se,
        value?.df,
        value?.low,
        value?.high,
        diff?.difference,
        diff?.low,
        diff?.high,
        diff?.df,
        diff?.sentence,
        row.problems[i],
      ]);
    });
  }
  for (const entry of result.sensitivity.supplySensitivity) {
    text += csvLine([
      'supply sensitivity',
      'Hz/V',
      entry.runId,
      `${entry.jobNumber} ${entry.startedAt}`,
      entry.hzPerVolt,
      entry.seHzPerVolt,
      entry.n >= 3 ? entry.n - 2 : null,
      null,
      null,
      null,
      null,
      null,
      null,
      null,
      entry.problem,
    ]);
  }
  for (const entry of result.sensitivity.keying) {
    const s = entry.shift;
    text += csvLine([
      'keying shift (key down − key up)',
      'Hz',
      entry.runId,
      `${entry.jobNumber} ${entry.startedAt}`,
      s?.shiftHz,
      s?.seHz,
      s?.df,
      s?.low,
      s?.high,
      null,
      null,
      null,
      null,
      null,
      entry.problem,
    ]);
  }
  return text;
}
