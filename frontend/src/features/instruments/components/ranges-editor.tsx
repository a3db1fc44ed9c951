import AddIcon from '@mui/icons-material/Add';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import type { Instrument, InstrumentRange, RangeInput } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Num } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { formatHz } from '@/utils/frequency';
import { useUpdateInstrument } from '../api/update-instrument';
import { describeDialSpan, describeTolerance, toDraft, type RangeDraft } from '../utils/range-draft';
import { RangeDialog } from './range-dialog';

function toInput({ position: _position, ...range }: InstrumentRange): RangeInput {
  return range;
}

function describeLaw(range: InstrumentRange) {
  return range.dialLaw.kind === 'direct' ? 'Direct reading' : `Table, ${range.dialLaw.points.length} points`;
}

type RangesEditorProps = { instrument: Instrument; canEdit: boolean };

/** The instrument's ranges; lab staff add, change and remove them (the whole list is saved at once). */
export function RangesEditor({ instrument, canEdit }: RangesEditorProps) {
  const [editing, setEditing] = useState<{ draft: RangeDraft | null; index: number | null } | null>(null);
  const [removing, setRemoving] = useState<InstrumentRange | null>(null);
  const update = useUpdateInstrument({
    onSuccess: () => {
      setEditing(null);
      setRemoving(null);
      notify('success', 'Ranges saved.');
    },
  });

  const save = (ranges: RangeInput[]) => update.mutate({ id: instrument.id, changes: { ranges } });

  const onSave = (range: RangeInput) => {
    const current = instrument.ranges.map(toInput);
    const index = editing?.index ?? null;
    save(index === null ? [...current, range] : current.map((r, i) => (i === index ? range : r)));
  };

  const messages = update.error instanceof ApiError ? update.error.messages : update.error ? ['The ranges could not be saved.'] : [];

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', mb: 1 }}>
        <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
          Ranges
        </Typography>
        {canEdit && (
          <Button
            size="small"
            startIcon={<AddIcon />}
            onClick={() => {
              update.reset();
              setEditing({ draft: null, index: null });
            }}
          >
            Add range
          </Button>
        )}
      </Box>
      {instrument.ranges.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          No ranges yet. {canEdit ? 'Add one for each position of the range switch.' : ''}
        </Typography>
      ) : (
        <Box sx={{ overflowX: 'auto' }}>
          {/* Figures stay on one line; the label and the law may wrap, so the row fits and its actions stay in view. */}
          <Table
            size="small"
            aria-label="Ranges"
            sx={{ '& td, & th': { whiteSpace: 'nowrap', px: 1 }, '& td.wraps': { whiteSpace: 'pre-wrap', minWidth: 96 } }}
          >
            <TableHead>
              <TableRow>
                <TableCell>#</TableCell>
                <TableCell>Label</TableCell>
                <TableCell>Dial</TableCell>
                <TableCell>Dial law</TableCell>
                <TableCell>Frequency span</TableCell>
                <TableCell>Tolerance</TableCell>
                <TableCell>Multipliers</TableCell>
                {canEdit && (
                  <TableCell align="right">
                    {/* Named for screen readers; the icons below say it to the eye. */}
                    <Box
                      component="span"
                      sx={{
                        position: 'absolute',
                        width: '1px',
                        height: '1px',
                        margin: '-1px',
                        overflow: 'hidden',
                        clip: 'rect(0 0 0 0)',
                        whiteSpace: 'nowrap',
                      }}
                    >
                      Actions
                    </Box>
                  </TableCell>
                )}
              </TableRow>
            </TableHead>
            <TableBody>
              {instrument.ranges.map((range, index) => (
                <TableRow key={range.id} hover>
                  <TableCell>
                    <Num>{range.position}</Num>
                  </TableCell>
                  <TableCell className="wraps">{range.label}</TableCell>
                  <TableCell>
                    <Num>{describeDialSpan(range)}</Num>
                  </TableCell>
                  <TableCell className="wraps">{describeLaw(range)}</TableCell>
                  <TableCell>
                    <Num>
                      {formatHz(range.freqMinHz)} – {formatHz(range.freqMaxHz)}
                    </Num>
                  </TableCell>
                  <TableCell>
                    <Num>{describeTolerance(range.tolerance)}</Num>
                  </TableCell>
                  <TableCell>
                    <Num>{range.multipliers.map((m) => `×${m}`).join(' ')}</Num>
                  </TableCell>
                  {canEdit && (
                    <TableCell align="right" sx={{ py: 0, width: '1%' }}>
                      <Tooltip title="Edit range">
                        <IconButton
                          size="small"
                          aria-label={`Edit range ${range.label}`}
                          onClick={() => {
                            update.reset();
                            setEditing({ draft: toDraft(range), index });
                          }}
                        >
                          <EditOutlined fontSize="small" />
                        </IconButton>
                      </Tooltip>
                      <Tooltip title="Remove range">
                        <IconButton size="small" color="error" aria-label={`Remove range ${range.label}`} onClick={() => setRemoving(range)}>
                          <DeleteOutlined fontSize="small" />
                        </IconButton>
                      </Tooltip>
                    </TableCell>
                  )}
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}
      <RangeDialog
        open={editing !== null}
        initial={editing?.draft ?? null}
        busy={update.isPending}
        error={update.error}
        onClose={() => setEditing(null)}
        onSave={onSave}
      />
      <ConfirmDialog
        open={removing !== null}
        title="Remove this range?"
        confirmLabel="Remove"
        destructive
        busy={update.isPending}
        onClose={() => setRemoving(null)}
        onConfirm={() => removing && save(instrument.ranges.filter((r) => r.id !== removing.id).map(toInput))}
      >
        {removing && (
          <>
            Range <strong>{removing.label}</strong> goes from this instrument. A range that already has runs cannot be removed: its record stays with those
            runs.
            {messages.length > 0 && <Box sx={{ color: 'error.main', mt: 1 }}>{messages.join('; ')}</Box>}
          </>
        )}
      </ConfirmDialog>
    </Paper>
  );
}
