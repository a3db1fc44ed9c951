import { useXScale, useYScale } from '@mui/x-charts/hooks';

export type ConfidenceBar = { x: number; low: number; high: number };

/**
 * Error bars for an x-charts plot, which has no error-bar series: an SVG layer inside the chart that draws
 * each point's interval on the chart's own scales (log or linear) as a vertical line with caps.
 * Place it inside the chart's surface (a LineChart's children, or a ChartsSurface).
 */
export function ConfidenceBars({
  bars,
  color,
  testId = 'confidence-bars',
  cap = 4,
}: {
  bars: readonly ConfidenceBar[];
  color: string;
  testId?: string;
  cap?: number;
}) {
  const x = useXScale<'log'>();
  const y = useYScale<'log'>();
  return (
    <g data-testid={testId} stroke={color} strokeWidth={1.25} pointerEvents="none">
      {bars.map((bar) => {
        const cx = x(bar.x);
        const top = y(bar.high);
        const bottom = y(bar.low);
        if (![cx, top, bottom].every((v) => typeof v === 'number' && Number.isFinite(v))) return null;
        return (
          <g key={bar.x} data-low={bar.low} data-high={bar.high}>
            <line x1={cx} x2={cx} y1={top} y2={bottom} />
            <line x1={cx - cap} x2={cx + cap} y1={top} y2={top} />
            <line x1={cx - cap} x2={cx + cap} y1={bottom} y2={bottom} />
          </g>
        );
      })}
    </g>
  );
}
