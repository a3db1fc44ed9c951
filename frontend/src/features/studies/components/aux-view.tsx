import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useTheme } from '@mui/material/styles';
import { ScatterChart } from '@mui/x-charts/ScatterChart';
import type { KeyingRunAnalysis, SupplySensitivityRunAnalysis } from '@kilocycle/common/types';
import { MONO_FONT } from '@/lib/theme';
import { formatHzTo, formatNumber, formatSignedHz } from '@/utils/frequency';
import { Figure, Figures } from './figures';

const tickStyle = { fontFamily: MONO_FONT, fontSize: 11 };

type AuxViewProps = {
  kind: 'supply_sensitivity' | 'keying';
  analysis: SupplySensitivityRunAnalysis | KeyingRunAnalysis | null;
  problem: string | null;
  /** Said instead of the figure when the run has no included reading yet. */
  empty?: string | null;
  /** Included readings that carry an aux value (supply volts, or key state 0 up / 1 down). */
  points: ReadonlyArray<{ t: number; aux: number; frequency: number }>;
  skipAnimation?: boolean;
};

/** Frequency against supply voltage or key state, with the sensitivity or keying shift from the analysis. */
export function AuxView({ kind, analysis, problem, empty = null, points, skipAnimation }: AuxViewProps) {
  const theme = useTheme();
  const supply = kind === 'supply_sensitivity';
  // Supply: frequency against volts. Keying: frequency against time, key-down readings in their own colour.
  const byTime = !supply;
  const toPoint = (p: { t: number; aux: number; frequency: number }, i: number) => ({ id: i, x: byTime ? p.t : p.aux, y: p.frequency });
  const format = (v: { x: number; y: number } | null) =>
    v ? `${byTime ? `${formatNumber(v.x, 1)} s` : `${formatNumber(v.x, 2)} V`}: ${formatHzTo(v.y, 0.01)}` : '';
  const series = supply
    ? [{ id: 'readings', label: 'Readings', data: points.map(toPoint), markerSize: 4, color: theme.palette.primary.main, valueFormatter: format }]
    : [
        {
          id: 'up',
          label: 'Key up',
          data: points.filter((p) => p.aux === 0).map(toPoint),
          markerSize: 4,
          color: theme.palette.primary.main,
          valueFormatter: format,
        },
        {
          id: 'down',
          label: 'Key down',
          data: points.filter((p) => p.aux !== 0).map(toPoint),
          markerSize: 4,
          color: theme.palette.error.main,
          valueFormatter: format,
        },
      ];
  return (
    <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 2fr) minmax(0, 1fr)' }, gap: 2, alignItems: 'start' }}>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          {supply ? 'Frequency against supply voltage' : 'Frequency, key up and key down'}
        </Typography>
        {points.length === 0 ? (
          <Box sx={{ height: 320, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>
            No readings with a {supply ? 'supply voltage' : 'key state'} yet.
          </Box>
        ) : (
          <ScatterChart
            height={340}
            skipAnimation={skipAnimation}
            series={series}
            xAxis={[{ label: supply ? 'Supply (V)' : 'Time since the run started (s)', height: 50, tickLabelStyle: tickStyle }]}
            yAxis={[{ label: 'Frequency (Hz)', width: 96, tickLabelStyle: tickStyle, valueFormatter: (v: number) => formatNumber(v, 0) }]}
            hideLegend={supply}
          />
        )}
      </Paper>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          {supply ? 'Supply sensitivity' : 'Keying shift'}
        </Typography>
        {!analysis ? (
          <Alert severity="info">{empty ?? (problem ? `Not worked out yet: ${problem}` : 'Loading…')}</Alert>
        ) : analysis.analysis === 'supply_sensitivity' ? (
          <Figures>
            <Figure
              label="Sensitivity"
              value={`${formatNumber(analysis.sensitivity.hzPerVolt, 3, true)} Hz/V`}
              detail={`± ${formatNumber(analysis.sensitivity.seHzPerVolt, 3)} Hz/V (1 SE)`}
            />
            <Figure label="Readings" value={analysis.sensitivity.n} />
          </Figures>
        ) : analysis.analysis === 'keying' ? (
          <Figures>
            <Figure label="Shift (down − up)" value={formatSignedHz(analysis.shift.shiftHz, 2)} detail={`± ${formatNumber(analysis.shift.seHz, 2)} Hz`} />
            <Figure label="95 % interval" value={`${formatSignedHz(analysis.shift.low, 2)} to ${formatSignedHz(analysis.shift.high, 2)}`} />
            <Figure label="Key up, mean" value={formatHzTo(analysis.shift.keyUpMeanHz, 0.01)} detail={`${analysis.shift.nUp} readings`} />
            <Figure label="Key down, mean" value={formatHzTo(analysis.shift.keyDownMeanHz, 0.01)} detail={`${analysis.shift.nDown} readings`} />
            <Figure label="Largest key-down excursion" value={`${formatNumber(analysis.shift.keyDownPeakDeviationHz, 2)} Hz`} />
          </Figures>
        ) : null}
      </Paper>
    </Box>
  );
}
