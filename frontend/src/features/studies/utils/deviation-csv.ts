import { DEVIATION_CSV_COLUMNS, STABILITY_DEVIATIONS, STABILITY_DEVIATION_SHORT, type StabilityToolkit } from '@kilocycle/common/types';

/** What the deviations were computed from, in words (the chart, the table and the CSV say the same). */
export function dataWords(toolkit: StabilityToolkit): string {
  const data = toolkit.dataKind === 'phase' ? 'phase data (time interval, s)' : 'frequency data (Hz)';
  const drift = toolkit.drift?.removed ? 'linear frequency drift removed' : 'as recorded (drift kept)';
  const { choice, filled } = toolkit.segment;
  const segment =
    choice === 'longest'
      ? 'longest continuous segment'
      : choice === 'fill'
        ? `gaps filled in phase (${filled} point${filled === 1 ? '' : 's'} filled)`
        : 'every reading as if continuous';
  return `${data}, ${drift}, ${segment}`;
}

const NOISE_METHOD: Record<string, string> = { lag1_acf: 'lag-1 autocorrelation', b1_ratio: 'B1 ratio' };

const cell = (value: string | number) => {
  const text = String(value);
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
};

/** The deviation table as CSV: one line per τ and deviation, every point with its terms, edf and 95 % interval. */
export function deviationCsv(toolkit: StabilityToolkit): string {
  const lines: string[] = [DEVIATION_CSV_COLUMNS.join(',')];
  const data = dataWords(toolkit);
  for (const row of toolkit.deviations) {
    for (const deviation of STABILITY_DEVIATIONS) {
      const value = row[deviation];
      if (!value) continue;
      const noise = row.noise.status === 'identified' ? row.noise.noise : 'too short to identify';
      const method = row.noise.status === 'identified' ? NOISE_METHOD[row.noise.method] : '';
      lines.push(
        [
          row.tau,
          row.m,
          STABILITY_DEVIATION_SHORT[deviation],
          value.deviation,
          value.terms,
          value.edf,
          value.ciLow,
          value.ciHigh,
          noise,
          method ?? '',
          row.edfNoise,
          data,
        ]
          .map(cell)
          .join(','),
      );
    }
  }
  return lines.join('\n') + '\n';
}
