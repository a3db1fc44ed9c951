import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import MenuItem from '@mui/material/MenuItem';
import Switch from '@mui/material/Switch';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useId, useState, type FormEvent } from 'react';
import { CAPTURE_DEFAULTS, CAPTURE_LIMITS, DECISION_RULES, type CreateProcedureRequest, type DecisionRule, type Procedure } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { useSaveProcedure } from '../api/save-procedure';
import { DECISION_RULE_LABELS } from '../utils/results-format';
import { ExtraComponentsEditor, fromDrafts, toDrafts, type ExtraComponentDraft } from './extra-components-editor';

type Draft = {
  name: string;
  method: string;
  decisionRule: DecisionRule;
  dialHalfDivisionPercentOfSpan: string;
  driftPpm: string;
  driftHz: string;
  extras: ExtraComponentDraft[];
  isDefault: boolean;
  active: boolean;
  captureSettleCount: string;
  captureToleranceHz: string;
  captureTimeoutS: string;
  dialMarks: string;
};

/** Dial marks as typed: numbers separated by commas, semicolons or spaces (a decimal point, not a comma). */
export function parseDialMarks(text: string): number[] | null {
  const parts = text.split(/[\s,;]+/).filter((part) => part !== '');
  const marks = parts.map(Number);
  return marks.every((m) => Number.isFinite(m)) ? marks : null;
}

function toDraft(p: Procedure | null): Draft {
  return {
    name: p?.name ?? '',
    method: p?.method ?? '',
    decisionRule: p?.decisionRule ?? 'simple',
    dialHalfDivisionPercentOfSpan: p ? String(p.dialHalfDivisionPercentOfSpan) : '0.25',
    driftPpm: p ? String(p.driftPpm) : '1',
    driftHz: p ? String(p.driftHz) : '0',
    extras: toDrafts(p?.extraComponents ?? []),
    isDefault: p?.isDefault ?? false,
    active: p?.active ?? true,
    captureSettleCount: String(p?.captureSettleCount ?? CAPTURE_DEFAULTS.captureSettleCount),
    captureToleranceHz: String(p?.captureToleranceHz ?? CAPTURE_DEFAULTS.captureToleranceHz),
    captureTimeoutS: String(p?.captureTimeoutS ?? CAPTURE_DEFAULTS.captureTimeoutS),
    dialMarks: (p?.dialMarks ?? []).join(', '),
  };
}

type ProcedureDialogProps = { procedure: Procedure | null; canEdit: boolean; onClose: () => void };

export function ProcedureDialog({ procedure, canEdit, onClose }: ProcedureDialogProps) {
  const titleId = useId();
  const [draft, setDraft] = useState<Draft>(() => toDraft(procedure));
  const [problem, setProblem] = useState<string | null>(null);
  const save = useSaveProcedure({
    onSuccess: (saved) => {
      notify('success', `Procedure “${saved.name}” saved.`);
      onClose();
    },
  });
  const set = <K extends keyof Draft>(key: K, value: Draft[K]) => setDraft((d) => ({ ...d, [key]: value }));

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const numbers = {
      dialHalfDivisionPercentOfSpan: Number(draft.dialHalfDivisionPercentOfSpan),
      driftPpm: Number(draft.driftPpm),
      driftHz: Number(draft.driftHz),
    };
    if (!draft.name.trim() || !draft.method.trim()) return setProblem('Give the procedure a name and the method text');
    if (Object.values(numbers).some((n) => !Number.isFinite(n) || n < 0)) return setProblem('The budget figures must be numbers of zero or more');
    if (numbers.dialHalfDivisionPercentOfSpan > 50) return setProblem('Half a dial division cannot be more than 50 % of the span');
    const extras = fromDrafts(draft.extras);
    if ('problem' in extras) return setProblem(extras.problem);
    const capture = { captureSettleCount: Number(draft.captureSettleCount), captureToleranceHz: Number(draft.captureToleranceHz), captureTimeoutS: Number(draft.captureTimeoutS) };
    const { settleCount, toleranceHz, timeoutS } = CAPTURE_LIMITS;
    if (!Number.isInteger(capture.captureSettleCount) || capture.captureSettleCount < settleCount.min || capture.captureSettleCount > settleCount.max) {
      return setProblem(`Readings that must agree: a whole number from ${settleCount.min} to ${settleCount.max}`);
    }
    if (!Number.isFinite(capture.captureToleranceHz) || capture.captureToleranceHz < toleranceHz.min || capture.captureToleranceHz > toleranceHz.max) {
      return setProblem(`Settle band: a number of Hz from ${toleranceHz.min} to ${toleranceHz.max}`);
    }
    if (!Number.isInteger(capture.captureTimeoutS) || capture.captureTimeoutS < timeoutS.min || capture.captureTimeoutS > timeoutS.max) {
      return setProblem(`Timeout: a whole number of seconds from ${timeoutS.min} to ${timeoutS.max}`);
    }
    const dialMarks = parseDialMarks(draft.dialMarks);
    if (!dialMarks) return setProblem('Dial marks: numbers separated by commas or spaces (a decimal point, e.g. 1750, 1800.5)');
    if (dialMarks.length > CAPTURE_LIMITS.dialMarks.max) return setProblem(`Dial marks: at most ${CAPTURE_LIMITS.dialMarks.max}`);
    setProblem(null);
    const body: CreateProcedureRequest = {
      name: draft.name.trim(),
      method: draft.method.trim(),
      decisionRule: draft.decisionRule,
      ...numbers,
      extraComponents: extras.components,
      isDefault: draft.isDefault,
      ...capture,
      dialMarks,
    };
    if (procedure) save.mutate({ id: procedure.id, changes: { ...body, active: draft.active } });
    else save.mutate({ id: null, changes: body });
  };

  const messages = save.error ? (save.error instanceof ApiError ? save.error.messages : ['The procedure could not be saved.']) : [];
  const disabled = !canEdit || save.isPending;

  return (
    <Dialog open onClose={save.isPending ? undefined : onClose} aria-labelledby={titleId} maxWidth="md">
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{procedure ? `${procedure.name} (version ${procedure.version})` : 'New procedure'}</DialogTitle>
        <DialogContent>
          <FormErrors messages={problem ? [problem, ...messages] : messages} />
          {procedure && canEdit && (
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
              Saving a change makes version {procedure.version + 1}. Open jobs use it at once; signed jobs keep the version they were signed with.
            </Typography>
          )}
          <Box sx={{ display: 'grid', gap: 2, pt: 1 }}>
            <TextField label="Name" required value={draft.name} onChange={(e) => set('name', e.target.value)} disabled={disabled} />
            <TextField
              label="Method"
              required
              multiline
              minRows={3}
              value={draft.method}
              onChange={(e) => set('method', e.target.value)}
              helperText="Printed on the certificate as the identification of the method"
              disabled={disabled}
            />
            <TextField select label="Decision rule" value={draft.decisionRule} onChange={(e) => set('decisionRule', e.target.value as DecisionRule)} disabled={disabled}>
              {DECISION_RULES.map((rule) => (
                <MenuItem key={rule} value={rule}>
                  {DECISION_RULE_LABELS[rule]}
                </MenuItem>
              ))}
            </TextField>
            <Typography variant="h4" component="h3">
              Budget defaults
            </Typography>
            <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, 1fr)' }, gap: 2 }}>
              <TextField
                label="Half a dial division (% of span)"
                inputMode="decimal"
                value={draft.dialHalfDivisionPercentOfSpan}
                onChange={(e) => set('dialHalfDivisionPercentOfSpan', e.target.value)}
                disabled={disabled}
              />
              <TextField label="Drift allowance (± ppm)" inputMode="decimal" value={draft.driftPpm} onChange={(e) => set('driftPpm', e.target.value)} disabled={disabled} />
              <TextField label="Drift allowance (± Hz)" inputMode="decimal" value={draft.driftHz} onChange={(e) => set('driftHz', e.target.value)} disabled={disabled} />
            </Box>
            <Typography variant="body2" color="text.secondary">
              The standard’s time base, its calibration, the counter’s ±1 count and the repeatability come from the run and the
              standard; these figures and the extra components below are added to them.
            </Typography>
            <ExtraComponentsEditor value={draft.extras} onChange={(extras) => set('extras', extras)} disabled={disabled} />
            <Typography variant="h4" component="h3">
              Counter-assisted capture
            </Typography>
            <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, 1fr)' }, gap: 2 }}>
              <TextField
                label="Readings that must agree (N)"
                inputMode="numeric"
                value={draft.captureSettleCount}
                onChange={(e) => set('captureSettleCount', e.target.value)}
                disabled={disabled}
              />
              <TextField label="Settle band (Hz)" inputMode="decimal" value={draft.captureToleranceHz} onChange={(e) => set('captureToleranceHz', e.target.value)} disabled={disabled} />
              <TextField label="Timeout (s)" inputMode="numeric" value={draft.captureTimeoutS} onChange={(e) => set('captureTimeoutS', e.target.value)} disabled={disabled} />
            </Box>
            <TextField
              label="Dial marks, in order"
              value={draft.dialMarks}
              onChange={(e) => set('dialMarks', e.target.value)}
              helperText="Proposed one after another on the capture form, e.g. 1750, 1800, 1850; leave empty for none"
              disabled={disabled}
            />
            <Typography variant="body2" color="text.secondary">
              With a bridge live, the technician types only the dial: the setting is stored once the last N counter readings lie within the
              band, as their mean, with their spread feeding the repeatability.
            </Typography>
            <Box sx={{ display: 'flex', gap: 3 }}>
              <FormControlLabel
                control={<Switch checked={draft.isDefault} onChange={(e) => set('isDefault', e.target.checked)} disabled={disabled} />}
                label="Default for new jobs"
              />
              {procedure && (
                <FormControlLabel
                  control={<Switch checked={draft.active} onChange={(e) => set('active', e.target.checked)} disabled={disabled} />}
                  label="Active"
                />
              )}
            </Box>
          </Box>
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose} disabled={save.isPending}>
            {canEdit ? 'Cancel' : 'Close'}
          </Button>
          {canEdit && (
            <Button type="submit" variant="contained" disabled={save.isPending}>
              {save.isPending ? 'Saving…' : 'Save procedure'}
            </Button>
          )}
        </DialogActions>
      </form>
    </Dialog>
  );
}
