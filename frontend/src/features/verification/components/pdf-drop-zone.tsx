import UploadFileOutlined from '@mui/icons-material/UploadFileOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { useId, useRef, useState, type DragEvent } from 'react';

type PdfDropZoneProps = { onFile: (file: File) => void; disabled?: boolean; label: string };

/** A file input that also takes a file dropped on it. */
export function PdfDropZone({ onFile, disabled, label }: PdfDropZoneProps) {
  const inputId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);

  const drop = (event: DragEvent<HTMLDivElement>) => {
    event.preventDefault();
    setOver(false);
    if (disabled) return;
    const file = event.dataTransfer.files[0];
    if (file) onFile(file);
  };

  return (
    <Box
      onDragOver={(event) => {
        event.preventDefault();
        if (!disabled) setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={drop}
      data-testid="pdf-drop-zone"
      sx={{
        border: 2,
        borderStyle: 'dashed',
        borderColor: over ? 'primary.main' : 'divider',
        bgcolor: over ? 'action.hover' : 'background.paper',
        borderRadius: 1,
        p: 3,
        textAlign: 'center',
        transition: 'border-color 120ms, background-color 120ms',
      }}
    >
      <UploadFileOutlined color="primary" sx={{ fontSize: 36 }} aria-hidden />
      <Typography sx={{ mb: 1 }}>Drop the certificate PDF here, or</Typography>
      <input
        ref={input}
        id={inputId}
        type="file"
        accept="application/pdf,.pdf"
        aria-label={label}
        disabled={disabled}
        style={{ display: 'none' }}
        onChange={(event) => {
          const file = event.target.files?.[0];
          if (file) onFile(file);
          event.target.value = '';
        }}
      />
      <Button variant="outlined" disabled={disabled} onClick={() => input.current?.click()}>
        Choose a PDF file
      </Button>
    </Box>
  );
}
