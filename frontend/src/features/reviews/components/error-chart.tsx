import { LineChart } from '@mui/x-charts/LineChart';
import type { RangeResult } from '@kilocycle/common/types';
import { FREQUENCY_UNIT_HZ } from '@kilocycle/common/units';
import { formatNumber } from '@/utils/frequency';
import { rangeUnit } from '../utils/results-format';

type ErrorChartProps = { range: RangeResult; height?: number };

/** Error against setting for one range: as found, as left, and the tolerance limits either side. */
export function ErrorChart({ range, height = 260 }: ErrorChartProps) {
  const unit = rangeUnit(range);
  const scale = FREQUENCY_UNIT_HZ[unit];
  const x = range.points.map((p) => p.nominal / scale);
  const hasAsFound = range.points.some((p) => p.asFound);
  const hasAsLeft = range.points.some((p) => p.asLeft);
  const series = [
    ...(hasAsFound
      ? [{ id: 'as-found', label: 'As found', data: range.points.map((p) => p.asFound?.errorHz ?? null), color: '#c98a1b', connectNulls: true, curve: 'linear' as const }]
      : []),
    ...(hasAsLeft
      ? [{ id: 'as-left', label: 'As left', data: range.points.map((p) => p.asLeft?.errorHz ?? null), color: '#1f4e55', connectNulls: true, curve: 'linear' as const }]
      : []),
    { id: 'tol-high', label: 'Tolerance', data: range.points.map((p) => p.toleranceHz), color: '#b3261e', showMark: false, curve: 'linear' as const },
    { id: 'tol-low', data: range.points.map((p) => -p.toleranceHz), color: '#b3261e', showMark: false, curve: 'linear' as const },
  ];
  return (
    <LineChart
      height={height}
     
      xAxis={[
        {
          data: x,
          scaleType: 'linear',
          label: `Nominal (${unit})`,
          height: 50,
          valueFormatter: (v: number) => formatNumber(v, unit === 'Hz' ? 0 : 3),
        },
      ]}
      yAxis={[{ label: 'Error (Hz)', width: 84, valueFormatter: (v: number) => formatNumber(v, 0) }]}
      series={series}
      grid={{ horizontal: true }}
      margin={{ right: 24 }}
      sx={{ '& path[data-series="tol-high"], & path[data-series="tol-low"]': { strokeDasharray: '5 4', strokeWidth: 1.5 } }}
      slotProps={{ legend: { position: { vertical: 'top', horizontal: 'end' } } }}
    />
  );
}
