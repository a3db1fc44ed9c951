import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import { LineChart } from '@mui/x-charts/LineChart';
import { useMemo, useState } from 'react';
import type { ComparisonResult } from '@kilocycle/common/types';
import { formatNumber } from '@/utils/frequency';
import { runColor } from '../utils/comparison-format';
import type { LegendEntry } from '../utils/chart-export';
import { ChartPanel } from './chart-panel';

type Mode = 'deviation' | 'frequency';

// Curves of different runs are sampled at different times: they share one axis of every time any of
// them has, each curve left empty (and bridged) where it has no point.
function buildSeries(result: ComparisonResult, mode: Mode) {
  const times = new Set<number>();
  for (const run of result.runs) {
    run.points.t.forEach((t) => times.add(t));
    run.fitted?.t.forEach((t) => times.add(t));
  }
  const x = [...times].sort((a, b) => a - b);
  const index = new Map(x.map((t, i) => [t, i]));
  const series = result.runs.flatMap((run, i) => {
    const color = runColor(i);
    const readings: Array<number | null> = new Array<number | null>(x.length).fill(null);
    const values = mode === 'deviation' ? run.points.deviation : run.points.frequency;
    run.points.t.forEach((t, k) => {
      readings[index.get(t)!] = values[k] ?? null;
    });
    const out = [{ id: `readings-${run.runId}`, label: run.label, data: readings, color, showMark: false, connectNulls: true, curve: 'linear' as const }];
    if (run.fitted) {
      const fitted: Array<number | null> = new Array<number | null>(x.length).fill(null);
      const fittedValues = mode === 'deviation' ? run.fitted.deviation : run.fitted.frequency;
      run.fitted.t.forEach((t, k) => {
        fitted[index.get(t)!] = fittedValues[k] ?? null;
      });
      out.push({ id: `fit-${run.runId}`, label: `${run.label} (fit)`, data: fitted, color, showMark: false, connectNulls: true, curve: 'linear' as const });
    }
    return out;
  });
  return { x: x.map((t) => t / 60), series };
}

/** The warm-up curves overlaid from power-on, readings and fitted model, as offset from f∞ or as frequency. */
export function DriftChart({ result, fileTitle }: { result: ComparisonResult; fileTitle: string }) {
  const [mode, setMode] = useState<Mode>('deviation');
  const { x, series } = useMemo(() => buildSeries(result, mode), [result, mode]);
  const legend: LegendEntry[] = result.runs.flatMap((run, i) => [
    { label: run.label, color: runColor(i) },
    ...(run.fitted ? [{ label: `${run.label}: fit`, color: runColor(i), dashed: true }] : []),
  ]);
  const referenceWords = result.runs.every((r) => r.reference.kind === 'f_inf') ? 'its settled frequency f∞' : 'its f∞ (or the mean, where there is no fit)';
  return (
    <ChartPanel
      title="Drift from power-on"
      fileTitle={fileTitle}
      legend={legend}
      note={
        mode === 'deviation'
          ? `Each run as the offset from ${referenceWords}, so the curves share a zero; readings solid, fitted f∞ + A·e^(−t/τ) dashed.`
          : 'Each run’s frequency as measured; readings solid, fitted f∞ + A·e^(−t/τ) dashed.'
      }
      actions={
        <ToggleButtonGroup size="small" exclusive value={mode} onChange={(_e, value: Mode | null) => value && setMode(value)} aria-label="Drift plot shows">
          <ToggleButton value="deviation">Offset from f∞</ToggleButton>
          <ToggleButton value="frequency">Frequency</ToggleButton>
        </ToggleButtonGroup>
      }
    >
      <LineChart
        height={340}
        hideLegend
        xAxis={[{ data: x, scaleType: 'linear', label: 'Time since power-on (min)', height: 50, valueFormatter: (v: number) => formatNumber(v, 0) }]}
        yAxis={[
          {
            label: mode === 'deviation' ? 'Offset from f∞ (Hz)' : 'Frequency (Hz)',
            width: mode === 'deviation' ? 70 : 96,
            valueFormatter: (v: number) => formatNumber(v, 0),
          },
        ]}
        series={series}
        grid={{ horizontal: true, vertical: true }}
        margin={{ right: 20 }}
        sx={{
          '& path[data-series^="readings-"]': { strokeWidth: 1.2, strokeOpacity: 0.7 },
          '& path[data-series^="fit-"]': { strokeWidth: 2.5, strokeDasharray: '7 4' },
        }}
      />
    </ChartPanel>
  );
}
