import ContentCopy from '@mui/icons-material/ContentCopy';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import IconButton from '@mui/material/IconButton';
import TextField from '@mui/material/TextField';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { useId, useState } from 'react';
import { numberSx } from '@/components/ui/num';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { notify } from '@/lib/notifications';

/** The command that streams a counter into a run with this token. */
export function bridgeCommand({ server, token, run, source }: { server: string; token: string; run: string; source: string }) {
  return `bin/kilocycle bridge --server ${server} --token ${token} --run ${run || 'RUN_ID'} --source ${source || 'SOURCE'}`;
}

async function copy(text: string, what: string) {
  try {
    await navigator.clipboard.writeText(text);
    notify('success', `${what} copied.`);
  } catch {
    notify('warning', `The browser would not copy; select the ${what.toLowerCase()} and copy it by hand.`);
  }
}

function CopyBox({ label, text }: { label: string; text: string }) {
  return (
    <Box>
      <Typography variant="caption" color="text.secondary">
        {label}
      </Typography>
      <Box
        sx={{
          display: 'flex',
          alignItems: 'flex-start',
          gap: 1,
          p: 1,
          bgcolor: 'grey.100',
          border: 1,
          borderColor: 'divider',
          borderRadius: 1,
        }}
      >
        <Box component="code" data-testid={label} sx={{ ...numberSx, whiteSpace: 'pre-wrap', wordBreak: 'break-all', flex: 1, fontSize: '0.8125rem' }}>
          {text}
        </Box>
        <Tooltip title={`Copy the ${label.toLowerCase()}`}>
          <IconButton size="small" aria-label={`Copy the ${label.toLowerCase()}`} onClick={() => void copy(text, label)}>
            <ContentCopy fontSize="small" />
          </IconButton>
        </Tooltip>
      </Box>
    </Box>
  );
}

type BenchTokenDialogProps = { benchName: string; token: string | null; onClose: () => void };

/** Shows a freshly issued bench token once, with the bridge command that uses it. */
export function BenchTokenDialog({ benchName, token, onClose }: BenchTokenDialogProps) {
  const titleId = useId();
  const [run, setRun] = useState('');
  const [source, setSource] = useState('scpi://127.0.0.1:5025');
  const server = window.location.origin;
  return (
    <Dialog open={token !== null} aria-labelledby={titleId} maxWidth="md" onClose={onClose}>
      <DialogTitle id={titleId}>Bridge token for {benchName}</DialogTitle>
      <DialogContent>
        <Alert severity="warning" sx={{ mb: 2 }}>
          This is the only time the token is shown: the lab keeps only a hash of it. Copy it to the bench computer now. The bench’s previous token no longer
          works.
        </Alert>
        {token && (
          <Box sx={{ display: 'grid', gap: 2 }}>
            <CopyBox label="Token" text={token} />
            <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '1fr 2fr' }, gap: 2 }}>
              <TextField
                label="Run number"
                value={run}
                onChange={(e) => setRun(e.target.value.replace(/\D/g, ''))}
                helperText="The run this bench streams into (shown on the run’s page)"
              />
              <TextField
                label="Source"
                value={source}
                onChange={(e) => setSource(e.target.value.trim())}
                helperText="scpi://host:5025, serial:/dev/ttyUSB0?baud=9600, stdin or simulate:warmup"
              />
            </Box>
            <CopyBox label="Command" text={bridgeCommand({ server, token, run, source })} />
            <SafetyCaution />
          </Box>
        )}
      </DialogContent>
      <DialogActions>
        <Button variant="contained" onClick={onClose}>
          I have copied it
        </Button>
      </DialogActions>
    </Dialog>
  );
}
