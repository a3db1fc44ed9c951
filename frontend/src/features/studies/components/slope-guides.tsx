import { useDrawingArea, useXScale, useYScale } from '@mui/x-charts/hooks';
import { useId } from 'react';
import type { GuideLine } from '../utils/slope-guides';

/** Dashed slope guides inside a log-log chart, each labelled at its right end, clipped to the plot area. */
export function SlopeGuides({ lines, color }: { lines: readonly GuideLine[]; color: string }) {
  const x = useXScale<'log'>();
  const y = useYScale<'log'>();
  const area = useDrawingArea();
  const clip = useId();
  return (
    <g data-testid="slope-guides" pointerEvents="none">
      <clipPath id={clip}>
        <rect x={area.left} y={area.top} width={area.width} height={area.height} />
      </clipPath>
      <g clipPath={`url(#${clip})`} stroke={color} strokeDasharray="4 4" strokeWidth={1}>
        {lines.map((line) => {
          const points = [x(line.x1), y(line.y1), x(line.x2), y(line.y2)];
          if (!points.every((v) => typeof v === 'number' && Number.isFinite(v))) return null;
          const [x1, y1, x2, y2] = points as [number, number, number, number];
          // The label goes where the line leaves the plot (its right end, or the top or bottom edge before it).
          const bottom = area.top + area.height;
          const exit = y2 < area.top ? (area.top - y1) / (y2 - y1) : y2 > bottom ? (bottom - y1) / (y2 - y1) : 1;
          const end = Math.max(0, Math.min(1, exit));
          const lx = x1 + end * (x2 - x1);
          const ly = y1 + end * (y2 - y1);
          return (
            <g key={line.label}>
              <line x1={x1} y1={y1} x2={x2} y2={y2} />
              <text
                x={lx - 4}
                y={Math.min(Math.max(ly + (y2 < y1 ? 12 : -4), area.top + 10), bottom - 4)}
                textAnchor="end"
                fill={color}
                stroke="none"
                fontSize={10}
              >
                {line.label}
              </text>
            </g>
          );
        })}
      </g>
    </g>
  );
}
