import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { Logo } from '@/components/layouts/logo';

/** The public pages: no navigation and no account, just the lab's mark and the page. */
export function PublicLayout({ children, homePath }: { children: ReactNode; homePath: string }) {
  return (
    <Box sx={{ minHeight: '100vh', bgcolor: 'background.default', display: 'flex', flexDirection: 'column' }}>
      <Box component="header" sx={{ bgcolor: 'primary.main', color: 'primary.contrastText', px: 3, py: 1.5 }}>
        <Link component={RouterLink} to={homePath} color="inherit" underline="none" aria-label="Kilocycle certificate verification">
          <Logo />
        </Link>
      </Box>
      <Box component="main" sx={{ flex: 1, width: '100%', maxWidth: 820, mx: 'auto', px: { xs: 2, md: 3 }, py: { xs: 3, md: 4 } }}>
        {children}
      </Box>
      <Typography component="footer" variant="caption" color="text.secondary" sx={{ textAlign: 'center', py: 2 }}>
        This page shows whether a calibration certificate is genuine and current. It holds no measurement data.
      </Typography>
    </Box>
  );
}
