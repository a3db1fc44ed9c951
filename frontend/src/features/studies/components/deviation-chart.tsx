import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useTheme } from '@mui/material/styles';
import { ChartsAxis } from '@mui/x-charts/ChartsAxis';
import { ChartsDataProvider } from '@mui/x-charts/ChartsDataProvider';
import { ChartsGrid } from '@mui/x-charts/ChartsGrid';
import { ChartsLegend } from '@mui/x-charts/ChartsLegend';
import { ChartsSurface } from '@mui/x-charts/ChartsSurface';
import { ChartsTooltip } from '@mui/x-charts/ChartsTooltip';
import { ChartsWrapper } from '@mui/x-charts/ChartsWrapper';
import { LinePlot, MarkPlot } from '@mui/x-charts/LineChart';
import { useRef } from 'react';
import { STABILITY_DEVIATION_SHORT, type StabilityDeviation, type StabilityToolkit } from '@kilocycle/common/types';
import { ConfidenceBars } from '@/components/charts/confidence-bars';
import { saveBlob, saveText } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';
import { MONO_FONT } from '@/lib/theme';
import { formatAxisNumber, logTicks } from '@/utils/log-axis';
import { svgToPng } from '@/utils/chart-image';
import { chartPoints, standaloneSvg } from '../utils/chart-export';
import type { GuideLine } from '../utils/slope-guides';
import { SlopeGuides } from './slope-guides';

const tickStyle = { fontFamily: MONO_FONT, fontSize: 11 };

type StabilityRow = StabilityToolkit['deviations'][number];

type DeviationChartProps = {
  rows: readonly StabilityRow[];
  /** The deviations drawn, each with its colour; they share the vertical axis, so they share a unit. */
  deviations: readonly StabilityDeviation[];
  colors: Readonly<Record<StabilityDeviation, string>>;
  /** Axis title, e.g. "σ(τ)" or "σx(τ) (s)". */
  yLabel: string;
  /** How a value reads in the tooltip and the export ("1.23×10⁻¹¹"). */
  format: (value: number | null) => string;
  /** Slope guides (dashed), for the Allan-type deviations. */
  guides?: readonly GuideLine[];
  /** Names the chart: its heading on the page, the exported file's title. */
  title: string;
  ariaLabel: string;
  /** What the deviations were computed from and the conversion, written into the export. */
  description: string;
  /** The quantity on the vertical axis in words, for the export ("TDEV σx(τ), s"). */
  quantity: string;
  /** File name without extension. */
  fileName: string;
  testId: string;
  skipAnimation?: boolean;
};

/**
 * Deviations against averaging time on log-log axes, each point with its 95 % interval, and "Save SVG" / "Save
 * PNG" to keep the chart as drawn, with every point's terms, edf and interval written into the file.
 */
export function DeviationChart({
  rows,
  deviations,
  colors,
  yLabel,
  format,
  guides = [],
  title,
  ariaLabel,
  description,
  quantity,
  fileName,
  testId,
  skipAnimation,
}: DeviationChartProps) {
  const theme = useTheme();
  const chartRef = useRef<HTMLDivElement>(null);
  const taus = rows.map((r) => r.tau);
  const values = deviations.flatMap((d) => rows.flatMap((r) => (r[d] && r[d].deviation > 0 ? [r[d].deviation, r[d].ciLow, r[d].ciHigh] : [])));
  const positive = values.filter((v) => v > 0 && Number.isFinite(v));
  const yMin = positive.length ? Math.min(...positive) / 1.5 : undefined;
  const yMax = positive.length ? Math.max(...positive) * 1.5 : undefined;
  // Decades, with 2 and 5 between them where there is room: never every octave, whose labels collide.
  const yTicks = yMin !== undefined && yMax !== undefined ? logTicks(yMin, yMax, 8) : [];
  const xTicks = taus.length ? logTicks(taus[0]!, taus[taus.length - 1]!, 7) : [];
  const series = deviations.map((d) => ({
    type: 'line' as const,
    id: d,
    label: `${STABILITY_DEVIATION_SHORT[d]} (95 % interval)`,
    data: rows.map((r) => (r[d] && r[d].deviation > 0 ? r[d].deviation : null)),
    color: colors[d],
    showMark: true,
    curve: 'linear' as const,
    valueFormatter: format,
  }));

  /** The chart's own svg (the plot surface), not the legend's small marks. */
  const surface = (): SVGSVGElement | null => {
    const all = Array.from(chartRef.current?.querySelectorAll('svg') ?? []);
    return (
      all.find((svg) => svg.classList.contains('MuiChartsSurface-root')) ??
      all.sort((a, b) => b.querySelectorAll('*').length - a.querySelectorAll('*').length)[0] ??
      null
    );
  };
  const exported = () => {
    const svg = surface();
    if (!svg) return null;
    return standaloneSvg(svg, {
      title,
      description,
      quantity,
      legend: deviations.map((d) => ({ label: series.find((s) => s.id === d)!.label, color: colors[d] })),
      points: chartPoints(rows, deviations),
      background: theme.palette.background.paper,
      textColor: theme.palette.text.primary,
      fontFamily: String(theme.typography.fontFamily ?? 'sans-serif'),
    });
  };
  const saveSvg = () => {
    const file = exported();
    if (file) saveText(file.text, `${fileName}.svg`, 'image/svg+xml;charset=utf-8');
  };
  const savePng = () => {
    const file = exported();
    if (!file) return;
    svgToPng(file.text, 2).then(
      (blob) => saveBlob(blob, `${fileName}.png`),
      (error: unknown) =>
        notify('error', `The PNG could not be made: ${error instanceof Error ? error.message : String(error)}. Save SVG keeps the chart too.`),
    );
  };

  return (
    <>
      <Box role="img" aria-label={ariaLabel} data-testid={testId} ref={chartRef}>
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
              label: yLabel,
              width: 88,
              min: yMin,
              max: yMax,
              tickInterval: yTicks.length >= 2 ? yTicks : 'auto',
              tickLabelStyle: tickStyle,
              valueFormatter: (v: number, context) => (context.location === 'tick' ? formatAxisNumber(v) : format(v)),
            },
          ]}
        >
          <ChartsWrapper legendPosition={{ vertical: 'top', horizontal: 'end' }}>
            <ChartsLegend />
            <ChartsSurface>
              <ChartsGrid horizontal vertical />
              {guides.length > 0 && <SlopeGuides lines={guides} color={theme.palette.text.secondary} />}
              <LinePlot />
              {deviations.map((d) => (
                <ConfidenceBars
                  key={d}
                  testId={`${d}-confidence-bars`}
                  bars={rows.flatMap((r) => (r[d] && r[d].deviation > 0 ? [{ x: r.tau, low: r[d].ciLow, high: r[d].ciHigh }] : []))}
                  color={colors[d]}
                />
              ))}
              <MarkPlot />
              <ChartsAxis />
            </ChartsSurface>
            <ChartsTooltip trigger="axis" />
          </ChartsWrapper>
        </ChartsDataProvider>
      </Box>
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', justifyContent: 'flex-end', mt: 0.5 }}>
        <Button size="small" onClick={saveSvg} aria-label={`Save SVG: ${title}`}>
          Save SVG
        </Button>
        <Button size="small" onClick={savePng} aria-label={`Save PNG: ${title}`}>
          Save PNG
        </Button>
      </Box>
    </>
  );
}
