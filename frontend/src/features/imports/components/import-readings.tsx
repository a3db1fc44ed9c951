import UploadFileOutlined from '@mui/icons-material/UploadFileOutlined';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormLabel from '@mui/material/FormLabel';
import LinearProgress from '@mui/material/LinearProgress';
import MenuItem from '@mui/material/MenuItem';
import Radio from '@mui/material/Radio';
import RadioGroup from '@mui/material/RadioGroup';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useId, useRef, useState } from 'react';
import { DEFAULT_IMPORT_MAX_MB, IMPORT_COLUMNS, type ImportColumn, type ImportMapping, type ImportMode, type ImportReport } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { formatBytes } from '@/utils/measurement';
import { sharedQueryKeys } from '@/lib/query-keys';
import { useImportProgress } from '../hooks/use-import-progress';
import { importReadings, newImportId, type ImportOutcome } from '../api/import-readings';
import { guessMapping, previewFile, type ColumnMapping, type CsvPreview } from '../utils/csv-preview';
import { COLUMN_LABELS, CsvPreviewTable } from './csv-preview-table';
import { RejectionsTable } from './rejections-table';

type Step = 'choose' | 'map' | 'sending' | 'finished';

const PHASE_WORDS = {
  receiving: 'The server is receiving the file',
  validating: 'Checking every row',
  writing: 'Writing the readings',
  done: 'Finished',
  failed: 'Stopped',
} as const;

type ImportReadingsProps = {
  runId: number;
  /** A time series run: every row needs its time. */
  needsTime: boolean;
  /** A calibration run: every row needs its dial setting. */
  needsDial: boolean;
  disabled?: boolean;
  /** Why the run takes no readings now, shown instead of the button. */
  refusal?: string | null;
};

export type MappingProblems = Partial<Record<ImportColumn, string>>;

/** What must be mapped for this kind of run, and no column used twice. */
export function checkMapping(mapping: ColumnMapping, { needsTime, needsDial }: { needsTime: boolean; needsDial: boolean }): MappingProblems {
  const problems: MappingProblems = {};
  if (!mapping.frequency) problems.frequency = 'Choose the column with the counter’s frequency';
  if (needsTime && !mapping.time) problems.time = 'This run needs the time of each reading';
  if (needsDial && !mapping.dial) problems.dial = 'This run needs the dial setting of each reading';
  const seen = new Map<string, ImportColumn>();
  for (const column of IMPORT_COLUMNS) {
    const name = mapping[column];
    if (!name) continue;
    const other = seen.get(name);
    if (other) problems[column] = `“${name}” is already the ${COLUMN_LABELS[other].toLowerCase()} column`;
    else seen.set(name, column);
  }
  return problems;
}

function toRequestMapping(mapping: ColumnMapping): ImportMapping {
  const out: ImportMapping = {};
  for (const column of IMPORT_COLUMNS) if (mapping[column]) out[column] = mapping[column];
  return out;
}

/** "Import CSV" on a run: choose a file, check the preview and the columns, send it, read the report. */
export function ImportReadings({ runId, needsTime, needsDial, disabled, refusal }: ImportReadingsProps) {
  const titleId = useId();
  const inputId = useId();
  const queryClient = useQueryClient();
  const [open, setOpen] = useState(false);
  const [step, setStep] = useState<Step>('choose');
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<CsvPreview | null>(null);
  const [readProblem, setReadProblem] = useState<string | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping>({ time: '', dial: '', frequency: '', unit: '', aux: '' });
  const [mode, setMode] = useState<ImportMode>('all');
  // Rows far outside the range's span are refused as probable unit slips unless the person says they are right.
  const [confirmed, setConfirmed] = useState(false);
  const [showProblems, setShowProblems] = useState(false);
  const [importId, setImportId] = useState<string | null>(null);
  const [sent, setSent] = useState<{ loaded: number; total: number | null }>({ loaded: 0, total: null });
  const [outcome, setOutcome] = useState<ImportOutcome | null>(null);
  const abort = useRef<AbortController | null>(null);
  const fileInput = useRef<HTMLInputElement>(null);
  const progress = useImportProgress(importId, step === 'sending');
  const problems = checkMapping(mapping, { needsTime, needsDial });

  const reset = () => {
    setStep('choose');
    setFile(null);
    setPreview(null);
    setConfirmed(false);
    setReadProblem(null);
    setOutcome(null);
    setImportId(null);
    setShowProblems(false);
    setSent({ loaded: 0, total: null });
  };
  const close = () => {
    if (step === 'sending') return;
    setOpen(false);
    reset();
  };

  const choose = async (chosen: File) => {
    setReadProblem(null);
    if (!/\.(csv|tsv|txt|tab)$/i.test(chosen.name)) {
      setReadProblem(`“${chosen.name}” is not a .csv or .tsv file.`);
      return;
    }
    try {
      const p = await previewFile(chosen);
      if (p.header.length === 0 || (p.header.length === 1 && p.header[0] === '')) {
        setReadProblem('The file is empty.');
        return;
      }
      setFile(chosen);
      setPreview(p);
      setMapping(guessMapping(p.header));
      setStep('map');
    } catch {
      setReadProblem('The file could not be read.');
    }
  };

  const start = async () => {
    if (!file) return;
    if (Object.keys(problems).length > 0) {
      setShowProblems(true);
      return;
    }
    const id = newImportId();
    setImportId(id);
    setStep('sending');
    setSent({ loaded: 0, total: file.size });
    abort.current = new AbortController();
    try {
      const result = await importReadings({
        runId,
        file,
        mode,
        confirmed,
        mapping: toRequestMapping(mapping),
        importId: id,
        onUploadProgress: setSent,
        signal: abort.current.signal,
      });
      setOutcome(result);
      if (result.ok) {
        // The run's readings, counts, analysis and notes all changed.
        await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.runs });
        await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.readings });
      }
    } catch (error) {
      setOutcome({
        ok: false,
        status: 0,
        message:
          error instanceof DOMException && error.name === 'AbortError'
            ? 'The upload was cancelled; nothing was imported.'
            : 'The server could not be reached; nothing was imported.',
        report: null,
      });
    } finally {
      abort.current = null;
      setStep('finished');
    }
  };

  if (refusal) {
    return (
      <Button variant="outlined" startIcon={<UploadFileOutlined />} disabled title={refusal}>
        Import CSV
      </Button>
    );
  }

  const server = progress.data;
  const uploadFraction = sent.total ? Math.min(1, sent.loaded / sent.total) : 0;
  const report: ImportReport | null = outcome?.ok ? outcome.report : (outcome?.report ?? null);

  return (
    <>
      <Button variant="outlined" startIcon={<UploadFileOutlined />} onClick={() => setOpen(true)} disabled={disabled}>
        Import CSV
      </Button>
      <Dialog open={open} onClose={close} aria-labelledby={titleId} maxWidth="lg">
        <DialogTitle id={titleId}>Import readings from a CSV or TSV file</DialogTitle>
        <DialogContent>
          {step === 'choose' && (
            <Box>
              <Typography variant="body2" sx={{ mb: 2 }}>
                One reading a row, under a header line. Columns may come in any order and be named as you like: you say which is which on the next step.
                Frequencies may carry their unit (“1735 kHz”) or take it from a unit column or the header. Up to {DEFAULT_IMPORT_MAX_MB} MB unless the lab has
                set another limit.
              </Typography>
              <Box
                onDragOver={(event) => event.preventDefault()}
                onDrop={(event) => {
                  event.preventDefault();
                  const dropped = event.dataTransfer.files[0];
                  if (dropped) void choose(dropped);
                }}
                sx={{ border: 2, borderStyle: 'dashed', borderColor: 'divider', borderRadius: 1, p: 3, textAlign: 'center' }}
              >
                <UploadFileOutlined color="primary" sx={{ fontSize: 36 }} aria-hidden />
                <Typography sx={{ mb: 1 }}>Drop the file here, or</Typography>
                <input
                  ref={fileInput}
                  id={inputId}
                  type="file"
                  accept=".csv,.tsv,.txt,text/csv,text/tab-separated-values"
                  aria-label="File to import"
                  style={{ display: 'none' }}
                  onChange={(event) => {
                    const chosen = event.target.files?.[0];
                    if (chosen) void choose(chosen);
                    event.target.value = '';
                  }}
                />
                <Button variant="outlined" onClick={() => fileInput.current?.click()}>
                  Choose a .csv or .tsv file
                </Button>
              </Box>
              {readProblem && (
                <Alert severity="error" sx={{ mt: 2 }}>
                  {readProblem}
                </Alert>
              )}
            </Box>
          )}

          {step === 'map' && preview && file && (
            <Box sx={{ display: 'grid', gap: 2 }}>
              <Typography variant="body2">
                <strong>{file.name}</strong> · <span style={{ fontFamily: 'inherit' }}>{formatBytes(file.size)}</span>
              </Typography>
              <CsvPreviewTable preview={preview} mapping={mapping} />
              <Box>
                <Typography variant="h4" component="h3" sx={{ mb: 1 }}>
                  Columns
                </Typography>
                <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, 1fr)', md: 'repeat(5, 1fr)' }, gap: 1.5 }}>
                  {IMPORT_COLUMNS.map((column) => {
                    const required = column === 'frequency' || (column === 'time' && needsTime) || (column === 'dial' && needsDial);
                    const problem = showProblems ? problems[column] : undefined;
                    return (
                      <TextField
                        key={column}
                        select
                        label={COLUMN_LABELS[column]}
                        required={required}
                        value={mapping[column]}
                        onChange={(e) => setMapping({ ...mapping, [column]: e.target.value })}
                        error={Boolean(problem)}
                        helperText={problem ?? (column === 'unit' ? 'Hz, kHz or MHz per row' : ' ')}
                        slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
                      >
                        <MenuItem value="">
                          <em>not in the file</em>
                        </MenuItem>
                        {preview.header.map((name, i) => (
                          <MenuItem key={`${name}-${i}`} value={name} disabled={name === ''}>
                            {name || `(column ${i + 1} has no name)`}
                          </MenuItem>
                        ))}
                      </TextField>
                    );
                  })}
                </Box>
              </Box>
              <FormControl>
                <FormLabel id={`${titleId}-mode`}>If some rows are not valid</FormLabel>
                <RadioGroup aria-labelledby={`${titleId}-mode`} value={mode} onChange={(e) => setMode(e.target.value as ImportMode)}>
                  <FormControlLabel value="all" control={<Radio size="small" />} label="All or nothing: import nothing, and list the bad rows" />
                  <FormControlLabel
                    value="valid"
                    control={<Radio size="small" />}
                    label="Import the valid rows only; the skipped ones are listed here and in the run’s notes"
                  />
                </RadioGroup>
              </FormControl>
              <FormControlLabel
                control={<Checkbox size="small" checked={confirmed} onChange={(e) => setConfirmed(e.target.checked)} />}
                label="Frequencies far outside the range (more than 10 % of its span) are right: store them as given"
              />
            </Box>
          )}

          {step === 'sending' && file && (
            <Box sx={{ display: 'grid', gap: 2, py: 1 }} aria-live="polite">
              <Box>
                <Typography variant="body2" sx={{ mb: 0.5 }}>
                  Sending {file.name}:{' '}
                  <Box component="span" sx={numberSx}>
                    {formatBytes(sent.loaded)} of {formatBytes(sent.total ?? file.size)}
                  </Box>
                </Typography>
                <LinearProgress variant="determinate" value={uploadFraction * 100} aria-label="Bytes sent" />
              </Box>
              <Box>
                <Typography variant="body2" sx={{ mb: 0.5 }}>
                  {server ? PHASE_WORDS[server.phase] : 'Waiting for the server'}
                  {server && server.rowsDone > 0 && (
                    <Box component="span" sx={numberSx}>
                      {' '}
                      · {server.rowsDone.toLocaleString('en-GB')} rows read
                      {server.imported > 0 ? `, ${server.imported.toLocaleString('en-GB')} written` : ''}
                      {server.rowsRejected > 0 ? `, ${server.rowsRejected.toLocaleString('en-GB')} refused` : ''}
                    </Box>
                  )}
                </Typography>
                <LinearProgress
                  variant={server ? 'determinate' : 'indeterminate'}
                  value={(server?.fraction ?? 0) * 100}
                  color="secondary"
                  aria-label="Rows processed"
                />
              </Box>
            </Box>
          )}

          {step === 'finished' && outcome && file && (
            <Box>
              {outcome.ok ? (
                <Alert severity={outcome.report.rejectedCount > 0 ? 'warning' : 'success'} role="status">
                  <AlertTitle>
                    {outcome.report.imported.toLocaleString('en-GB')} {outcome.report.imported === 1 ? 'reading' : 'readings'} imported
                  </AlertTitle>
                  From {outcome.report.rowCount.toLocaleString('en-GB')} rows of {file.name}
                  {outcome.report.rejectedCount > 0
                    ? `; ${outcome.report.rejectedCount.toLocaleString('en-GB')} skipped${outcome.report.notesAppended ? ' and listed in the run’s notes' : ''}.`
                    : '.'}
                </Alert>
              ) : (
                <Alert severity="error" role="alert">
                  <AlertTitle>
                    {outcome.status === 413 ? 'The file is too large' : outcome.status === 415 ? 'Not a CSV or TSV file' : 'Nothing was imported'}
                  </AlertTitle>
                  {outcome.message}
                </Alert>
              )}
              {report && <RejectionsTable report={report} fileName={file.name} />}
            </Box>
          )}
        </DialogContent>
        <DialogActions>
          {step === 'sending' ? (
            // Once the file is sent the server finishes on its own: cancelling here would only stop the waiting.
            uploadFraction < 1 && <Button onClick={() => abort.current?.abort()}>Cancel the upload</Button>
          ) : step === 'finished' ? (
            <>
              {!outcome?.ok && preview && <Button onClick={() => setStep('map')}>Change the columns or mode</Button>}
              <Button variant="contained" onClick={close}>
                Close
              </Button>
            </>
          ) : (
            <>
              {step === 'map' && <Button onClick={reset}>Another file</Button>}
              <Button onClick={close}>Cancel</Button>
              {step === 'map' && (
                <Button variant="contained" onClick={() => void start()}>
                  Import
                </Button>
              )}
            </>
          )}
        </DialogActions>
      </Dialog>
    </>
  );
}
