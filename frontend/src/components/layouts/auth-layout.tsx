import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { Logo } from './logo';

export function AuthLayout({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Box
      sx={{
        minHeight: '100vh',
        display: 'flex',
        alignItems: 'center',
        justifyContent: 'center',
        p: 2,
        background: (t) => `linear-gradient(160deg, ${t.palette.primary.dark} 0%, ${t.palette.primary.main} 55%, #2b3a3f 100%)`,
      }}
    >
      {/* The page's one main landmark holds everything, so nothing sits outside a landmark. */}
      <Box component="main" sx={{ width: '100%', maxWidth: 400 }}>
        <Box sx={{ mb: 2, display: 'flex', justifyContent: 'center' }}>
          <Logo color="#ffffff" />
        </Box>
        <Paper sx={{ p: { xs: 3, sm: 4 } }} elevation={3}>
          <Typography variant="h2" component="h1" gutterBottom>
            {title}
          </Typography>
          {children}
        </Paper>
        <Typography variant="caption" component="p" sx={{ mt: 2, color: 'rgba(255,255,255,0.75)', textAlign: 'center' }}>
          Calibration records, drift studies and certificates for the lab and its customers.
        </Typography>
      </Box>
    </Box>
  );
}
