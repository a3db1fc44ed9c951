import ArrowBackOutlined from '@mui/icons-material/ArrowBackOutlined';
import AttachFileOutlined from '@mui/icons-material/AttachFileOutlined';
import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Tab from '@mui/material/Tab';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableRow from '@mui/material/TableRow';
import Tabs from '@mui/material/Tabs';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { MailMessageView } from '@kilocycle/common/types';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { Num, numberSx } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { downloadFile } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';
import { formatDateTime } from '@/utils/format';
import { formatBytes } from '@/utils/measurement';
import { useMailMessage } from '../api/get-mail-message';
import { mailKindLabel } from '../utils/mail-kinds';

type View = 'html' | 'text' | 'headers';

async function save(path: string, name: string) {
  try {
    await downloadFile(path, name);
  } catch (error) {
    notify('error', error instanceof ApiError ? error.message : 'The file could not be downloaded.');
  }
}

/**
 * The HTML body in a sandboxed frame: no scripts, no forms, no same-origin access, and links cannot
 * navigate this page. The message is shown, never trusted.
 */
function HtmlBody({ html }: { html: string }) {
  return (
    <Box
      component="iframe"
      title="Message body (HTML)"
      sandbox=""
      srcDoc={html}
      referrerPolicy="no-referrer"
      sx={{ width: '100%', height: 520, border: 1, borderColor: 'divider', borderRadius: 1, bgcolor: '#fff' }}
    />
  );
}

function Body({ message }: { message: MailMessageView }) {
  const [view, setView] = useState<View>(message.html ? 'html' : 'text');
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Tabs value={view} onChange={(_e, v: View) => setView(v)} sx={{ mb: 1.5 }}>
        <Tab value="html" label="HTML" disabled={!message.html} />
        <Tab value="text" label="Plain text" disabled={!message.text} />
        <Tab value="headers" label="Headers" />
      </Tabs>
      {view === 'html' && message.html && <HtmlBody html={message.html} />}
      {view === 'text' && (
        <Box component="pre" sx={{ ...numberSx, whiteSpace: 'pre-wrap', wordBreak: 'break-word', m: 0, fontSize: '0.85rem' }}>
          {message.text ?? '(no plain-text part)'}
        </Box>
      )}
      {view === 'headers' && (
        <Table size="small" aria-label="Headers">
          <TableBody>
            {message.headers.map((h, index) => (
              <TableRow key={`${h.name}-${index}`}>
                <TableCell sx={{ color: 'text.secondary', whiteSpace: 'nowrap', verticalAlign: 'top', width: '1%' }}>{h.name}</TableCell>
                <TableCell sx={{ ...numberSx, whiteSpace: 'pre-wrap', wordBreak: 'break-all', fontSize: '0.8rem' }}>{h.value}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      )}
    </Paper>
  );
}

export function MailMessage({ id, outboxPath }: { id: number; outboxPath: string }) {
  const message = useMailMessage(id);
  if (message.isPending) return <FullPageSpinner label="Opening the message" />;
  if (message.isError) return <Alert severity="error">The message could not be opened: {message.error.message}</Alert>;
  const m = message.data;
  return (
    <Box sx={{ maxWidth: 1100 }}>
      <Button component={RouterLink} to={outboxPath} size="small" startIcon={<ArrowBackOutlined />} sx={{ mb: 1 }}>
        Outbox
      </Button>
      <Typography variant="h1" sx={{ mb: 1 }}>
        {m.subject || '(no subject)'}
      </Typography>
      <Paper variant="outlined" sx={{ p: 2, mb: 2 }}>
        <Box
          component="dl"
          sx={{ display: 'grid', gridTemplateColumns: 'max-content 1fr', columnGap: 2, rowGap: 0.5, m: 0, '& dt': { color: 'text.secondary' }, '& dd': { m: 0 } }}
        >
          <dt>From</dt>
          <dd>{m.from}</dd>
          <dt>To</dt>
          <dd>{m.to.join(', ')}</dd>
          <dt>Sent</dt>
          <dd>
            <Num>{formatDateTime(m.receivedAt)}</Num>
          </dd>
          <dt>Kind</dt>
          <dd>
            <Chip size="small" label={mailKindLabel(m.kind)} sx={{ height: 20 }} />
          </dd>
          <dt>Size</dt>
          <dd>
            <Num>{formatBytes(m.size)}</Num>
          </dd>
          {m.messageId && (
            <>
              <dt>Message-ID</dt>
              <dd>
                <Num sx={{ fontSize: '0.8rem' }}>{m.messageId}</Num>
              </dd>
            </>
          )}
        </Box>
        <Box sx={{ mt: 1.5, display: 'flex', gap: 1, flexWrap: 'wrap', alignItems: 'center' }}>
          {m.attachments.map((a, index) => (
            <Button
              key={index}
              size="small"
              variant="outlined"
              startIcon={<AttachFileOutlined fontSize="small" />}
              onClick={() => void save(`/mail/${m.id}/attachments/${index}`, a.filename ?? `attachment-${index}`)}
            >
              {a.filename ?? `attachment ${index + 1}`} · {a.contentType} · {formatBytes(a.size)}
            </Button>
          ))}
          <Button size="small" startIcon={<DownloadOutlined fontSize="small" />} onClick={() => void save(`/mail/${m.id}/raw`, `message-${m.id}.eml`)}>
            Original message (.eml)
          </Button>
        </Box>
      </Paper>
      <Body message={m} />
    </Box>
  );
}
