import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ImportColumn } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import type { ColumnMapping, CsvPreview } from '../utils/csv-preview';

export const COLUMN_LABELS: Record<ImportColumn, string> = {
  time: 'Time',
  dial: 'Dial setting',
  frequency: 'Frequency',
  unit: 'Unit',
  aux: 'Supply volts or key',
};

const DELIMITER_NAMES = { ',': 'commas', '\t': 'tabs', ';': 'semicolons' } as const;

/** The file's first rows as read here, each column marked with what it is mapped to. */
export function CsvPreviewTable({ preview, mapping }: { preview: CsvPreview; mapping: ColumnMapping }) {
  const usedAs = (header: string) =>
    (Object.entries(mapping) as Array<[ImportColumn, string]>).filter(([, name]) => name !== '' && name === header).map(([column]) => column);
  return (
    <Box>
      <Typography variant="caption" color="text.secondary">
        Columns separated by {DELIMITER_NAMES[preview.delimiter]}; the first {preview.rows.length} rows
        {preview.more ? ' (the file goes on)' : ''}.
      </Typography>
      <Box
        tabIndex={0}
        role="region"
        aria-label="Preview of the file, scrollable"
        sx={{ maxHeight: 300, overflow: 'auto', border: 1, borderColor: 'divider', borderRadius: 1, mt: 0.5 }}
      >
        <Table size="small" stickyHeader aria-label="Preview of the file" sx={{ '& td, & th': { py: 0.25, px: 1, whiteSpace: 'nowrap' } }}>
          <TableHead>
            <TableRow>
              <TableCell sx={{ color: 'text.secondary', width: 48 }}>Line</TableCell>
              {preview.header.map((name, i) => (
                <TableCell key={`${name}-${i}`}>
                  <Box sx={{ display: 'flex', gap: 0.5, alignItems: 'center' }}>
                    <span>{name || `(column ${i + 1})`}</span>
                    {usedAs(name).map((column) => (
                      <Chip key={column} size="small" color="primary" label={COLUMN_LABELS[column]} sx={{ height: 18, fontSize: '0.7rem' }} />
                    ))}
                  </Box>
                </TableCell>
              ))}
            </TableRow>
          </TableHead>
          <TableBody>
            {preview.rows.map((row) => (
              <TableRow key={row.line}>
                <TableCell sx={{ ...numberSx, color: 'text.secondary' }}>{row.line}</TableCell>
                {preview.header.map((_, c) => (
                  <TableCell key={c} sx={{ ...numberSx, fontSize: '0.8125rem' }}>
                    {row.cells[c] ?? ''}
                  </TableCell>
                ))}
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
    </Box>
  );
}
