import AttachFileOutlined from '@mui/icons-material/AttachFileOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import DescriptionOutlined from '@mui/icons-material/DescriptionOutlined';
import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import PictureAsPdfOutlined from '@mui/icons-material/PictureAsPdfOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import IconButton from '@mui/material/IconButton';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Skeleton from '@mui/material/Skeleton';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { useEffect, useRef, useState } from 'react';
import { Controller } from 'react-hook-form';
import { DEFAULT_ATTACHMENT_MAX_MB, type Attachment, type AttachmentOwner } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { ApiError } from '@/lib/api-client';
import { downloadFile } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';
import { formatDate } from '@/utils/format';
import { formatBytes } from '@/utils/measurement';
import { useDeleteAttachment } from '../api/delete-attachment';
import { useAttachmentFile } from '../api/get-attachment-file';
import { useAttachments } from '../api/get-attachments';
import { uploadAttachmentSchema, useUploadAttachment } from '../api/upload-attachment';

const isImage = (a: Attachment) => a.contentType.startsWith('image/');

/** An object URL for a blob, revoked when the blob changes or the component goes. */
function useObjectUrl(blob: Blob | undefined): string | null {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!blob) return undefined;
    const created = URL.createObjectURL(blob);
    setUrl(created);
    return () => {
      URL.revokeObjectURL(created);
      setUrl(null);
    };
  }, [blob]);
  return url;
}

function Thumbnail({ attachment, onOpen }: { attachment: Attachment; onOpen: () => void }) {
  const image = isImage(attachment);
  const file = useAttachmentFile(attachment, image);
  const url = useObjectUrl(file.data);
  const box = {
    width: '100%',
    height: 140,
    borderRadius: 1,
    bgcolor: 'action.hover',
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'center',
  } as const;
  if (!image) {
    const Icon = attachment.contentType === 'application/pdf' ? PictureAsPdfOutlined : DescriptionOutlined;
    return (
      <Box sx={box}>
        <Icon sx={{ fontSize: 48, color: 'text.secondary' }} aria-hidden />
      </Box>
    );
  }
  if (!url) return file.isError ? <Box sx={box}>Not shown</Box> : <Skeleton variant="rectangular" sx={{ ...box, bgcolor: undefined }} />;
  return (
    <Box
      component="button"
      type="button"
      onClick={onOpen}
      aria-label={`Show ${attachment.originalName}`}
      sx={{ ...box, p: 0, border: 0, cursor: 'zoom-in', overflow: 'hidden' }}
    >
      <Box component="img" src={url} alt={attachment.caption ?? attachment.originalName} sx={{ width: '100%', height: '100%', objectFit: 'cover' }} />
    </Box>
  );
}

function ImageViewer({ attachment, onClose }: { attachment: Attachment; onClose: () => void }) {
  const file = useAttachmentFile(attachment, true);
  const url = useObjectUrl(file.data);
  return (
    <Dialog open onClose={onClose} maxWidth="lg" aria-label={attachment.originalName}>
      <DialogTitle>{attachment.caption ?? attachment.originalName}</DialogTitle>
      <DialogContent>
        {url ? (
          <Box
            component="img"
            src={url}
            alt={attachment.caption ?? attachment.originalName}
            sx={{ maxWidth: '100%', maxHeight: '75vh', display: 'block', mx: 'auto' }}
          />
        ) : (
          <Skeleton variant="rectangular" height={400} />
        )}
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose}>Close</Button>
      </DialogActions>
    </Dialog>
  );
}

function UploadDialog({ owner, ownerId, onClose }: { owner: AttachmentOwner; ownerId: number; onClose: () => void }) {
  const input = useRef<HTMLInputElement>(null);
  const [sent, setSent] = useState(0);
  const form = useZodForm(uploadAttachmentSchema, { file: null, caption: '' });
  const upload = useUploadAttachment({
    onSuccess: (a) => {
      notify('success', `${a.originalName} attached.`);
      onClose();
    },
  });
  return (
    <FormDialog
      open
      title="Attach a photo or document"
      intro={`Photos (JPEG, PNG, GIF, WebP), PDF or plain text, up to ${DEFAULT_ATTACHMENT_MAX_MB} MB unless the lab has set another limit. The kind of file is checked from its contents.`}
      form={form}
      onSubmit={({ file, caption }) => {
        setSent(0);
        upload.mutate({ owner, ownerId, file: file as File, caption, onUploadProgress: (p) => setSent(p.total ? p.loaded / p.total : 0) });
      }}
      onClose={onClose}
      pending={upload.isPending}
      error={upload.error}
      errorFallback="The file could not be attached."
      submitLabel="Attach"
      pendingLabel="Attaching…"
    >
      <Controller
        control={form.control}
        name="file"
        render={({ field, fieldState }) => (
          <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5 }}>
            <input
              ref={input}
              type="file"
              accept="image/jpeg,image/png,image/gif,image/webp,application/pdf,text/plain"
              aria-label="File to attach"
              style={{ display: 'none' }}
              onChange={(e) => {
                field.onChange(e.target.files?.[0] ?? null);
                upload.reset();
              }}
            />
            <Button variant="outlined" onClick={() => input.current?.click()} disabled={upload.isPending}>
              Choose a file
            </Button>
            <Typography variant="body2" color={fieldState.error ? 'error' : 'text.primary'}>
              {field.value ? `${field.value.name} · ${formatBytes(field.value.size)}` : (fieldState.error?.message ?? 'No file chosen')}
            </Typography>
          </Box>
        )}
      />
      <FormTextField
        control={form.control}
        name="caption"
        label="Caption (optional)"
        placeholder="e.g. As received: cracked dial glass"
        disabled={upload.isPending}
      />
      {upload.isPending && <LinearProgress variant="determinate" value={sent * 100} aria-label="Upload progress" />}
    </FormDialog>
  );
}

type AttachmentsPanelProps = { owner: AttachmentOwner; ownerId: number; canUpload: boolean; canDelete: boolean };

/** Photos and documents of an instrument or a job: thumbnails, upload, download and (for the lead) delete. */
export function AttachmentsPanel({ owner, ownerId, canUpload, canDelete }: AttachmentsPanelProps) {
  const attachments = useAttachments(owner, ownerId);
  const [uploading, setUploading] = useState(false);
  const [viewing, setViewing] = useState<Attachment | null>(null);
  const [deleting, setDeleting] = useState<Attachment | null>(null);
  const remove = useDeleteAttachment({ onSuccess: () => setDeleting(null) });
  const items = attachments.data?.items ?? [];

  const save = async (a: Attachment) => {
    try {
      await downloadFile(`${a.url}?download=true`, a.originalName);
    } catch (error) {
      notify('error', error instanceof ApiError ? error.message : 'The file could not be downloaded.');
    }
  };

  return (
    <Paper variant="outlined" component="section" aria-label="Attachments" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', mb: 1 }}>
        <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
          Photos and documents
        </Typography>
        {canUpload && (
          <Button startIcon={<AttachFileOutlined />} onClick={() => setUploading(true)}>
            Attach
          </Button>
        )}
      </Box>
      {attachments.isError && <Alert severity="error">The attachments could not be loaded.</Alert>}
      {attachments.isSuccess && items.length === 0 && (
        <Typography variant="body2" color="text.secondary">
          Nothing attached yet{canUpload ? ': photos of the condition as received or of the set-up belong here.' : '.'}
        </Typography>
      )}
      <Box sx={{ display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(180px, 1fr))', gap: 1.5 }}>
        {items.map((a) => (
          <Box key={a.id} sx={{ border: 1, borderColor: 'divider', borderRadius: 1, p: 1, minWidth: 0 }}>
            <Thumbnail attachment={a} onOpen={() => setViewing(a)} />
            <Typography variant="body2" noWrap title={a.originalName} sx={{ mt: 0.75, fontWeight: 500 }}>
              {a.caption ?? a.originalName}
            </Typography>
            <Typography variant="caption" color="text.secondary" component="div" noWrap>
              {formatBytes(a.sizeBytes)} · {a.uploadedByName} · {formatDate(a.createdAt)}
            </Typography>
            <Box sx={{ display: 'flex', justifyContent: 'flex-end' }}>
              <Tooltip title="Download">
                <IconButton size="small" aria-label={`Download ${a.originalName}`} onClick={() => void save(a)}>
                  <DownloadOutlined fontSize="small" />
                </IconButton>
              </Tooltip>
              {canDelete && (
                <Tooltip title="Delete">
                  <IconButton size="small" aria-label={`Delete ${a.originalName}`} onClick={() => setDeleting(a)}>
                    <DeleteOutlined fontSize="small" />
                  </IconButton>
                </Tooltip>
              )}
            </Box>
          </Box>
        ))}
      </Box>
      {uploading && <UploadDialog owner={owner} ownerId={ownerId} onClose={() => setUploading(false)} />}
      {viewing && <ImageViewer attachment={viewing} onClose={() => setViewing(null)} />}
      <ConfirmDialog
        open={deleting !== null}
        title="Delete this attachment?"
        confirmLabel="Delete"
        destructive
        busy={remove.isPending}
        onClose={() => setDeleting(null)}
        onConfirm={() => deleting && remove.mutate(deleting)}
      >
        {deleting && (
          <>
            <strong>{deleting.originalName}</strong> is removed from this {owner}. This cannot be undone.
            {remove.error && (
              <Alert severity="error" sx={{ mt: 1 }}>
                {remove.error instanceof ApiError ? remove.error.message : 'It could not be deleted.'}
              </Alert>
            )}
          </>
        )}
      </ConfirmDialog>
    </Paper>
  );
}
