import ImageOutlined from '@mui/icons-material/ImageOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useRef, type ReactNode } from 'react';
import { saveBlob, saveText } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';
import { svgToPng } from '@/utils/chart-image';
import { chartToSvg, findChartSvg, slug, type LegendEntry } from '../utils/chart-export';

type ChartPanelProps = { title: string; fileTitle: string; legend: readonly LegendEntry[]; note?: ReactNode; actions?: ReactNode; children: ReactNode };

function LegendSwatch({ entry }: { entry: LegendEntry }) {
  return (
    <Box component="li" sx={{ display: 'inline-flex', alignItems: 'center', gap: 0.75, mr: 2 }}>
      <svg width="22" height="8" aria-hidden>
        <line x1="0" y1="4" x2="22" y2="4" stroke={entry.color} strokeWidth="2.5" strokeDasharray={entry.dashed ? '5 3' : undefined} />
      </svg>
      <Typography variant="body2" component="span">
        {entry.label}
      </Typography>
    </Box>
  );
}

/** A plot with its own legend and the two ways out: SVG (vectors, for reports) and PNG (for mail and slides). */
export function ChartPanel({ title, fileTitle, legend, note, actions, children }: ChartPanelProps) {
  const chart = useRef<HTMLDivElement>(null);

  const svgText = () => {
    const svg = chart.current ? findChartSvg(chart.current) : null;
    if (!svg) throw new Error('The chart is not drawn yet');
    return chartToSvg(svg, { title: `${fileTitle}: ${title}`, legend });
  };
  const exportSvg = () => {
    try {
      saveText(svgText(), `${slug(fileTitle)}-${slug(title)}.svg`, 'image/svg+xml;charset=utf-8');
    } catch (error) {
      notify('error', error instanceof Error ? error.message : 'The chart could not be exported.');
    }
  };
  const exportPng = async () => {
    try {
      saveBlob(await svgToPng(svgText()), `${slug(fileTitle)}-${slug(title)}.png`);
    } catch (error) {
      notify('error', error instanceof Error ? error.message : 'The chart could not be exported.');
    }
  };

  return (
    <Paper variant="outlined" component="section" aria-label={title} sx={{ p: 2, minWidth: 0 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap', mb: 0.5 }}>
        <Typography variant="h3" component="h3" sx={{ flex: 1 }}>
          {title}
        </Typography>
        {actions}
        <Button size="small" startIcon={<ImageOutlined fontSize="small" />} onClick={exportSvg} aria-label={`${title} as SVG`}>
          SVG
        </Button>
        <Button size="small" startIcon={<ImageOutlined fontSize="small" />} onClick={() => void exportPng()} aria-label={`${title} as PNG`}>
          PNG
        </Button>
      </Box>
      <Box component="ul" sx={{ listStyle: 'none', p: 0, m: 0, mb: 0.5 }}>
        {legend.map((entry) => (
          <LegendSwatch key={entry.label} entry={entry} />
        ))}
      </Box>
      <div ref={chart}>{children}</div>
      {note && (
        <Typography variant="caption" color="text.secondary" component="p" sx={{ mt: 0.5 }}>
          {note}
        </Typography>
      )}
    </Paper>
  );
}
