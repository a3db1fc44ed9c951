import Box from '@mui/material/Box';
import { NotFound } from '@/components/errors/not-found';

export default function NotFoundRoute() {
  return (
    <Box sx={{ minHeight: '100vh', bgcolor: 'background.default' }}>
      <NotFound />
    </Box>
  );
}
