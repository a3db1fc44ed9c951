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
 * Put first in the frame's document: nothing is fetched from anywhere (no tracking pixel, no remote style),
 * only inline styles and embedded images show.
 */
export const MAIL_FRAME_POLICY = `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`;

/** The policy goes after any doctype (a tag before it would put the page in quirks mode), so it lands in the head. */
export function withFramePolicy(html: string): string {
  const doctype = /^\s*<!doctype[^>]*>/i.exec(html);
  return doctype ? doctype[0] + MAIL_FRAME_POLICY + html.slice(doctype[0].length) : MAIL_FRAME_POLICY + html;
}

/**
 * The HTML body in a sandboxed frame: no scripts, no forms, no same-origin access, and links cannot
 * navigate this page; a content policy lets it load nothing. The message is shown, never trusted.
 */
function HtmlBody({ html }: { html: string }) {
  return (
    <Box
      component="iframe"
      title="Message body (HTML)"
      sandbox=""
      srcDoc={withFramePolicy(html)}
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
        <Tab value="html" label="HTML" />
        <Tab value="text" label="Plain text" />
        <Tab value="headers" label="Headers" />
      </Tabs>
      {view === 'html' &&
        (message.html ? (
          <HtmlBody html={message.html} />
        ) : (
          <Typography variant="body2" color="text.secondary">
            This message has no HTML part; its plain text is under Plain text.
          </Typography>
        ))}
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
  const replyTo = m.headers.find((h) => h.name.toLowerCase() === 'reply-to')?.value ?? null;
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
          sx={{
            display: 'grid',
            gridTemplateColumns: 'max-content 1fr',
            columnGap: 2,
            rowGap: 0.5,
            m: 0,
            '& dt': { color: 'text.secondary' },
            '& dd': { m: 0 },
          }}
        >
          <dt>From</dt>
          <dd>{m.from}</dd>
          {replyTo && (
            <>
              <dt>Reply-To</dt>
              <dd>{replyTo}</dd>
            </>
          )}
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
