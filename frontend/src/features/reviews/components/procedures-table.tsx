import AddOutlined from '@mui/icons-material/AddOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import type { Procedure } from '@kilocycle/common/types';
import { HiddenLabel } from '@/components/ui/hidden-label';
import { ActiveChip } from '@/components/ui/status-chip';
import { numberSx } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';
import { useProcedures } from '../api/get-procedures';
import { DECISION_RULE_LABELS } from '../utils/results-format';
import { ProcedureDialog } from './procedure-dialog';

/** The lab's procedures: the decision rule and the budget defaults every run starts from. */
export function ProceduresTable({ canEdit }: { canEdit: boolean }) {
  const procedures = useProcedures();
  const [editing, setEditing] = useState<Procedure | 'new' | null>(null);
  const items = procedures.data?.items ?? [];
  return (
    <>
      {canEdit && (
        <Box sx={{ mb: 1.5 }}>
          <Button variant="contained" startIcon={<AddOutlined />} onClick={() => setEditing('new')}>
            New procedure
          </Button>
        </Box>
      )}
      <Paper variant="outlined" sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label="Procedures">
          <TableHead>
            <TableRow>
              <TableCell>Procedure</TableCell>
              <TableCell>Decision rule</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Half a dial division</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Drift allowance</TableCell>
              <TableCell>Extra components</TableCell>
              <TableCell>Status</TableCell>
              <TableCell>Changed</TableCell>
              <TableCell>
                <HiddenLabel>Actions</HiddenLabel>
              </TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {procedures.isPending && (
              <TableRow>
                <TableCell colSpan={8}>Loading…</TableCell>
              </TableRow>
            )}
            {items.map((p) => (
              <TableRow key={p.id} hover>
                <TableCell>
                  <Typography variant="body2" sx={{ fontWeight: 500 }}>
                    {p.name} {p.isDefault && <Chip size="small" color="primary" variant="outlined" label="default" sx={{ height: 18, fontSize: '0.7rem' }} />}
                  </Typography>
                </TableCell>
                <TableCell>{DECISION_RULE_LABELS[p.decisionRule]}</TableCell>
                <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{p.dialHalfDivisionPercentOfSpan} % of span</TableCell>
                <TableCell sx={{ ...numberSx, textAlign: 'right' }}>
                  ±{p.driftPpm} ppm{p.driftHz ? ` + ${p.driftHz} Hz` : ''}
                </TableCell>
                <TableCell>{p.extraComponents.length === 0 ? '—' : p.extraComponents.map((c) => c.name).join('; ')}</TableCell>
                <TableCell>
                  <ActiveChip active={p.active} />
                </TableCell>
                <TableCell sx={numberSx}>
                  v{p.version} · {formatDateTime(p.updatedAt)}
                </TableCell>
                <TableCell sx={{ textAlign: 'right' }}>
                  <Button size="small" onClick={() => setEditing(p)} aria-label={`${canEdit ? 'Edit' : 'Open'} ${p.name}`}>
                    {canEdit ? 'Edit' : 'Open'}
                  </Button>
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Paper>
      {editing && <ProcedureDialog procedure={editing === 'new' ? null : editing} canEdit={canEdit} onClose={() => setEditing(null)} />}
    </>
  );
}
