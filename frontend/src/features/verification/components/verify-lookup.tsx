import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useState, type FormEvent } from 'react';

/** Type the number printed on a certificate to see whether it is valid. */
export function VerifyLookup({ initialNumber = '', onLookup }: { initialNumber?: string; onLookup: (number: string) => void }) {
  const [number, setNumber] = useState(initialNumber);
  const [problem, setProblem] = useState<string | null>(null);
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const cleaned = number.trim().toUpperCase();
    if (!cleaned) {
      setProblem('Type the certificate number, as printed at the top of every page');
      return;
    }
    onLookup(cleaned);
  };
  return (
    <Paper variant="outlined" sx={{ p: 3 }}>
      <Typography variant="h1" sx={{ mb: 1 }}>
        Verify a calibration certificate
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 2 }}>
        The number is printed at the top of every page of the certificate, and the QR code on it leads here too.
      </Typography>
      <Box component="form" noValidate onSubmit={submit} sx={{ display: 'flex', gap: 1.5, alignItems: 'flex-start', flexWrap: 'wrap' }}>
        <TextField
          label="Certificate number"
          placeholder="e.g. QL-2026-0001"
          value={number}
          onChange={(e) => {
            setNumber(e.target.value);
            setProblem(null);
          }}
          error={problem !== null}
          helperText={problem ?? ' '}
          autoFocus
          sx={{ flex: '1 1 16rem', '& input': { fontFamily: '"Roboto Mono", monospace' } }}
        />
        <Button type="submit" variant="contained" sx={{ mt: 0.25 }}>
          Look it up
        </Button>
      </Box>
    </Paper>
  );
}
