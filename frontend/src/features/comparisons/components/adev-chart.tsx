import Typography from '@mui/material/Typography';
import { LineChart } from '@mui/x-charts/LineChart';
import { useMemo } from 'react';
import type { ComparisonResult } from '@kilocycle/common/types';
import { formatSignificant } from '@/utils/frequency';
import { formatCompact } from '@/utils/measurement';
import { runColor } from '../utils/comparison-format';
import { ChartPanel } from './chart-panel';

// A log axis gets a tick at every 1…9 of each decade; only 1, 2 and 5 are labelled, or the labels run into each other.
function decadeLabel(value: number, format: (v: number) => string): string {
  const mantissa = Math.round(value / 10 ** Math.floor(Math.log10(value) + 1e-9));
  return mantissa === 1 || mantissa === 2 || mantissa === 5 ? format(value) : '';
}

/** Overlapping Allan deviation of each run's settled part, on one log-log plot. */
export function AdevChart({ result, fileTitle }: { result: ComparisonResult; fileTitle: string }) {
  const { x, series } = useMemo(() => {
    const taus = new Set<number>();
    for (const run of result.runs) run.stability?.adev.forEach((p) => taus.add(p.tau));
    const xs = [...taus].sort((a, b) => a - b);
    const index = new Map(xs.map((t, i) => [t, i]));
    const built = result.runs
      .map((run, i) => {
        if (!run.stability) return null;
        const data: Array<number | null> = new Array<number | null>(xs.length).fill(null);
        run.stability.adev.forEach((p) => {
          data[index.get(p.tau)!] = p.deviation;
        });
        return { id: `adev-${run.runId}`, label: run.label, data, color: runColor(i), connectNulls: true, curve: 'linear' as const, showMark: true };
      })
      .filter((s) => s !== null);
    return { x: xs, series: built };
  }, [result]);
  const legend = result.runs.map((run, i) => ({ label: run.label, color: runColor(i) }));
  const missing = result.runs.filter((r) => !r.stability);

  return (
    <ChartPanel
      title="Allan deviation"
      fileTitle={fileTitle}
      legend={legend}
      note="Overlapping Allan deviation σ_y(τ) of the settled part of each run, at octave averaging times; the table gives 95 % intervals."
    >
      {series.length === 0 ? (
        <Typography color="text.secondary" sx={{ py: 4, textAlign: 'center' }}>
          No run has a settled part long enough for an Allan deviation.
        </Typography>
      ) : (
        <LineChart
          height={340}
          hideLegend
          xAxis={[{ data: x, scaleType: 'log', label: 'Averaging time τ (s)', height: 50, valueFormatter: (v: number, context) => (context.location === 'tick' ? decadeLabel(v, (t) => formatCompact(t, 3)) : formatCompact(v, 3)) }]}
          yAxis={[{ scaleType: 'log', label: 'σ_y(τ)', width: 84, valueFormatter: (v: number, context) => (context.location === 'tick' ? decadeLabel(v, (d) => formatSignificant(d, 1)) : formatSignificant(v, 3)) }]}
          series={series}
          grid={{ horizontal: true, vertical: true }}
          margin={{ right: 20 }}
        />
      )}
      {missing.map((run) => (
        <Typography key={run.runId} variant="caption" color="text.secondary" component="p">
          {run.label}: {run.stabilityProblem ?? 'no Allan deviation'}
        </Typography>
      ))}
    </ChartPanel>
  );
}
