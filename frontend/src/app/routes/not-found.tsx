import Box from '@mui/material/Box';
import { NotFound } from '@/components/errors/not-found';
import { Logo } from '@/components/layouts/logo';

export default function NotFoundRoute() {
  return (
    <Box sx={{ minHeight: '100vh', bgcolor: 'background.default' }}>
      <Box sx={{ bgcolor: 'primary.main', color: 'primary.contrastText', px: 3, py: 1.5 }}>
        <Logo />
      </Box>
      <NotFound />
    </Box>
  );
}
