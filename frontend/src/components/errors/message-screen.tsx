import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';

type MessageScreenProps = {
  code?: string;
  title: string;
  children?: ReactNode;
  actions?: ReactNode;
};

/** A calm full-width panel for "not found", "not allowed" and "something broke". */
export function MessageScreen({ code, title, children, actions }: MessageScreenProps) {
  return (
    <Box sx={{ display: 'flex', justifyContent: 'center', py: { xs: 4, md: 8 }, px: 2 }}>
      <Paper variant="outlined" sx={{ p: 4, maxWidth: 520, width: '100%' }}>
        {code && (
          <Typography variant="overline" color="secondary.dark" sx={{ fontFamily: 'monospace' }}>
            {code}
          </Typography>
        )}
        <Typography variant="h1" component="h1" gutterBottom>
          {title}
        </Typography>
        {children && (
          <Typography component="div" color="text.secondary" sx={{ mb: 3 }}>
            {children}
          </Typography>
        )}
        {actions && <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }}>{actions}</Box>}
      </Paper>
    </Box>
  );
}
