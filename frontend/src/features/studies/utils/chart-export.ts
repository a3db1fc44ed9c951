import { escapeXml, inlineStyles } from '@/utils/chart-image';
import { STABILITY_DEVIATION_SHORT, type StabilityDeviation, type StabilityToolkit } from '@kilocycle/common/types';

type StabilityTableRow = StabilityToolkit['deviations'][number];

/** One plotted point with what it rests on: the same figures as the deviation CSV. */
export type ExportPoint = {
  deviation: string;
  tau: number;
  m: number;
  value: number;
  terms: number;
  edf: number;
  ciLow: number;
  ciHigh: number;
  noise: string;
};

export type ChartExport = {
  title: string;
  /** What the deviations were computed from, and how the data were converted. */
  description: string;
  /** The quantity on the vertical axis, with its unit when it has one ("TDEV σx(τ), s"). */
  quantity: string;
  legend: ReadonlyArray<{ label: string; color: string }>;
  points: readonly ExportPoint[];
  background: string;
  textColor: string;
  fontFamily: string;
};

/** Every point of the deviations drawn on a chart, in τ order, each with its terms, edf and 95 % interval. */
export function chartPoints(rows: readonly StabilityTableRow[], deviations: readonly StabilityDeviation[]): ExportPoint[] {
  return deviations.flatMap((d) =>
    rows.flatMap((row) => {
      const value = row[d];
      if (!value || !(value.deviation > 0)) return [];
      const noise = row.noise.status === 'identified' ? row.noise.noise : 'too short to identify';
      return [
        {
          deviation: STABILITY_DEVIATION_SHORT[d],
          tau: row.tau,
          m: row.m,
          value: value.deviation,
          terms: value.terms,
          edf: value.edf,
          ciLow: value.ciLow,
          ciHigh: value.ciHigh,
          noise,
        },
      ];
    }),
  );
}

const xml = escapeXml;
/** Full precision in the metadata and desc (a reader may compute with them); four figures in the drawn table. */
const short = (v: number) => (Number.isFinite(v) ? v.toPrecision(4) : '—');

/** The drawn size of a chart's svg: its box on the page, else its viewBox or attributes. */
export function svgSize(svg: SVGSVGElement): { width: number; height: number } {
  const box = svg.getBoundingClientRect();
  if (box.width > 0 && box.height > 0) return { width: Math.round(box.width), height: Math.round(box.height) };
  const view = (svg.getAttribute('viewBox') ?? '').split(/[\s,]+/).map(Number);
  if (view.length === 4 && view[2]! > 0 && view[3]! > 0) return { width: view[2]!, height: view[3]! };
  return { width: Number(svg.getAttribute('width')) || 640, height: Number(svg.getAttribute('height')) || 400 };
}

const HEADER = 52;
const ROW = 15;
const TABLE_COLUMNS = [
  { head: 'τ (s)', x: 0, anchor: 'end', dx: 56 },
  { head: 'deviation', x: 70, anchor: 'start', dx: 0 },
  { head: 'value', x: 150, anchor: 'start', dx: 0 },
  { head: '95 % low', x: 230, anchor: 'start', dx: 0 },
  { head: '95 % high', x: 310, anchor: 'start', dx: 0 },
  { head: 'terms', x: 390, anchor: 'end', dx: 50 },
  { head: 'edf', x: 450, anchor: 'end', dx: 50 },
  { head: 'noise', x: 520, anchor: 'start', dx: 0 },
] as const;
const TABLE_WIDTH = 640;

/**
 * A chart's svg as a file that stands on its own: the plot as drawn (styles inlined), a title and legend above it
 * (the page draws those in HTML), and below it a table of every point with its terms, edf and 95 % interval. The
 * same points are in `<desc>` as text and in `<metadata>` as elements, for a program to read.
 */
export function standaloneSvg(svg: SVGSVGElement, chart: ChartExport): { text: string; width: number; height: number } {
  const plot = svg.cloneNode(true) as SVGSVGElement;
  inlineStyles(svg, plot);
  const size = svgSize(svg);
  const width = Math.max(size.width, TABLE_WIDTH + 24);
  plot.setAttribute('x', '0');
  plot.setAttribute('y', String(HEADER));
  plot.setAttribute('width', String(size.width));
  plot.setAttribute('height', String(size.height));
  if (!plot.getAttribute('viewBox')) plot.setAttribute('viewBox', `0 0 ${size.width} ${size.height}`);
  plot.removeAttribute('class');
  const tableTop = HEADER + size.height + 16;
  const height = tableTop + ROW * (chart.points.length + 2) + 8;

  const legend: string[] = [];
  let lx = 12;
  for (const item of chart.legend) {
    legend.push(`<rect x="${lx}" y="32" width="14" height="3" fill="${xml(item.color)}"/><text x="${lx + 20}" y="38" font-size="12">${xml(item.label)}</text>`);
    lx += 20 + item.label.length * 7 + 16;
  }
  const cells = (values: readonly (string | number)[], y: number, weight = 'normal') =>
    TABLE_COLUMNS.map(
      (column, i) => `<text x="${12 + column.x + column.dx}" y="${y}" text-anchor="${column.anchor}" font-weight="${weight}">${xml(values[i] ?? '')}</text>`,
    ).join('');
  const table = [
    cells(
      TABLE_COLUMNS.map((c) => c.head),
      tableTop + ROW,
      'bold',
    ),
    ...chart.points.map((p, i) =>
      cells([short(p.tau), p.deviation, short(p.value), short(p.ciLow), short(p.ciHigh), p.terms, p.edf.toFixed(1), p.noise], tableTop + ROW * (i + 2)),
    ),
  ];
  const descLines = chart.points.map(
    (p) =>
      `${p.deviation} at τ = ${p.tau} s (m = ${p.m}): ${p.value}; 95 % interval ${p.ciLow} to ${p.ciHigh}; ${p.terms} terms; edf ${p.edf}; noise ${p.noise}`,
  );
  const metadata = chart.points
    .map(
      (p) =>
        `<kc:point deviation="${xml(p.deviation)}" tau_s="${p.tau}" m="${p.m}" value="${p.value}" terms="${p.terms}" edf="${p.edf}" ci95_low="${p.ciLow}" ci95_high="${p.ciHigh}" noise="${xml(p.noise)}"/>`,
    )
    .join('\n    ');
  const serialised = new XMLSerializer().serializeToString(plot);
  const text = `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="${xml(chart.fontFamily)}" font-size="11" fill="${xml(chart.textColor)}">
  <title>${xml(chart.title)}</title>
  <desc>${xml([chart.description, `Vertical axis: ${chart.quantity}. Intervals at 95 %.`, ...descLines].join('\n'))}</desc>
  <metadata>
    <kc:points xmlns:kc="urn:kilocycle:stability-chart" quantity="${xml(chart.quantity)}" confidence="0.95">
    ${metadata}
    </kc:points>
  </metadata>
  <rect x="0" y="0" width="${width}" height="${height}" fill="${xml(chart.background)}"/>
  <text x="12" y="20" font-size="14" font-weight="bold">${xml(chart.title)}</text>
  ${legend.join('')}
  ${serialised}
  <g data-table="points">${table.join('')}</g>
</svg>
`;
  return { text, width, height };
}
