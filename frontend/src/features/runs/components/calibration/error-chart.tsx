import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useTheme } from '@mui/material/styles';
import { ChartsAxis } from '@mui/x-charts/ChartsAxis';
import { ChartsDataProvider } from '@mui/x-charts/ChartsDataProvider';
import { ChartsGrid } from '@mui/x-charts/ChartsGrid';
import { ChartsLegend } from '@mui/x-charts/ChartsLegend';
import { ChartsReferenceLine } from '@mui/x-charts/ChartsReferenceLine';
import { ChartsSurface } from '@mui/x-charts/ChartsSurface';
import { ChartsTooltip } from '@mui/x-charts/ChartsTooltip';
import { ChartsWrapper } from '@mui/x-charts/ChartsWrapper';
import { AreaPlot, LinePlot, lineClasses } from '@mui/x-charts/LineChart';
import { ScatterPlot } from '@mui/x-charts/ScatterChart';
import { useMemo, useState } from 'react';
import type { CalibrationRunAnalysis } from '@kilocycle/common/types';
import { MONO_FONT } from '@/lib/theme';
import { yAxisWidth } from '@/utils/chart-layout';
import { formatNumber } from '@/utils/frequency';

export type ErrorUnit = 'hz' | 'percent';

type ErrorChartProps = {
  analysis: CalibrationRunAnalysis;
  /** Charts animate by default; screenshots and tests turn it off. */
  skipAnimation?: boolean;
  height?: number;
};

const tickStyle = { fontFamily: MONO_FONT, fontSize: 11 };

/**
 * Error against dial setting: the averaged points (outliers marked), the best-fit line and the tolerance
 * band, in Hz or in % of setting.
 */
export function ErrorChart({ analysis, skipAnimation, height = 320 }: ErrorChartProps) {
  const theme = useTheme();
  const [unit, setUnit] = useState<ErrorUnit>('hz');
  const { points, fit, range } = analysis;

  const data = useMemo(() => {
    const sorted = [...points].sort((a, b) => a.dial - b.dial);
    const toUnit = (hz: number, nominal: number) => (unit === 'hz' ? hz : (hz / nominal) * 100);
    const xs = sorted.map((p) => p.dial);
    const tol = sorted.map((p) => (p.toleranceHz === null ? null : toUnit(p.toleranceHz, p.nominal)));
    return {
      xs,
      fitLine: fit ? sorted.map((p) => toUnit(fit.offsetHz + fit.slope * p.nominal, p.nominal)) : null,
      tolLow: tol.map((t) => (t === null ? null : -t)),
      tolWidth: tol.map((t) => (t === null ? null : 2 * t)),
      inliers: sorted.filter((p) => !p.outlier).map((p) => ({ id: `p${p.dial}`, x: p.dial, y: toUnit(p.errorHz, p.nominal) })),
      outliers: sorted.filter((p) => p.outlier).map((p) => ({ id: `o${p.dial}`, x: p.dial, y: toUnit(p.errorHz, p.nominal) })),
      hasTolerance: tol.some((t) => t !== null),
    };
  }, [points, fit, unit]);

  const unitLabel = unit === 'hz' ? 'Hz' : '%';
  const decimals = unit === 'hz' ? 1 : 4;
  const format = (v: number | null) => (v === null ? '' : `${formatNumber(v, decimals, true)} ${unitLabel}`);
  const dialLabel = `Dial setting (${range.dialUnit})`;
  const tickFormat = (v: number) => formatNumber(v, unit === 'hz' ? 0 : 3);
  // Room for the widest tick label the plotted values bring (an outlier of −9 400 Hz prints "-10 000").
  const plotted = [
    ...data.inliers.map((p) => p.y),
    ...data.outliers.map((p) => p.y),
    ...(data.fitLine ?? []),
    ...data.tolLow.flatMap((t) => (t === null ? [] : [t, -t])),
  ];
  const yWidth = yAxisWidth(plotted, tickFormat, { fontSize: tickStyle.fontSize, min: 64 });

  const series = [
    ...(data.hasTolerance
      ? [
          {
            type: 'line' as const,
            id: 'tol-low',
            label: 'Tolerance',
            data: data.tolLow,
            stack: 'tolerance',
            color: theme.palette.warning.main,
            showMark: false,
            disableHighlight: true,
            valueFormatter: format,
          },
          {
            type: 'line' as const,
            id: 'tol-band',
            data: data.tolWidth,
            stack: 'tolerance',
            area: true,
            color: theme.palette.warning.main,
            showMark: false,
            disableHighlight: true,
            valueFormatter: (v: number | null) => (v === null ? '' : `band ±${formatNumber(v / 2, decimals)} ${unitLabel}`),
          },
        ]
      : []),
    ...(data.fitLine
      ? [
          {
            type: 'line' as const,
            id: 'fit',
            label: 'Best-fit line',
            data: data.fitLine,
            color: theme.palette.primary.light,
            showMark: false,
            valueFormatter: format,
          },
        ]
      : []),
    {
      type: 'scatter' as const,
      id: 'points',
      label: 'Error at setting (mean)',
      data: data.inliers,
      color: theme.palette.primary.dark,
      markerSize: 5,
      valueFormatter: (v: { x: number; y: number } | null) => (v ? `dial ${v.x}: ${format(v.y)}` : ''),
    },
    ...(data.outliers.length > 0
      ? [
          {
            type: 'scatter' as const,
            id: 'outliers',
            label: 'Outlier (studentised > 3)',
            data: data.outliers,
            color: theme.palette.error.main,
            markerSize: 7,
            valueFormatter: (v: { x: number; y: number } | null) => (v ? `dial ${v.x}: ${format(v.y)} — outlier` : ''),
          },
        ]
      : []),
  ];

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, mb: 1, flexWrap: 'wrap' }}>
        <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
          Error against setting
        </Typography>
        <ToggleButtonGroup exclusive size="small" value={unit} onChange={(_e, v: ErrorUnit | null) => v && setUnit(v)} aria-label="Error unit">
          <ToggleButton value="hz">Hz</ToggleButton>
          <ToggleButton value="percent">% of setting</ToggleButton>
        </ToggleButtonGroup>
      </Box>
      {points.length === 0 ? (
        <Box sx={{ height, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>The chart fills in as readings are saved.</Box>
      ) : (
        <Box role="img" aria-label={`Error against dial setting, ${points.length} settings`} data-testid="error-chart">
          <ChartsDataProvider
            height={height}
            series={series}
            skipAnimation={skipAnimation}
            margin={{ top: 8, right: 28, bottom: 8, left: 8 }}
            xAxis={[
              {
                id: 'dial',
                scaleType: 'linear',
                data: data.xs,
                label: dialLabel,
                height: 50,
                tickNumber: 6,
                tickLabelStyle: tickStyle,
                valueFormatter: (v: number) => formatNumber(v, Number.isInteger(v) ? 0 : 2),
              },
            ]}
            yAxis={[
              {
                id: 'error',
                label: `Error (${unitLabel})`,
                width: yWidth,
                tickLabelStyle: tickStyle,
                valueFormatter: tickFormat,
              },
            ]}
          >
            <ChartsWrapper legendPosition={{ vertical: 'top', horizontal: 'end' }}>
              <ChartsLegend />
              <ChartsSurface
                sx={{
                  [`& .${lineClasses.area}`]: { fillOpacity: 0.14 },
                  '& path[data-series="tol-low"], & path[data-series="tol-band"]': { strokeDasharray: '5 4', strokeWidth: 1.25 },
                }}
              >
                <ChartsGrid horizontal vertical />
                <AreaPlot />
                <LinePlot />
                <ChartsReferenceLine y={0} lineStyle={{ stroke: theme.palette.text.secondary, strokeDasharray: '2 3' }} />
                <ScatterPlot />
                <ChartsAxis />
              </ChartsSurface>
              <ChartsTooltip trigger="item" />
            </ChartsWrapper>
          </ChartsDataProvider>
        </Box>
      )}
    </Paper>
  );
}
