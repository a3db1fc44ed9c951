import { roundResultToUncertainty } from '@kilocycle/common/math';
import type { ComparisonDifference, ComparisonEstimate, ComparisonResult } from '@kilocycle/common/types';
import { formatNumber, formatSignificant } from '@/utils/frequency';

/** Colours of the compared runs, in order: distinct on screen and in print, the first (the reference) warm. */
export const RUN_COLORS = ['#c98a1b', '#1f4e55', '#7b3f99', '#2e7d4f', '#b3261e', '#2f6db3'] as const;

export const runColor = (index: number) => RUN_COLORS[index % RUN_COLORS.length]!;

/** Decimals that show a standard error to two significant digits (common's rounding rule, GUM 7.2.6). */
function decimalsFor(se: number): number {
  if (!Number.isFinite(se) || se <= 0) return 2;
  return Math.min(6, Math.max(0, roundResultToUncertainty(0, se).decimals));
}

/** A value in its unit; an Allan deviation (unitless) in significant figures. */
export function formatQuantity(value: number, unit: string, se?: number): string {
  if (unit === '') return formatSignificant(value, 3);
  return `${formatNumber(value, decimalsFor(se ?? Math.abs(value) / 1000))} ${unit}`;
}

export function formatEstimate(estimate: ComparisonEstimate, unit: string): string {
  if (unit === '') return `${formatSignificant(estimate.value, 3)}`;
  const decimals = decimalsFor(estimate.se);
  return `${formatNumber(estimate.value, decimals)} ± ${formatNumber(estimate.se, decimals)} ${unit}`;
}

export function formatInterval(low: number, high: number, unit: string, se?: number): string {
  if (unit === '') return `${formatSignificant(low, 2)} to ${formatSignificant(high, 2)}`;
  const decimals = decimalsFor(se ?? Math.abs(high - low) / 4);
  return `${formatNumber(low, decimals)} to ${formatNumber(high, decimals)} ${unit}`;
}

export function formatDifference(difference: ComparisonDifference, unit: string): string {
  if (unit === '') return formatSignificant(difference.difference, 2);
  const decimals = decimalsFor(difference.se);
  const sign = difference.difference > 0 ? '+' : '';
  return `${sign}${formatNumber(difference.difference, decimals)} ${unit}`;
}

function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  const text = String(value);
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The comparison table as CSV: a line per quantity and run, with each run's difference to the first. */
export function comparisonTableCsv(result: ComparisonResult): string {
  const header = [
    'quantity',
    'unit',
    'run_id',
    'label',
    'value',
    'standard_error',
    'low_95',
    'high_95',
    'difference_to_first',
    'difference_low_95',
    'difference_high_95',
    'statement',
    'note',
  ];
  const lines = [header.join(',')];
  for (const row of result.rows) {
    result.runs.forEach((run, i) => {
      const value = row.values[i];
      const diff = row.differences[i];
      lines.push(
        [
          row.name,
          row.unit,
          run.runId,
          run.label,
          value?.value,
          value?.se,
          value?.low,
          value?.high,
          diff?.difference,
          diff?.low,
          diff?.high,
          diff?.sentence,
          row.problems[i],
        ]
          .map(csvCell)
          .join(','),
      );
    });
  }
  for (const entry of result.sensitivity.supplySensitivity) {
    lines.push(
      ['supply sensitivity', 'Hz/V', entry.runId, entry.jobNumber, entry.hzPerVolt, entry.seHzPerVolt, '', '', '', '', '', '', entry.problem]
        .map(csvCell)
        .join(','),
    );
  }
  for (const entry of result.sensitivity.keying) {
    const s = entry.shift;
    lines.push(
      ['keying shift (key down − key up)', 'Hz', entry.runId, entry.jobNumber, s?.shiftHz, s?.seHz, s?.low, s?.high, '', '', '', '', entry.problem]
        .map(csvCell)
        .join(','),
    );
  }
  return `${lines.join('\r\n')}\r\n`;
}
