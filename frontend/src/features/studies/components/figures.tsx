import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { Num } from '@/components/ui/num';

/** A label and a monospaced value, for the figure lists beside the study charts. */
export function Figure({ label, value, detail, testId }: { label: string; value: ReactNode; detail?: ReactNode; testId?: string }) {
  return (
    <Box sx={{ display: 'contents' }}>
      <Typography variant="body2" color="text.secondary" component="dt" sx={{ whiteSpace: 'nowrap' }}>
        {label}
      </Typography>
      <Typography variant="body2" component="dd" sx={{ m: 0, textAlign: 'right' }} data-testid={testId}>
        <Num>{value}</Num>
        {detail && (
          <Typography variant="caption" color="text.secondary" component="div">
            <Num sx={{ whiteSpace: 'normal' }}>{detail}</Num>
          </Typography>
        )}
      </Typography>
    </Box>
  );
}

export function Figures({ children }: { children: ReactNode }) {
  return (
    <Box component="dl" sx={{ display: 'grid', gridTemplateColumns: 'auto 1fr', columnGap: 2, rowGap: 0.5, m: 0 }}>
      {children}
    </Box>
  );
}
