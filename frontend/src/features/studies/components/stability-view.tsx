import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useTheme } from '@mui/material/styles';
import { ChartsAxis } from '@mui/x-charts/ChartsAxis';
import { ChartsDataProvider } from '@mui/x-charts/ChartsDataProvider';
import { ChartsGrid } from '@mui/x-charts/ChartsGrid';
import { ChartsLegend } from '@mui/x-charts/ChartsLegend';
import { ChartsSurface } from '@mui/x-charts/ChartsSurface';
import { ChartsTooltip } from '@mui/x-charts/ChartsTooltip';
import { ChartsWrapper } from '@mui/x-charts/ChartsWrapper';
import { LinePlot, MarkPlot } from '@mui/x-charts/LineChart';
import type { StabilityRunAnalysis } from '@kilocycle/common/types';
import { ConfidenceBars } from '@/components/charts/confidence-bars';
import { Num } from '@/components/ui/num';
import { MONO_FONT } from '@/lib/theme';
import { formatDuration, formatHzTo, formatNumber } from '@/utils/frequency';
import { formatAxisNumber, logTicks } from '@/utils/log-axis';
import { formatCount } from '@/utils/measurement';
import { Figure, Figures } from './figures';

const tickStyle = { fontFamily: MONO_FONT, fontSize: 11 };

/** 1.23×10⁻¹¹ */
export function formatDeviation(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  // toExponential rounds mantissa and exponent together: 9.999e-10 reads 1.00×10⁻⁹, never 10.00×10⁻¹⁰.
  const [mantissa = '', exponent = ''] = value.toExponential(digits - 1).split('e');
  const superscript = exponent.replace('+', '').replace(/[-0-9]/g, (c) => '⁻⁰¹²³⁴⁵⁶⁷⁸⁹'['-0123456789'.indexOf(c)] ?? c);
  return `${mantissa}×10${superscript}`;
}

/** empty: said instead of the analysis when the run has no included reading yet. */
type StabilityViewProps = { analysis: StabilityRunAnalysis | null; problem: string | null; empty?: string | null; skipAnimation?: boolean };

/** Overlapping Allan deviation against averaging time, log-log, with its confidence intervals and any gaps. */
export function StabilityView({ analysis, problem, empty = null, skipAnimation }: StabilityViewProps) {
  const theme = useTheme();
  if (!analysis) {
    return <Alert severity="info">{empty ?? (problem ? `No stability analysis yet: ${problem}` : 'Loading the analysis…')}</Alert>;
  }
  const adev = analysis.adev.filter((p) => p.deviation > 0);
  const mdev = analysis.mdev.filter((p) => p.deviation > 0);
  const taus = adev.map((p) => p.tau);
  const mdevByTau = new Map(mdev.map((p) => [p.tau, p.deviation]));
  const lows = adev.map((p) => p.ciLow).filter((v) => v > 0);
  const highs = adev.map((p) => p.ciHigh).filter((v) => Number.isFinite(v));
  const all = [...adev.map((p) => p.deviation), ...mdev.map((p) => p.deviation), ...lows, ...highs];
  const yMin = all.length ? Math.min(...all) / 1.5 : undefined;
  const yMax = all.length ? Math.max(...all) * 1.5 : undefined;
  // Decades, with 2 and 5 between them where there is room: never every octave, whose labels collide.
  const yTicks = yMin !== undefined && yMax !== undefined ? logTicks(yMin, yMax, 8) : [];
  const xTicks = taus.length ? logTicks(taus[0]!, taus[taus.length - 1]!, 7) : [];

  const series = [
    {
      type: 'line' as const,
      id: 'adev',
      label: 'Overlapping ADEV (95 % interval)',
      data: adev.map((p) => p.deviation),
      color: theme.palette.primary.main,
      showMark: true,
      curve: 'linear' as const,
      valueFormatter: (v: number | null) => formatDeviation(v),
    },
    ...(mdev.length
      ? [
          {
            type: 'line' as const,
            id: 'mdev',
            label: 'Modified ADEV',
            data: taus.map((tau) => mdevByTau.get(tau) ?? null),
            color: theme.palette.secondary.main,
            showMark: true,
            curve: 'linear' as const,
            valueFormatter: (v: number | null) => formatDeviation(v),
          },
        ]
      : []),
  ];

  const gaps = analysis.gaps;
  return (
    <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 2fr) minmax(0, 1fr)' }, gap: 2, alignItems: 'start' }}>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Allan deviation
        </Typography>
        {adev.length === 0 ? (
          <Box sx={{ height: 360, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>Not enough readings for one averaging time.</Box>
        ) : (
          <Box role="img" aria-label={`Allan deviation at ${adev.length} averaging times`} data-testid="adev-chart">
            <ChartsDataProvider
              height={400}
              series={series}
              skipAnimation={skipAnimation}
              margin={{ top: 8, right: 20, bottom: 8, left: 8 }}
              xAxis={[
                {
                  id: 'tau',
                  scaleType: 'log',
                  data: taus,
                  label: 'Averaging time τ (s)',
                  height: 50,
                  tickInterval: xTicks.length >= 2 ? xTicks : 'auto',
                  tickLabelStyle: tickStyle,
                  valueFormatter: (v: number) => formatAxisNumber(v),
                },
              ]}
              yAxis={[
                {
                  id: 'sigma',
                  scaleType: 'log',
                  label: 'σy(τ)',
                  width: 88,
                  min: yMin,
                  max: yMax,
                  tickInterval: yTicks.length >= 2 ? yTicks : 'auto',
                  tickLabelStyle: tickStyle,
                  valueFormatter: (v: number, context) => (context.location === 'tick' ? formatAxisNumber(v) : formatDeviation(v)),
                },
              ]}
            >
              <ChartsWrapper legendPosition={{ vertical: 'top', horizontal: 'end' }}>
                <ChartsLegend />
                <ChartsSurface>
                  <ChartsGrid horizontal vertical />
                  <LinePlot />
                  <ConfidenceBars
                    testId="adev-confidence-bars"
                    bars={adev.map((p) => ({ x: p.tau, low: p.ciLow, high: p.ciHigh }))}
                    color={theme.palette.primary.dark}
                  />
                  <MarkPlot />
                  <ChartsAxis />
                </ChartsSurface>
                <ChartsTooltip trigger="axis" />
              </ChartsWrapper>
            </ChartsDataProvider>
          </Box>
        )}
      </Paper>

      <Paper variant="outlined" sx={{ p: 2 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Record
        </Typography>
        <Figures>
          <Figure label="Readings used" value={formatCount(analysis.usedCount)} detail={`${formatCount(analysis.excludedCount)} excluded`} />
          <Figure label="Basic interval τ0" value={`${formatNumber(analysis.tau0, analysis.tau0 < 1 ? 3 : 1)} s`} />
          <Figure label="Reference f_ref" value={formatHzTo(analysis.referenceHz, 0.0001)} />
          <Figure label="σy at τ0" value={formatDeviation(adev[0]?.deviation)} />
        </Figures>
        <Box sx={{ mt: 1.5 }} data-testid="gap-report">
          {gaps.gaps.length === 0 && !gaps.irregular ? (
            <Typography variant="body2" color="success.main">
              No gaps: every interval is within 1.5 τ0.
            </Typography>
          ) : (
            <Alert severity="warning">
              {gaps.gaps.length > 0 && (
                <>
                  {gaps.gaps.length} gap{gaps.gaps.length === 1 ? '' : 's'}, {gaps.gaps.reduce((n, g) => n + g.missing, 0)} readings missing:{' '}
                  {gaps.gaps.slice(0, 5).map((g, i) => (
                    <span key={g.index}>
                      {i > 0 && ', '}
                      <Num>
                        {formatDuration(g.tStart)}–{formatDuration(g.tEnd)}
                      </Num>
                    </span>
                  ))}
                  {gaps.gaps.length > 5 && ' …'}. The deviations assume an even record: read them with that in mind.
                </>
              )}
              {gaps.irregular && ' The sampling is irregular.'}
            </Alert>
          )}
        </Box>
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, gridColumn: '1 / -1', overflowX: 'auto' }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Octave by octave
        </Typography>
        <Table size="small" aria-label="Allan deviation table">
          <TableHead>
            <TableRow>
              <TableCell align="right">τ (s)</TableCell>
              <TableCell align="right">ADEV</TableCell>
              <TableCell align="right">95 % low</TableCell>
              <TableCell align="right">95 % high</TableCell>
              <TableCell align="right">MDEV</TableCell>
              <TableCell align="right">Terms</TableCell>
              <TableCell align="right">EDF</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {analysis.adev.map((p) => (
              <TableRow key={p.tau}>
                <TableCell align="right">
                  <Num>{formatAxisNumber(p.tau)}</Num>
                </TableCell>
                <TableCell align="right">
                  <Num>{formatDeviation(p.deviation)}</Num>
                </TableCell>
                <TableCell align="right">
                  <Num>{formatDeviation(p.ciLow)}</Num>
                </TableCell>
                <TableCell align="right">
                  <Num>{formatDeviation(p.ciHigh)}</Num>
                </TableCell>
                <TableCell align="right">
                  <Num>{formatDeviation(mdevByTau.get(p.tau))}</Num>
                </TableCell>
                <TableCell align="right">
                  <Num>{formatCount(p.n)}</Num>
                </TableCell>
                <TableCell align="right">
                  <Num>{formatNumber(p.edf, 1)}</Num>
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Paper>
    </Box>
  );
}
