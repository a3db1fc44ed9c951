import ArrowBackOutlined from '@mui/icons-material/ArrowBackOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import EditOutlined from '@mui/icons-material/EditOutlined';
import TuneOutlined from '@mui/icons-material/TuneOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { SavedComparison as Saved } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { PageHeader } from '@/components/ui/page-header';
import { notify } from '@/lib/notifications';
import { formatDateTime } from '@/utils/format';
import { useDeleteComparison } from '../api/delete-comparison';
import { getComparisonQueryOptions, useComparison } from '../api/get-comparison';
import { getComparisonResultQueryOptions, useComparisonResult } from '../api/get-comparison-result';
import { useSaveComparison } from '../api/save-comparison';
import { ComparisonBuilder } from './comparison-builder';
import { ComparisonResultView } from './comparison-result';
import { SaveComparisonDialog } from './save-comparison-dialog';

type SavedComparisonProps = { id: number; listPath: string; canEdit: boolean; onDeleted: () => void };

/** A saved comparison, computed afresh from its runs, with its title and notes. */
export function SavedComparison({ id, listPath, canEdit, onDeleted }: SavedComparisonProps) {
  const queryClient = useQueryClient();
  const saved = useComparison(id);
  const result = useComparisonResult(id);
  const [mode, setMode] = useState<'view' | 'runs' | 'text' | 'delete'>('view');
  const afterSave = async (changed: Saved) => {
    queryClient.setQueryData(getComparisonQueryOptions(changed.id).queryKey, changed);
    await queryClient.invalidateQueries({ queryKey: getComparisonResultQueryOptions(changed.id).queryKey });
    notify('success', `“${changed.title}” saved.`);
    setMode('view');
  };
  const save = useSaveComparison({ onSuccess: (changed) => void afterSave(changed) });
  const remove = useDeleteComparison({
    onSuccess: () => {
      notify('success', 'The comparison is deleted; its runs are unchanged.');
      onDeleted();
    },
  });

  if (saved.isPending) return <FullPageSpinner label="Opening the comparison" />;
  if (saved.isError) return <Alert severity="error">The comparison could not be opened: {saved.error.message}</Alert>;
  const comparison = saved.data;

  return (
    <Box>
      <Button component={RouterLink} to={listPath} size="small" startIcon={<ArrowBackOutlined />} sx={{ mb: 1 }}>
        Comparisons
      </Button>
      <PageHeader
        title={comparison.title}
        description={`${comparison.instrumentLabel} · saved by ${comparison.createdByName}, ${formatDateTime(comparison.updatedAt)}`}
        actions={
          canEdit && (
            <>
              <Button startIcon={<EditOutlined />} onClick={() => setMode('text')}>
                Title and notes
              </Button>
              <Button startIcon={<TuneOutlined />} onClick={() => setMode(mode === 'runs' ? 'view' : 'runs')}>
                {mode === 'runs' ? 'Back to the result' : 'Change runs or labels'}
              </Button>
              <Button color="error" startIcon={<DeleteOutlined />} onClick={() => setMode('delete')}>
                Delete
              </Button>
            </>
          )
        }
      />
      {comparison.notes && (
        <Typography sx={{ mb: 2, whiteSpace: 'pre-wrap', maxWidth: 960 }} color="text.secondary">
          {comparison.notes}
        </Typography>
      )}
      {mode === 'runs' ? (
        <ComparisonBuilder existing={comparison} canSave={canEdit} onSaved={(changed) => void afterSave(changed)} />
      ) : result.isPending ? (
        <Box sx={{ display: 'flex', gap: 1.5, alignItems: 'center' }} role="status">
          <CircularProgress size={20} /> Computing the comparison…
        </Box>
      ) : result.isError ? (
        <Alert severity="error">The comparison could not be computed: {result.error.message}</Alert>
      ) : (
        <ComparisonResultView result={result.data} fileTitle={comparison.title} />
      )}
      <SaveComparisonDialog
        key={mode === 'text' ? 'text' : 'closed'}
        open={mode === 'text'}
        heading="Title and notes"
        initialTitle={comparison.title}
        initialNotes={comparison.notes ?? ''}
        busy={save.isPending}
        error={save.error}
        onClose={() => setMode('view')}
        onSave={({ title, notes }) => save.mutate({ id, body: { title, notes } })}
      />
      <ConfirmDialog
        open={mode === 'delete'}
        title="Delete this comparison?"
        confirmLabel="Delete"
        destructive
        busy={remove.isPending}
        onClose={() => setMode('view')}
        onConfirm={() => remove.mutate(id)}
      >
        “{comparison.title}” is removed from the saved comparisons. The runs and their readings stay as they are.
      </ConfirmDialog>
    </Box>
  );
}
