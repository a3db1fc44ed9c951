import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useId } from 'react';
import type { AuditEventView, Run } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';
import { formatNumber } from '@/utils/frequency';
import { useRunCorrections } from '../api/get-run-corrections';
import { useRunImports } from '../api/get-run-imports';
import { RunCorrections } from './run-corrections';

const count = (value: unknown) => (typeof value === 'number' && Number.isFinite(value) ? value : 0);
const plural = (n: number, one: string, many: string) => `${formatNumber(n, 0)} ${n === 1 ? one : many}`;

/** One import as its audit event records it: the file, the mode, what was imported and what was skipped. */
export function importSummary(event: AuditEventView): string {
  const c = event.changes ?? {};
  const file = typeof c.file === 'string' ? `“${c.file}”` : 'a file';
  const imported = plural(count(c.imported), 'reading', 'readings');
  const skipped = count(c.skipped);
  const rows = plural(count(c.rows), 'row', 'rows');
  const tail = skipped === 0 ? 'none skipped' : `${plural(skipped, 'row', 'rows')} skipped, listed in the notes above`;
  return `${file}: ${imported} imported of ${rows}, ${tail}${c.mode === 'valid' ? ' (valid rows only)' : ''}`;
}

/**
 * The run's Notes panel (lab staff): the run's notes as written (the import reports with their skipped rows are
 * appended there), each import of a file, and the corrections of the run's details. Nothing when all are empty.
 */
export function RunNotes({ run }: { run: Run }) {
  const headingId = useId();
  const imports = useRunImports({ runId: run.id });
  const corrections = useRunCorrections({ runId: run.id });
  const notes = run.notes?.trim() ?? '';
  const importItems = imports.data?.items ?? [];
  const hasCorrections = (corrections.data?.items.length ?? 0) > 0;
  if (!notes && importItems.length === 0 && !hasCorrections) return null;
  return (
    <Paper variant="outlined" component="section" aria-labelledby={headingId} sx={{ p: 1.5, mt: 1.5 }} data-testid="run-notes">
      <Typography variant="subtitle2" component="h2" id={headingId} sx={{ mb: 0.5 }}>
        Notes
      </Typography>
      {notes ? (
        <Typography
          variant="body2"
          component="div"
          data-testid="run-notes-text"
          // A long list of skipped rows scrolls: the box takes the focus so the keyboard scrolls it too.
          tabIndex={0}
          role="region"
          aria-label="Run notes"
          sx={{ whiteSpace: 'pre-wrap', overflowWrap: 'anywhere', maxHeight: 220, overflow: 'auto' }}
        >
          {notes}
        </Typography>
      ) : (
        <Typography variant="body2" color="text.secondary">
          No notes.
        </Typography>
      )}
      {importItems.length > 0 && (
        <Box component="section" aria-label="Imports into this run" sx={{ mt: 1 }}>
          <Typography variant="subtitle2" component="h3" sx={{ mb: 0.5 }}>
            Imports
          </Typography>
          <Box component="ul" sx={{ m: 0, pl: 2.5, display: 'grid', gap: 0.5 }}>
            {importItems.map((event) => (
              <Typography component="li" variant="body2" key={event.id}>
                <Num>{formatDateTime(event.at)}</Num>, {event.actorName ?? 'the system'}: {importSummary(event)}
              </Typography>
            ))}
          </Box>
        </Box>
      )}
      <RunCorrections runId={run.id} embedded />
    </Paper>
  );
}
