import { LineChart } from '@mui/x-charts/LineChart';
import type { RangeResult } from '@kilocycle/common/types';
import { FREQUENCY_UNIT_HZ } from '@kilocycle/common/units';
import { textWidth, yAxisWidth } from '@/utils/chart-layout';
import { formatNumber } from '@/utils/frequency';
import { formatAxisNumber } from '@/utils/log-axis';
import { rangeUnit } from '../utils/results-format';

type ErrorChartProps = { range: RangeResult; height?: number };

/** The charts' default tick font: 12 px, proportional. */
const TICK_FONT_PX = 12;

/** Error against setting for one range: as found and as left (each measured setting marked), and the tolerance limits either side. */
export function ErrorChart({ range, height = 260 }: ErrorChartProps) {
  const unit = rangeUnit(range);
  const scale = FREQUENCY_UNIT_HZ[unit];
  const x = range.points.map((p) => p.nominal / scale);
  const hasAsFound = range.points.some((p) => p.asFound);
  const hasAsLeft = range.points.some((p) => p.asLeft);
  const series = [
    ...(hasAsFound
      ? [
          {
            id: 'as-found',
            label: 'As found',
            data: range.points.map((p) => p.asFound?.errorHz ?? null),
            color: '#c98a1b',
            connectNulls: true,
            curve: 'linear' as const,
            showMark: true,
          },
        ]
      : []),
    ...(hasAsLeft
      ? [
          {
            id: 'as-left',
            label: 'As left',
            data: range.points.map((p) => p.asLeft?.errorHz ?? null),
            color: '#1f4e55',
            connectNulls: true,
            curve: 'linear' as const,
            showMark: true,
          },
        ]
      : []),
    { id: 'tol-high', label: 'Tolerance', data: range.points.map((p) => p.toleranceHz), color: '#b3261e', showMark: false, curve: 'linear' as const },
    { id: 'tol-low', data: range.points.map((p) => -p.toleranceHz), color: '#b3261e', showMark: false, curve: 'linear' as const },
  ];
  // Nominal ticks without padding zeros ("1 750", "7.25"); the last one is centred on the plot's right edge,
  // so the right margin takes half the widest label or it is cut.
  const formatNominal = (v: number) => formatAxisNumber(v, 6);
  const xEdges = x.length ? [Math.min(...x), Math.max(...x)] : [];
  const rightMargin = Math.max(24, Math.ceil(Math.max(0, ...xEdges.map((v) => textWidth(formatNominal(v), TICK_FONT_PX, false))) / 2) + 8);
  const errors = series.flatMap((s): number[] => (s.data as ReadonlyArray<number | null>).filter((v): v is number => v !== null));
  const yWidth = yAxisWidth(errors, (v) => formatNumber(v, 0), { fontSize: TICK_FONT_PX, monospace: false, min: 64 });
  return (
    <LineChart
      height={height}

      xAxis={[
        {
          data: x,
          scaleType: 'linear',
          label: `Nominal (${unit})`,
          height: 50,
          valueFormatter: formatNominal,
        },
      ]}
      yAxis={[{ label: 'Error (Hz)', width: yWidth, valueFormatter: (v: number) => formatNumber(v, 0) }]}
      series={series}
      grid={{ horizontal: true }}
      margin={{ right: rightMargin }}
      sx={{ '& path[data-series="tol-high"], & path[data-series="tol-low"]': { strokeDasharray: '5 4', strokeWidth: 1.5 } }}
      slotProps={{ legend: { position: { vertical: 'top', horizontal: 'end' } } }}
    />
  );
}
