import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ImportReport } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { saveText } from '@/lib/file-transfer';
import { rejectionsCsv } from '../utils/csv-preview';

const SHOWN = 200;

/** Each refused row with its line in the file, the column and the reason; all of them as a CSV report. */
export function RejectionsTable({ report, fileName }: { report: ImportReport; fileName: string }) {
  if (report.rejected.length === 0) return null;
  const shown = report.rejected.slice(0, SHOWN);
  return (
    <Box sx={{ mt: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, mb: 0.5 }}>
        <Typography variant="h4" component="h3" sx={{ flex: 1 }}>
          {report.rejectedCount === 1 ? '1 row refused' : `${report.rejectedCount.toLocaleString('en-GB')} rows refused`}
        </Typography>
        <Button
          size="small"
          variant="outlined"
          startIcon={<DownloadOutlined fontSize="small" />}
          onClick={() => saveText(rejectionsCsv(report.rejected), `${fileName.replace(/\.[^.]+$/, '')}-import-report.csv`)}
        >
          Download report
        </Button>
      </Box>
      <Box
        tabIndex={0}
        role="region"
        aria-label="Refused rows, scrollable"
        sx={{ maxHeight: 320, overflow: 'auto', border: 1, borderColor: 'divider', borderRadius: 1 }}
      >
        <Table size="small" stickyHeader aria-label="Refused rows" sx={{ '& td, & th': { py: 0.25, px: 1 } }}>
          <TableHead>
            <TableRow>
              <TableCell sx={{ textAlign: 'right', width: 80 }}>Line</TableCell>
              <TableCell sx={{ width: 180 }}>Column</TableCell>
              <TableCell>Reason</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {shown.map((r, i) => (
              <TableRow key={`${r.line}-${r.column}-${i}`}>
                <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{r.line}</TableCell>
                <TableCell>{r.column}</TableCell>
                <TableCell>{r.reason}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
      {(report.rejected.length > SHOWN || report.rejectedCount > report.rejected.length) && (
        <Typography variant="caption" color="text.secondary">
          {SHOWN} shown here; the report lists {report.rejected.length.toLocaleString('en-GB')}
          {report.rejectedCount > report.rejected.length ? ` of ${report.rejectedCount.toLocaleString('en-GB')}` : ''}.
        </Typography>
      )}
    </Box>
  );
}
