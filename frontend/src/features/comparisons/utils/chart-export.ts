// A chart leaves the page as a file of its own: its <svg> with the styles that the page's CSS gave it
// written inline, a title and the legend added above (the chart's legend is HTML, outside the svg).
import { escapeXml, inlineStyles } from '@/utils/chart-image';

const SVG_NS = 'http://www.w3.org/2000/svg';

export type LegendEntry = { label: string; color: string; dashed?: boolean };

/** The chart's drawing: the largest svg inside the container (icons and legend marks are small ones). */
export function findChartSvg(container: HTMLElement): SVGSVGElement | null {
  const candidates = Array.from(container.querySelectorAll('svg'));
  let best: SVGSVGElement | null = null;
  let bestCount = -1;
  for (const svg of candidates) {
    const count = svg.querySelectorAll('*').length;
    if (count > bestCount) {
      best = svg;
      bestCount = count;
    }
  }
  return best;
}

/** A standalone SVG document of the chart, with a title and the legend drawn above it. */
export function chartToSvg(svg: SVGSVGElement, { title, legend }: { title: string; legend: readonly LegendEntry[] }): string {
  const box = svg.getBoundingClientRect();
  const width = Math.max(1, Math.round(box.width || svg.viewBox.baseVal?.width || 600));
  const height = Math.max(1, Math.round(box.height || svg.viewBox.baseVal?.height || 300));
  const clone = svg.cloneNode(true) as SVGSVGElement;
  inlineStyles(svg, clone);
  clone.removeAttribute('class');
  clone.removeAttribute('aria-hidden');
  clone.setAttribute('x', '0');
  clone.setAttribute('width', String(width));
  clone.setAttribute('height', String(height));

  // Legend entries flow left to right, wrapping at the chart's width.
  const font = 'font-family="Roboto, Arial, sans-serif" font-size="12" fill="#262c30"';
  const items: string[] = [];
  let x = 12;
  let y = 48;
  for (const entry of legend) {
    const itemWidth = 34 + entry.label.length * 6.6;
    if (x + itemWidth > width && x > 12) {
      x = 12;
      y += 18;
    }
    items.push(
      `<line x1="${x}" y1="${y - 4}" x2="${x + 22}" y2="${y - 4}" stroke="${escapeXml(entry.color)}" stroke-width="2.5"${entry.dashed ? ' stroke-dasharray="5 3"' : ''}/>` +
        `<text x="${x + 28}" y="${y}" ${font}>${escapeXml(entry.label)}</text>`,
    );
    x += itemWidth + 12;
  }
  const header = y + 14;
  clone.setAttribute('y', String(header));
  const total = header + height;
  const serializer = new XMLSerializer();
  return [
    `<?xml version="1.0" encoding="UTF-8"?>`,
    `<svg xmlns="${SVG_NS}" xmlns:xlink="http://www.w3.org/1999/xlink" width="${width}" height="${total}" viewBox="0 0 ${width} ${total}">`,
    `<rect width="100%" height="100%" fill="#ffffff"/>`,
    `<text x="12" y="22" font-family="Roboto, Arial, sans-serif" font-size="15" font-weight="500" fill="#262c30">${escapeXml(title)}</text>`,
    ...items,
    serializer.serializeToString(clone),
    `</svg>`,
  ].join('\n');
}

/** A file name from a title: lower case, words joined by hyphens. */
export function slug(text: string): string {
  return (
    text
      .toLowerCase()
      .normalize('NFKD')
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'chart'
  );
}
