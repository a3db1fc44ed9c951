import Typography from '@mui/material/Typography';
import { LineChart } from '@mui/x-charts/LineChart';
import { useMemo } from 'react';
import type { ComparisonResult } from '@kilocycle/common/types';
import { ConfidenceBars } from '@/components/charts/confidence-bars';
import { formatSignificant } from '@/utils/frequency';
import { formatAxisNumber, logTicks } from '@/utils/log-axis';
import { runColor } from '../utils/comparison-format';
import { ChartPanel } from './chart-panel';

/**
 * Overlapping Allan deviation of each run's settled part, on one log-log plot, each point with its 95 %
 * interval drawn as an error bar (an SVG layer on the chart's own scales: x-charts has no error-bar series).
 */
export function AdevChart({ result, fileTitle }: { result: ComparisonResult; fileTitle: string }) {
  const { x, series, bars, yMin, yMax } = useMemo(() => {
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
    const bars = result.runs.map((run) => (run.stability?.adev ?? []).filter((p) => p.deviation > 0).map((p) => ({ x: p.tau, low: p.ciLow, high: p.ciHigh })));
    // The y range holds every interval, not only the points, so that no bar is cut at the plot's edge.
    const ys = bars
      .flat()
      .flatMap((b) => [b.low, b.high])
      .concat(built.flatMap((s) => s.data.filter((v): v is number => v !== null)));
    const positive = ys.filter((v) => v > 0 && Number.isFinite(v));
    const yMin = positive.length ? Math.min(...positive) / 1.2 : undefined;
    const yMax = positive.length ? Math.max(...positive) * 1.2 : undefined;
    return { x: xs, series: built, bars, yMin, yMax };
  }, [result]);
  const xTicks = x.length ? logTicks(x[0]!, x[x.length - 1]!, 7) : [];
  const yTicks = yMin !== undefined && yMax !== undefined ? logTicks(yMin, yMax, 7) : [];
  const legend = result.runs.map((run, i) => ({ label: run.label, color: runColor(i) }));
  const missing = result.runs.filter((r) => !r.stability);

  return (
    <ChartPanel
      title="Allan deviation"
      fileTitle={fileTitle}
      legend={legend}
      note="Overlapping Allan deviation σ_y(τ) of the settled part of each run, at octave averaging times; the bars are the 95 % intervals."
    >
      {series.length === 0 ? (
        <Typography color="text.secondary" sx={{ py: 4, textAlign: 'center' }}>
          No run has a settled part long enough for an Allan deviation.
        </Typography>
      ) : (
        <LineChart
          height={340}
          hideLegend
          xAxis={[
            {
              data: x,
              scaleType: 'log',
              label: 'Averaging time τ (s)',
              height: 50,
              tickInterval: xTicks.length >= 2 ? xTicks : 'auto',
              valueFormatter: (v: number) => formatAxisNumber(v),
            },
          ]}
          yAxis={[
            {
              scaleType: 'log',
              label: 'σ_y(τ)',
              width: 84,
              min: yMin,
              max: yMax,
              tickInterval: yTicks.length >= 2 ? yTicks : 'auto',
              valueFormatter: (v: number, context) => (context.location === 'tick' ? formatAxisNumber(v) : formatSignificant(v, 3)),
            },
          ]}
          series={series}
          grid={{ horizontal: true, vertical: true }}
          margin={{ right: 20 }}
        >
          {bars.map((runBars, i) => (
            <ConfidenceBars key={result.runs[i]!.runId} testId={`adev-bars-${result.runs[i]!.runId}`} bars={runBars} color={runColor(i)} />
          ))}
        </LineChart>
      )}
      {result.runs
        .filter((run) => run.stability && run.stability.leftOut > 0)
        .map((run) => (
          <Typography key={`segment-${run.runId}`} variant="caption" color="text.secondary" component="p" data-testid={`adev-segment-${run.runId}`}>
            {run.label}: the longest continuous segment, {run.stability!.count} readings from {formatAxisNumber(run.stability!.fromSeconds)} s to{' '}
            {formatAxisNumber(run.stability!.toSeconds)} s; {run.stability!.leftOut} beyond its {run.stability!.gapCount} gap
            {run.stability!.gapCount === 1 ? '' : 's'} left out
          </Typography>
        ))}
      {missing.map((run) => (
        <Typography key={run.runId} variant="caption" color="text.secondary" component="p">
          {run.label}: {run.stabilityProblem ?? 'no Allan deviation'}
        </Typography>
      ))}
    </ChartPanel>
  );
}
