import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import type { Instrument } from '@kilocycle/common/types';
import { DueChip } from '@/components/ui/due-chip';
import { Num } from '@/components/ui/num';
import { formatDate } from '@/utils/format';

function Field({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Box>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Typography variant="body2" component="div">
        {children}
      </Typography>
    </Box>
  );
}

/** Who owns the instrument and how it is identified, with its recall. */
export function InstrumentSummary({ instrument, actions }: { instrument: Instrument; actions?: ReactNode }) {
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', mb: 1 }}>
        <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
          Identification
        </Typography>
        {actions}
      </Box>
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr 1fr', md: 'repeat(4, 1fr)' }, gap: 2 }}>
        <Field label="Owner">{instrument.organizationName}</Field>
        <Field label="Make and model">
          {instrument.make} {instrument.model}
        </Field>
        <Field label="Serial number">
          <Num>{instrument.serial}</Num>
        </Field>
        <Field label="Asset tag">
          <Num>{instrument.assetTag ?? '—'}</Num>
        </Field>
        <Field label="Recall interval">
          <Num>{instrument.recallIntervalMonths}</Num> months
        </Field>
        <Field label="Next due">
          <Box component="span" sx={{ display: 'inline-flex', gap: 1, alignItems: 'center' }}>
            <Num>{formatDate(instrument.nextDueDate)}</Num>
            <DueChip date={instrument.nextDueDate} />
          </Box>
        </Field>
        <Field label="Recorded">
          <Num>{formatDate(instrument.createdAt)}</Num>
        </Field>
      </Box>
      {instrument.description && (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 2 }}>
          {instrument.description}
        </Typography>
      )}
    </Paper>
  );
}
