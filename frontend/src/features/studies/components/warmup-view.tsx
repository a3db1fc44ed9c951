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
import { LinePlot } from '@mui/x-charts/LineChart';
import { ScatterPlot } from '@mui/x-charts/ScatterChart';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import { ChartsReferenceLine } from '@mui/x-charts/ChartsReferenceLine';
import { useMemo, useState } from 'react';
import type { Reading, WarmupRunAnalysis } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { MONO_FONT } from '@/lib/theme';
import { formatDuration, formatHzTo, formatNumber, formatSignedHz, formatSignificant } from '@/utils/frequency';
import { formatCount } from '@/utils/measurement';
import { Figure, Figures } from './figures';

const tickStyle = { fontFamily: MONO_FONT, fontSize: 11 };

/** Under a settling time: "never" when the rule is never met, and plainly when the time lies beyond the record (the fit's prediction). */
export function settlingDetail(seconds: number | null, extrapolated: boolean, lastReadingSeconds: number): string | undefined {
  if (seconds === null) return 'never, by this rule';
  // The duration never breaks between number and unit ("14 s" stays on one line in the narrow figure column).
  return extrapolated ? `extrapolated beyond the ${formatDuration(lastReadingSeconds).replace(/ /g, '\u00a0')} recorded` : undefined;
}

/**
 * What the chart draws: the analysed readings (downsampled by the server) followed by the live ones newer than the
 * analysis, and either the frequencies with the server's fitted curve or the residuals from it.
 */
export function warmupChartData(analysis: WarmupRunAnalysis | null, latest: readonly Reading[], view: 'frequency' | 'residual') {
  const t: number[] = [];
  const f: number[] = [];
  const seriesT = analysis?.series.t ?? [];
  const seriesFitted = analysis?.series.fitted ?? [];
  const seriesF = analysis?.series.frequency ?? [];
  for (let i = 0; i < seriesT.length; i++) {
    t.push(seriesT[i]!);
    f.push(seriesF[i]!);
  }
  const after = t.length ? t[t.length - 1]! : -Infinity;
  for (const r of latest) {
    if (!r.excluded && r.t > after) {
      t.push(r.t);
      f.push(r.frequency);
    }
  }
  // Seconds for a short record, minutes once it runs past five.
  const perUnit = (t[t.length - 1] ?? 0) > 300 ? 60 : 1;
  const xs = t.map((s) => s / perUnit);
  // The fitted curve is the server's, at the analysed readings' times; a reading newer than the last analysis
  // has no fitted value until the analysis is refreshed (a moment after it arrives), so the curve stops short.
  const fitted: (number | null)[] | null = analysis?.fit ? t.map((_, i) => seriesFitted[i] ?? null) : null;
  // Residuals from the fit show what the curve hides: noise, steps, a drift the model does not describe.
  const residual = view === 'residual' && fitted !== null;
  const points = residual ? xs.flatMap((x, i) => (fitted[i] == null ? [] : [{ id: i, x, y: f[i]! - fitted[i]! }])) : xs.map((x, i) => ({ id: i, x, y: f[i]! }));
  return { xs, perUnit, points, fitted: residual ? null : fitted, residual };
}

type WarmupViewProps = {
  analysis: WarmupRunAnalysis | null;
  /** Why there is no fit yet (too few readings, no curvature yet…). */
  problem: string | null;
  /** Said instead of a fit when the run has no included reading yet ("No readings yet."). */
  empty?: string | null;
  /** The newest readings, live; shown beyond what the last analysis covered. */
  latest: readonly Reading[];
  skipAnimation?: boolean;
};

/** Frequency against time since power-on, with the fitted f∞ + A·e^(−t/τ) curve and its figures. */
export function WarmupView({ analysis, problem, empty = null, latest, skipAnimation }: WarmupViewProps) {
  const theme = useTheme();
  const fit = analysis?.fit ?? null;
  const [view, setView] = useState<'frequency' | 'residual'>('frequency');

  const chart = useMemo(() => warmupChartData(analysis, latest, view), [analysis, latest, view]);

  const series = [
    {
      type: 'scatter' as const,
      id: 'readings',
      label: 'Readings',
      data: chart.points,
      // Dense records draw small, light points so the fitted curve on top stays readable.
      markerSize: chart.points.length > 300 ? 1.5 : 2.5,
      color: chart.points.length > 300 ? theme.palette.primary.light : theme.palette.primary.main,
      valueFormatter: (v: { x: number; y: number } | null) =>
        v ? `${formatDuration(v.x * chart.perUnit)}: ${chart.residual ? `${formatNumber(v.y, 2, true)} Hz from the fit` : formatHzTo(v.y, 0.01)}` : '',
    },
    ...(chart.fitted
      ? [
          {
            type: 'line' as const,
            id: 'fit',
            label: 'Fitted f∞ + A·e^(−t/τ)',
            data: chart.fitted,
            color: theme.palette.secondary.main,
            showMark: false,
            valueFormatter: (v: number | null) => (v === null ? '' : formatHzTo(v, 0.01)),
          },
        ]
      : []),
  ];

  const lastWindow = analysis?.drift.windows[analysis.drift.windows.length - 1] ?? null;

  return (
    <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 2fr) minmax(0, 1fr)' }, gap: 2, alignItems: 'start' }}>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, mb: 1 }}>
          <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
            Frequency since power-on
          </Typography>
          <ToggleButtonGroup exclusive size="small" value={view} onChange={(_e, v: 'frequency' | 'residual' | null) => v && setView(v)} aria-label="Show">
            <ToggleButton value="frequency">Frequency</ToggleButton>
            <ToggleButton value="residual" disabled={!fit}>
              Residual from fit
            </ToggleButton>
          </ToggleButtonGroup>
        </Box>
        {chart.points.length === 0 ? (
          <Box sx={{ height: 360, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>Waiting for the first readings…</Box>
        ) : (
          <Box role="img" aria-label={`Frequency against time, ${chart.points.length} points`} data-testid="warmup-chart">
            <ChartsDataProvider
              height={380}
              series={series}
              skipAnimation={skipAnimation}
              margin={{ top: 8, right: 16, bottom: 8, left: 8 }}
              xAxis={[
                {
                  id: 't',
                  scaleType: 'linear',
                  data: chart.xs,
                  label: `Time since power-on (${chart.perUnit === 60 ? 'min' : 's'})`,
                  height: 50,
                  tickLabelStyle: tickStyle,
                },
              ]}
              yAxis={[
                {
                  id: 'f',
                  label: chart.residual ? 'Residual (Hz)' : 'Frequency (Hz)',
                  width: 96,
                  tickLabelStyle: tickStyle,
                  valueFormatter: (v: number) => formatNumber(v, chart.residual ? 1 : 0),
                },
              ]}
            >
              <ChartsWrapper legendPosition={{ vertical: 'top', horizontal: 'end' }}>
                <ChartsLegend />
                <ChartsSurface sx={{ '& path[data-series="fit"]': { strokeWidth: 1.75 } }}>
                  <ChartsGrid horizontal vertical />
                  <ScatterPlot />
                  <LinePlot />
                  {chart.residual && <ChartsReferenceLine y={0} lineStyle={{ stroke: theme.palette.secondary.main }} />}
                  <ChartsAxis />
                </ChartsSurface>
                <ChartsTooltip trigger="item" />
              </ChartsWrapper>
            </ChartsDataProvider>
          </Box>
        )}
      </Paper>

      <Paper variant="outlined" sx={{ p: 2 }} data-testid="warmup-figures">
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Warm-up fit
        </Typography>
        {!analysis && (empty || problem) && (
          <Alert severity="info" sx={{ mb: 1 }}>
            {empty ? `${empty} The fit appears as readings arrive.` : `No fit yet: ${problem}`}
          </Alert>
        )}
        {analysis && (
          <>
            <Figures>
              <Figure
                label="Settled frequency f∞"
                value={formatHzTo(analysis.fit.fInf, 0.01)}
                detail={`± ${formatSignificant(analysis.fit.seFInf, 2)} Hz`}
                testId="fit-finf"
              />
              <Figure label="Amplitude A" value={formatSignedHz(analysis.fit.amplitude)} detail={`± ${formatSignificant(analysis.fit.seAmplitude, 2)} Hz`} />
              <Figure
                label="Time constant τ"
                value={`${formatSignificant(analysis.fit.tau, 3)} s`}
                detail={`± ${formatSignificant(analysis.fit.seTau, 2)} s${analysis.fit.tau >= 60 ? ` (${formatDuration(analysis.fit.tau)})` : ''}`}
                testId="fit-tau"
              />
              {analysis.fit.linear !== null && <Figure label="Linear term" value={`${formatNumber(analysis.fit.linear * 60, 3, true)} Hz/min`} />}
              <Figure label="Residual SD" value={`${formatNumber(analysis.fit.residualSd, 2)} Hz`} detail={`${formatCount(analysis.usedCount)} readings`} />
              <Figure
                label={`Settled within ${analysis.settling.withinHz} Hz`}
                value={analysis.settling.withinSeconds === null ? '—' : formatDuration(analysis.settling.withinSeconds)}
                detail={settlingDetail(analysis.settling.withinSeconds, analysis.settling.withinExtrapolated, analysis.settling.lastReadingSeconds)}
                testId="settled-within"
              />
              <Figure
                label={`Drift below ${analysis.settling.rateHzPerMin} Hz/min`}
                value={analysis.settling.rateSeconds === null ? '—' : formatDuration(analysis.settling.rateSeconds)}
                detail={settlingDetail(analysis.settling.rateSeconds, analysis.settling.rateExtrapolated, analysis.settling.lastReadingSeconds)}
                testId="settled-rate"
              />
              <Figure
                label="Drift, first hour"
                value={formatSignedHz(analysis.summary.driftFirstHourHz)}
                detail={analysis.summary.firstHourCovered ? undefined : 'extrapolated by the fit'}
              />
              <Figure
                label="Drift per 10 min, settled"
                value={analysis.summary.driftPer10MinAfterSettlingHz === null ? '—' : formatSignedHz(analysis.summary.driftPer10MinAfterSettlingHz, 2)}
              />
              <Figure
                label={`Latest ${formatDuration(analysis.drift.windowSeconds)} window`}
                value={lastWindow ? `${formatNumber(lastWindow.rateHzPerMin, 2, true)} Hz/min` : '—'}
                detail={lastWindow ? undefined : 'the record is shorter than one window'}
              />
            </Figures>
            {problem && (
              <Typography variant="caption" color="text.secondary" sx={{ display: 'block', mt: 1 }}>
                The newest readings could not be fitted yet ({problem}); the figures are from the last fit that worked.
              </Typography>
            )}
          </>
        )}
      </Paper>

      {analysis && analysis.drift.windows.length > 0 && (
        <Paper variant="outlined" sx={{ p: 2, gridColumn: '1 / -1' }}>
          <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
            Drift rate by window
          </Typography>
          <Box tabIndex={0} role="region" aria-label="Drift rate by window, scrollable" sx={{ maxHeight: 260, overflow: 'auto' }}>
            <Table size="small" stickyHeader aria-label="Drift rate by window" sx={{ '& td, & th': { px: { xs: 1, sm: 2 } } }}>
              <TableHead>
                <TableRow>
                  <TableCell>From</TableCell>
                  <TableCell>To</TableCell>
                  <TableCell align="right">Drift rate</TableCell>
                  <TableCell align="right">Readings</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {analysis.drift.windows.map((w) => (
                  <TableRow key={w.tStart}>
                    <TableCell>
                      <Num>{formatDuration(w.tStart)}</Num>
                    </TableCell>
                    <TableCell>
                      <Num>{formatDuration(w.tEnd)}</Num>
                    </TableCell>
                    <TableCell align="right">
                      <Num>{formatNumber(w.rateHzPerMin, 2, true)} Hz/min</Num>
                    </TableCell>
                    <TableCell align="right">
                      <Num>{w.n}</Num>
                    </TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </Box>
        </Paper>
      )}
    </Box>
  );
}
