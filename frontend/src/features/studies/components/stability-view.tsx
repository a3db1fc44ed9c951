import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormGroup from '@mui/material/FormGroup';
import Paper from '@mui/material/Paper';
import Switch from '@mui/material/Switch';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useTheme } from '@mui/material/styles';
import { ChartsAxis } from '@mui/x-charts/ChartsAxis';
import { ChartsDataProvider } from '@mui/x-charts/ChartsDataProvider';
import { ChartsGrid } from '@mui/x-charts/ChartsGrid';
import { ChartsSurface } from '@mui/x-charts/ChartsSurface';
import { ChartsTooltip } from '@mui/x-charts/ChartsTooltip';
import { ChartsWrapper } from '@mui/x-charts/ChartsWrapper';
import { LinePlot } from '@mui/x-charts/LineChart';
import { useState } from 'react';
import {
  STABILITY_DEVIATION_NAMES,
  STABILITY_DEVIATION_SHORT,
  STABILITY_DEVIATIONS,
  type AnalysisSeries,
  type FlaggedReading,
  type RunDataKind,
  type StabilityDeviation,
  type StabilityDriftChoice,
  type StabilityFactorSpacing,
  type StabilityGapChoice,
  type StabilityRunAnalysis,
} from '@kilocycle/common/types';
import { HIDE_ON_PHONE, PhoneSecondLine } from '@/components/ui/phone-columns';
import { Num } from '@/components/ui/num';
import { saveText } from '@/lib/file-transfer';
import { MONO_FONT } from '@/lib/theme';
import { yAxisWidth } from '@/utils/chart-layout';
import { DATA_KIND_LABELS, formatSeconds, valueHeading } from '@/utils/data-kind';
import { formatDuration, formatHzTo, formatNumber } from '@/utils/frequency';
import { formatAxisNumber } from '@/utils/log-axis';
import { formatCount } from '@/utils/measurement';
import { dataWords, deviationCsv } from '../utils/deviation-csv';
import { slopeGuideLines } from '../utils/slope-guides';
import { DeviationChart } from './deviation-chart';
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

/** The engineer's choices for a stability run, sent with the analysis query. */
export type StabilityOptions = { factors: StabilityFactorSpacing; drift: StabilityDriftChoice; gaps: StabilityGapChoice };
export const DEFAULT_STABILITY_OPTIONS: StabilityOptions = { factors: 'octaves', drift: 'kept', gaps: 'longest' };

const NOISE_NAMES: Record<string, string> = {
  white_pm: 'White PM',
  flicker_pm: 'Flicker PM',
  white_fm: 'White FM',
  flicker_fm: 'Flicker FM',
  random_walk_fm: 'Random-walk FM',
};
const METHOD_NAMES: Record<string, string> = { lag1_acf: 'lag-1 autocorrelation', b1_ratio: 'B1 ratio' };
/** TDEV is in seconds, the others are ratios: one chart plots the ratios, TDEV has its own; the table and CSV carry all five. */
const CHARTED: readonly StabilityDeviation[] = ['adev', 'mdev', 'hdev', 'totdev'];
const TDEV: readonly StabilityDeviation[] = ['tdev'];

/** A reading's value as stored, in the run's terms: a frequency, or a time interval in seconds. */
function formatValue(value: number, dataKind: RunDataKind): string {
  return dataKind === 'phase' ? `${formatSeconds(value)} s` : formatHzTo(value, 0.0001);
}

/** The analysed readings against time (downsampled by the server): frequency in Hz, or time interval in s for phase data. */
function SeriesChart({ series, dataKind, skipAnimation }: { series: AnalysisSeries; dataKind: RunDataKind; skipAnimation?: boolean }) {
  const theme = useTheme();
  const heading = dataKind === 'phase' ? 'Time interval (s)' : 'Frequency (Hz)';
  if (series.t.length === 0) return <Box sx={{ height: 240, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>No readings to draw.</Box>;
  // Minutes once the record runs past five.
  const perUnit = (series.t[series.t.length - 1] ?? 0) > 300 ? 60 : 1;
  const finite = series.frequency.filter((v) => Number.isFinite(v));
  const span = finite.length ? Math.max(...finite) - Math.min(...finite) : 0;
  // Enough decimals to tell the ticks apart: a stable oscillator's frequency moves in the fourth decimal of a hertz.
  const decimals = span > 0 ? Math.min(6, Math.max(0, Math.ceil(-Math.log10(span / 5)))) : 0;
  const tick = (v: number) => (dataKind === 'phase' ? formatSeconds(v, 3) : formatNumber(v, decimals));
  return (
    <Box role="img" aria-label={`${heading} against time, ${formatCount(series.t.length)} points`} data-testid="series-chart">
      <ChartsDataProvider
        height={260}
        skipAnimation={skipAnimation}
        margin={{ top: 8, right: 16, bottom: 8, left: 8 }}
        series={[
          {
            type: 'line',
            id: 'readings',
            label: heading,
            data: series.frequency,
            color: theme.palette.primary.main,
            showMark: false,
            valueFormatter: (v: number | null) => (v === null ? '' : formatValue(v, dataKind)),
          },
        ]}
        xAxis={[
          {
            id: 't',
            scaleType: 'linear',
            data: series.t.map((t) => t / perUnit),
            label: `Time (${perUnit === 60 ? 'min' : 's'})`,
            height: 50,
            tickLabelStyle: tickStyle,
          },
        ]}
        yAxis={[{ id: 'value', label: heading, width: yAxisWidth(finite, tick), tickLabelStyle: tickStyle, valueFormatter: (v: number) => tick(v) }]}
      >
        <ChartsWrapper>
          <ChartsSurface>
            <ChartsGrid horizontal />
            <LinePlot />
            <ChartsAxis />
          </ChartsSurface>
          <ChartsTooltip trigger="axis" />
        </ChartsWrapper>
      </ChartsDataProvider>
    </Box>
  );
}

type StabilityRow = StabilityRunAnalysis['toolkit']['deviations'][number];

function noiseText(row: StabilityRow): { named: string; detail: string } {
  if (row.noise.status === 'identified') return { named: NOISE_NAMES[row.noise.noise] ?? row.noise.noise, detail: `by ${METHOD_NAMES[row.noise.method]}` };
  const edf = row.edfNoiseFrom === 'shorter_tau' ? `edf for ${NOISE_NAMES[row.edfNoise]}, named at a shorter τ` : 'edf for white FM';
  return { named: 'Too short to identify', detail: edf };
}

/** empty: said instead of the analysis when the run has no included reading yet. */
type StabilityViewProps = {
  analysis: StabilityRunAnalysis | null;
  problem: string | null;
  empty?: string | null;
  skipAnimation?: boolean;
  options?: StabilityOptions;
  onOptionsChange?: (options: StabilityOptions) => void;
  /** Opens the exclusion dialog for a flagged reading; without it the list has no action. */
  onExclude?: (reading: FlaggedReading) => void;
  /** Start of the CSV's file name. */
  fileTitle?: string;
};

/** Deviations against averaging time, log-log, with their intervals and slope guides; the table, the drift, the gaps and the MAD screen. */
export function StabilityView({
  analysis,
  problem,
  empty = null,
  skipAnimation,
  options = DEFAULT_STABILITY_OPTIONS,
  onOptionsChange,
  onExclude,
  fileTitle,
}: StabilityViewProps) {
  const theme = useTheme();
  const [ticked, setTicked] = useState<readonly StabilityDeviation[]>(['adev', 'hdev']);
  if (!analysis) {
    return <Alert severity="info">{empty ?? (problem ? `No stability analysis yet: ${problem}` : 'Loading the analysis…')}</Alert>;
  }
  const { toolkit } = analysis;
  const rows = toolkit.deviations;
  const colors: Record<StabilityDeviation, string> = {
    adev: theme.palette.primary.main,
    mdev: theme.palette.secondary.main,
    hdev: theme.palette.warning.dark,
    tdev: theme.palette.text.secondary,
    totdev: theme.palette.error.dark,
  };
  const shownDeviations = CHARTED.filter((d) => ticked.includes(d));
  const taus = rows.map((r) => r.tau);
  const anchorDeviation = shownDeviations.find((d) => rows[0]?.[d]);
  const anchor = anchorDeviation && rows[0] ? { tau: rows[0].tau, sigma: rows[0][anchorDeviation]!.deviation } : null;
  const guides = anchor && taus.length > 1 && anchor.sigma > 0 ? slopeGuideLines(anchor, taus[0]!, taus[taus.length - 1]!) : [];
  const which = dataWords(toolkit);
  const drifted = toolkit.drift?.removed ? 'with the drift removed' : 'as recorded';
  const dataKind = toolkit.dataKind;
  const phase = dataKind === 'phase';
  const hasTdev = rows.some((r) => r.tdev && r.tdev.deviation > 0);
  const description = `Computed from ${which}. ${toolkit.conversion}`;
  const file = fileTitle ?? `run-${analysis.runId}`;
  const change = (next: Partial<StabilityOptions>) => onOptionsChange?.({ ...options, ...next });
  const gaps = analysis.gaps;
  const segment = toolkit.segment;
  const drift = toolkit.drift;

  return (
    <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 2fr) minmax(0, 1fr)' }, gap: 2, alignItems: 'start' }}>
      <Paper variant="outlined" sx={{ p: 2, gridColumn: '1 / -1', display: 'flex', flexWrap: 'wrap', gap: 2, alignItems: 'center' }}>
        <ToggleButtonGroup
          size="small"
          exclusive
          value={options.factors}
          onChange={(_e, value: StabilityFactorSpacing | null) => value && change({ factors: value })}
          aria-label="Averaging times: Octaves / Decades"
        >
          <ToggleButton value="octaves">Octaves</ToggleButton>
          <ToggleButton value="decades">Decades</ToggleButton>
        </ToggleButtonGroup>
        <FormControlLabel
          control={<Switch checked={options.drift === 'removed'} onChange={(e) => change({ drift: e.target.checked ? 'removed' : 'kept' })} />}
          label="Analyse with drift removed"
        />
        <ToggleButtonGroup
          size="small"
          exclusive
          value={options.gaps}
          onChange={(_e, value: StabilityGapChoice | null) => value && change({ gaps: value })}
          aria-label={phase ? 'Gaps: Longest segment / As if continuous / Fill gaps (phase data only)' : 'Gaps: Longest segment / As if continuous'}
        >
          <ToggleButton value="longest">Longest segment</ToggleButton>
          {/* Phase jumps across a gap: the server refuses to run phase data across one as if it were not there. */}
          <ToggleButton value="continuous" disabled={phase && gaps.gaps.length > 0}>
            As if continuous
          </ToggleButton>
          {phase && <ToggleButton value="fill">Fill gaps (phase data only)</ToggleButton>}
        </ToggleButtonGroup>
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, minWidth: 0 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 0.5 }}>
          Deviations {drifted}
        </Typography>
        <Typography variant="body2" color="text.secondary" data-testid="chart-data">
          Computed from {which}. Dashed lines: slopes of the noise types.
        </Typography>
        <Typography variant="caption" color="text.secondary" component="p" sx={{ mb: 1 }} data-testid="conversion">
          {toolkit.conversion}
        </Typography>
        <FormGroup row role="group" aria-label="Deviations on the chart">
          {CHARTED.map((d) => (
            <FormControlLabel
              key={d}
              control={
                <Checkbox
                  size="small"
                  checked={ticked.includes(d)}
                  onChange={(e) => setTicked(e.target.checked ? [...ticked, d] : ticked.filter((x) => x !== d))}
                />
              }
              label={STABILITY_DEVIATION_SHORT[d]}
              title={STABILITY_DEVIATION_NAMES[d]}
            />
          ))}
        </FormGroup>
        <Typography variant="caption" color="text.secondary" component="p">
          TDEV is in seconds, so it has its own chart below.
        </Typography>
        {shownDeviations.length === 0 || rows.length === 0 ? (
          <Box sx={{ height: 360, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>
            {rows.length === 0 ? 'Not enough readings for one averaging time.' : 'Tick a deviation to plot it.'}
          </Box>
        ) : (
          <DeviationChart
            rows={rows}
            deviations={shownDeviations}
            colors={colors}
            yLabel="σ(τ)"
            format={(v) => formatDeviation(v)}
            guides={guides}
            title={`Deviations ${drifted}`}
            ariaLabel={`Deviations ${drifted} at ${rows.length} averaging times: ${shownDeviations.map((d) => STABILITY_DEVIATION_SHORT[d]).join(', ')}`}
            description={description}
            quantity="σ(τ), dimensionless"
            fileName={`${file}-deviations`}
            testId="adev-chart"
            skipAnimation={skipAnimation}
          />
        )}
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, minWidth: 0 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Record
        </Typography>
        <Figures>
          <Figure label="Readings used" value={formatCount(analysis.usedCount)} detail={`${formatCount(analysis.excludedCount)} excluded`} />
          <Figure label="Basic interval τ0" value={`${formatNumber(analysis.tau0, analysis.tau0 < 1 ? 3 : 1)} s`} />
          <Figure label="Data" value={phase ? 'Phase' : 'Frequency'} detail={DATA_KIND_LABELS[dataKind]} testId="figure-data" />
          {analysis.referenceHz === null ? (
            <Figure
              label="Reference f_ref"
              value="—"
              detail="not needed: phase readings are already time error against the counter’s reference"
              testId="reference"
            />
          ) : (
            <Figure label="Reference f_ref" value={formatHzTo(analysis.referenceHz, 0.0001)} testId="reference" />
          )}
          <Figure label="σy at τ0" value={formatDeviation(rows[0]?.adev?.deviation)} />
          <Figure
            label="Drift, least squares"
            testId="drift"
            value={drift ? `${formatDeviation(drift.perSecond)} /s` : '—'}
            detail={
              drift
                ? `standard error ${formatDeviation(drift.standardError)} /s · least squares on frequency over ${formatCount(drift.points)} readings · ${drift.removed ? 'removed before the analysis' : 'kept in the analysis'}`
                : undefined
            }
          />
          {drift?.phaseEstimates && (
            <>
              <Figure
                label="Drift, three-point"
                testId="drift-three-point"
                value={`${formatDeviation(drift.phaseEstimates.threePoint.perSecond)} /s`}
                detail="three-point fit on the phase · no standard error"
              />
              <Figure
                label="Drift, bisection"
                testId="drift-bisection"
                value={`${formatDeviation(drift.phaseEstimates.bisection.perSecond)} /s`}
                detail="the first and second halves compared"
              />
            </>
          )}
        </Figures>
        {drift?.phaseEstimates && (
          <Typography variant="caption" color="text.secondary" component="p" sx={{ mt: 0.5 }}>
            Three estimates of the same fractional frequency drift from the same readings; the least-squares line is the one removed when asked.
          </Typography>
        )}
        {drift?.spansGap && (
          <Alert severity="warning" sx={{ mt: 1.5 }} data-testid="drift-spans-gap">
            {segment.choice === 'fill'
              ? 'The drift window spans a gap: the line runs through the points filled there, which carry no measurement, so the rate leans on them.'
              : 'The drift window spans a gap: the line takes the readings as evenly spaced, so the rate is doubtful.'}
          </Alert>
        )}
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
                  {gaps.gaps.length > 5 && ' …'}.{' '}
                  {segment.choice === 'longest'
                    ? 'By default only the longest continuous segment is analysed, so no deviation runs across a gap.'
                    : segment.choice === 'fill'
                      ? 'Each gap is bridged by a straight line in phase, and every reading is analysed.'
                      : 'Every reading is analysed as if the record were continuous: deviations at long τ mix readings either side of a gap.'}
                  {phase && segment.choice === 'longest' && ' Fill gaps (phase data only) bridges them instead.'}
                </>
              )}
              {gaps.irregular && ' The sampling is irregular.'}
            </Alert>
          )}
          <Typography variant="body2" sx={{ mt: 1 }} data-testid="segment">
            Analysed: {segment.statement}.
          </Typography>
          {segment.filled > 0 && (
            <Typography variant="body2" sx={{ mt: 0.5 }} data-testid="filled">
              <Num>{formatCount(segment.filled)}</Num> point{segment.filled === 1 ? '' : 's'} filled by straight lines in phase.
            </Typography>
          )}
        </Box>
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, minWidth: 0 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 0.5 }}>
          Time deviation {drifted}
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }} data-testid="tdev-data">
          TDEV σx(τ) in seconds, with its 95 % intervals. Computed from {which}.
        </Typography>
        {hasTdev ? (
          <DeviationChart
            rows={rows}
            deviations={TDEV}
            colors={colors}
            yLabel="σx(τ) (s)"
            format={(v) => (v === null ? '—' : `${formatDeviation(v)} s`)}
            title={`Time deviation ${drifted}`}
            ariaLabel={`Time deviation ${drifted} at ${rows.length} averaging times, in seconds`}
            description={description}
            quantity="TDEV σx(τ), s"
            fileName={`${file}-tdev`}
            testId="tdev-chart"
            skipAnimation={skipAnimation}
          />
        ) : (
          <Box sx={{ height: 200, display: 'grid', placeItems: 'center', color: 'text.secondary' }}>Not enough readings for a time deviation.</Box>
        )}
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, minWidth: 0 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 0.5 }}>
          {phase ? 'Time interval readings' : 'Frequency readings'}
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          The readings as stored ({phase ? 'time interval, s' : 'Hz'}), at most 2,000 points drawn.
        </Typography>
        <SeriesChart series={analysis.series} dataKind={dataKind} skipAnimation={skipAnimation} />
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, gridColumn: '1 / -1', minWidth: 0 }}>
        <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, alignItems: 'baseline', justifyContent: 'space-between', mb: 1 }}>
          <Typography variant="h3" component="h2">
            {toolkit.factors.spacing === 'decades'
              ? 'Decade by decade'
              : toolkit.factors.spacing === 'list'
                ? 'At the averaging times asked for'
                : 'Octave by octave'}
          </Typography>
          <Button size="small" onClick={() => saveText(deviationCsv(toolkit), `${file}-deviations.csv`)}>
            Download CSV
          </Button>
        </Box>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }} data-testid="table-data">
          Computed from {which}; intervals at {Math.round(toolkit.confidence * 100)} % (χ², edf for the noise type named at each τ). {toolkit.conversion}
        </Typography>
        {/* Wider than a phone: the table scrolls in its own box, which the keyboard can reach. */}
        <Box sx={{ overflowX: 'auto' }} tabIndex={0} role="region" aria-label="Deviations table (scrolls sideways on narrow screens)">
          <Table size="small" aria-label="Deviations table">
            <TableHead>
              <TableRow>
                <TableCell align="right">τ (s)</TableCell>
                <TableCell sx={HIDE_ON_PHONE}>Noise type</TableCell>
                {STABILITY_DEVIATIONS.map((d) => (
                  <TableCell key={d} align="right" title={STABILITY_DEVIATION_NAMES[d]}>
                    {STABILITY_DEVIATION_SHORT[d]}
                    {d === 'tdev' ? ' (s)' : ''}
                  </TableCell>
                ))}
              </TableRow>
            </TableHead>
            <TableBody>
              {rows.map((row) => {
                const noise = noiseText(row);
                return (
                  <TableRow key={row.m}>
                    <TableCell align="right">
                      <Num>{formatAxisNumber(row.tau)}</Num>
                      <PhoneSecondLine parts={[noise.named]} />
                    </TableCell>
                    <TableCell sx={HIDE_ON_PHONE}>
                      {noise.named}
                      <Typography variant="caption" color="text.secondary" component="div">
                        {noise.detail}
                      </Typography>
                    </TableCell>
                    {STABILITY_DEVIATIONS.map((d) => {
                      const value = row[d];
                      return (
                        <TableCell key={d} align="right" data-testid={`${d}-${row.m}`}>
                          {value ? (
                            <>
                              <Num>{formatDeviation(value.deviation)}</Num>
                              <Typography variant="caption" color="text.secondary" component="div">
                                <Num>
                                  {formatDeviation(value.ciLow)} to {formatDeviation(value.ciHigh)}
                                </Num>
                              </Typography>
                              <Typography variant="caption" color="text.secondary" component="div">
                                <Num>
                                  {formatCount(value.terms)} terms · edf {formatNumber(value.edf, 1)}
                                </Num>
                              </Typography>
                            </>
                          ) : (
                            <Num>—</Num>
                          )}
                        </TableCell>
                      );
                    })}
                  </TableRow>
                );
              })}
            </TableBody>
          </Table>
        </Box>
      </Paper>

      <Paper variant="outlined" sx={{ p: 2, gridColumn: '1 / -1', minWidth: 0 }} data-testid="mad-screen">
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Outlier screen
        </Typography>
        {!toolkit.outliers ? (
          <Typography variant="body2">Too few readings to screen.</Typography>
        ) : toolkit.outliers.flaggedCount === 0 ? (
          <Typography variant="body2">
            The median-absolute-deviation screen flags none of the {formatCount(toolkit.outliers.screened)} analysed readings (limit {toolkit.outliers.k} ×
            1.4826 MAD).
          </Typography>
        ) : (
          <>
            <Typography variant="body2" sx={{ mb: 1 }}>
              The median-absolute-deviation screen flags {formatCount(toolkit.outliers.flaggedCount)} of the {formatCount(toolkit.outliers.screened)} analysed
              readings (further than {toolkit.outliers.k} × 1.4826 MAD from the median). They stay in the analysis until you exclude them with a reason.
            </Typography>
            <Table size="small" aria-label="Readings the MAD screen flags">
              <TableHead>
                <TableRow>
                  <TableCell align="right">Reading</TableCell>
                  <TableCell align="right" sx={HIDE_ON_PHONE}>
                    Time
                  </TableCell>
                  <TableCell align="right">{valueHeading(dataKind)}</TableCell>
                  {onExclude && <TableCell align="right">Action</TableCell>}
                </TableRow>
              </TableHead>
              <TableBody>
                {toolkit.outliers.flagged.map((reading) => (
                  <TableRow key={reading.seq}>
                    <TableCell align="right">
                      <Num>#{reading.seq}</Num>
                      <PhoneSecondLine parts={[formatDuration(reading.t)]} />
                    </TableCell>
                    <TableCell align="right" sx={HIDE_ON_PHONE}>
                      <Num>{formatDuration(reading.t)}</Num>
                    </TableCell>
                    <TableCell align="right">
                      <Num>{formatValue(reading.frequency, dataKind)}</Num>
                    </TableCell>
                    {onExclude && (
                      <TableCell align="right">
                        <Button size="small" color="inherit" onClick={() => onExclude(reading)} aria-label={`Exclude… reading ${reading.seq}`}>
                          Exclude…
                        </Button>
                      </TableCell>
                    )}
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </>
        )}
      </Paper>
    </Box>
  );
}
