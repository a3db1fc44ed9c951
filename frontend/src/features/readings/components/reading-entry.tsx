import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import FormControlLabel from '@mui/material/FormControlLabel';
import Paper from '@mui/material/Paper';
import Switch from '@mui/material/Switch';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useEffect, useRef, useState, type FormEvent, type KeyboardEvent } from 'react';
import { RUN_DATA_KIND_NAMES, type AppendReadingsResponse, type CounterCapture, type DialUnit } from '@kilocycle/common/types';
import { checkFrequencySpan, parseFrequency, parseNumber, parseTimeInterval } from '@kilocycle/common/units';
import { Num, numberSx } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { formatSeconds } from '@/utils/data-kind';
import { formatHz, formatNumber } from '@/utils/frequency';
import { useAppendReadings } from '../api/append-readings';
import { useAbandonCapture, useStartCapture } from '../api/counter-capture';
import { useCaptureFeed, type CaptureFeed } from '../hooks/capture-feed';

type Field = 'dial' | 'frequency';
type Problem = { field: Field | null; message: string };

type FrequencyEntryProps = {
  runId: number;
  dialUnit: DialUnit;
  /** The range's nominal span, to warn when a value is far outside it (a unit slip, usually). */
  freqMinHz: number;
  freqMaxHz: number;
  /** Why the run takes no readings now; the form is then read-only. */
  refusal?: string | null;
  onSaved?: (answer: AppendReadingsResponse) => void;
  /** Counter-assisted capture, on a run with a bench: offered whenever the run has one, on by default while its bridge is live. */
  counter?: CounterAssist;
};

/** A phase (time-interval) run: no dial and no range span; the reading is the time interval in seconds. */
type TimeIntervalEntryProps = {
  runId: number;
  refusal?: string | null;
  onSaved?: (answer: AppendReadingsResponse) => void;
};

/** The run's data kind chooses the form: dial and counter (frequency, the default), or the time interval alone (phase). */
type ReadingEntryProps = (FrequencyEntryProps & { dataKind?: 'frequency' }) | (TimeIntervalEntryProps & { dataKind: 'phase' });

export type CounterAssist = {
  bridgeLive: boolean;
  /** The run's setting waiting for the counter as loaded with the page (null when none). */
  capture: CounterCapture | null;
  /** Its changes as the live feed pushes them (win over `capture`). */
  feed?: CaptureFeed;
  /** The procedure's next dial mark, proposed in the dial field. */
  nextMark: number | null;
  /** Called when a setting settled (the page refreshes its fit and the next mark). */
  onSettled?: (capture: CounterCapture) => void;
};

/** The waiting line: how many counter readings so far and their spread against the procedure's band. */
function waitingText(c: CounterCapture): string {
  const spread =
    c.spreadHz === null ? 'no reading yet' : `spread ${formatNumber(c.spreadHz, c.spreadHz < 10 ? 2 : 0)} Hz over the last ${Math.min(c.count, c.settleCount)}`;
  return `Waiting for the counter to settle at dial ${formatNumber(c.dial, Number.isInteger(c.dial) ? 0 : 3)}: ${c.count} reading${c.count === 1 ? '' : 's'}, ${spread} (needs ${c.settleCount} within ${formatNumber(c.toleranceHz, c.toleranceHz < 10 ? 2 : 0)} Hz, up to ${c.timeoutS} s). Esc abandons it.`;
}

type Understood = { ok: true; hz: number; text: string; far: boolean; probableHz: number | null } | { ok: false; text: string } | null;
/** A reading the server refused only for lying outside the range's span: stored as typed if the person confirms. */
type Confirming = { dial: string; counter: string; message: string };

/**
 * What the counter text will be stored as: the same parser the server uses (a bare number is in Hz),
 * and the same span rule (common's checkFrequencySpan), so the amber hint warns before the server refuses.
 */
export function understandFrequency(text: string, freqMinHz: number, freqMaxHz: number): Understood {
  if (!text.trim()) return null;
  try {
    const hz = parseFrequency(text, 'Hz');
    let outside: ReturnType<typeof checkFrequencySpan> = null;
    try {
      outside = checkFrequencySpan(text, hz, freqMinHz, freqMaxHz);
    } catch {
      outside = null; // a range without a usable span: the server decides
    }
    return {
      ok: true,
      hz,
      far: outside !== null,
      probableHz: outside?.probableHz ?? null,
      text: `= ${formatHz(hz)} (${formatNumber(hz, Number.isInteger(hz) ? 0 : 1)} Hz)`,
    };
  } catch (error) {
    return { ok: false, text: error instanceof Error ? error.message : String(error) };
  }
}

/** Server messages look like `readings[0].dial: dial 3000 is outside…`: say which field, drop the index. */
function toProblem(error: unknown): Problem {
  if (error instanceof ApiError) {
    const first = error.messages[0] ?? error.message;
    const match = /^readings\[\d+\]\.(\w+):\s*(.*)$/.exec(first);
    if (match) {
      const field = match[1] === 'dial' || match[1] === 'frequency' ? match[1] : null;
      return { field, message: `Not saved — ${match[1] === 'frequency' ? 'counter' : match[1]}: ${match[2]}` };
    }
    return { field: null, message: `Not saved — ${error.messages.join('; ')}` };
  }
  return { field: null, message: 'Not saved — the server could not be reached. The values are still here; press Enter to try again.' };
}

/** Typed readings at the bench: a frequency run's dial and counter, or a phase run's time interval (sent as `timeInterval`). */
export function ReadingEntry(props: ReadingEntryProps) {
  if (props.dataKind === 'phase') {
    const { dataKind: _kind, ...rest } = props;
    return <TimeIntervalEntry {...rest} />;
  }
  const { dataKind: _kind, ...rest } = props;
  return <FrequencyEntry {...rest} />;
}

/**
 * Keyboard-only capture at the bench: dial, Tab, counter as typed (`1735 kHz`, `1.735 MHz`, `1735000`), Enter.
 * A saved pair clears and the cursor goes back to the dial; a refused pair stays, with the reason.
 */
function FrequencyEntry({ runId, dialUnit, freqMinHz, freqMaxHz, refusal, onSaved, counter: assist }: FrequencyEntryProps) {
  const dialRef = useRef<HTMLInputElement>(null);
  const counterRef = useRef<HTMLInputElement>(null);
  const [dial, setDial] = useState('');
  const [counter, setCounter] = useState('');
  const [problem, setProblem] = useState<Problem | null>(null);
  const [last, setLast] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<Confirming | null>(null);
  const confirmRef = useRef<HTMLButtonElement>(null);
  // The confirmation takes the keyboard once it is on the page, so Enter stores the reading as typed.
  useEffect(() => {
    if (confirming) confirmRef.current?.focus();
  }, [confirming]);
  // Counter-assisted capture: on by default whenever the bridge comes online; the person may turn it off.
  const bridgeLive = assist?.bridgeLive ?? false;
  const [fromCounter, setFromCounter] = useState(bridgeLive);
  useEffect(() => {
    if (bridgeLive) setFromCounter(true);
  }, [bridgeLive]);
  const counterMode = Boolean(assist) && fromCounter;
  const startCapture = useStartCapture();
  const abandonCapture = useAbandonCapture();
  const liveCapture = useCaptureFeed(assist?.feed);
  const capture = liveCapture?.capture ?? assist?.capture ?? null;
  const waiting = capture?.status === 'waiting' ? capture : null;
  const seenCapture = useRef<CounterCapture | null>(null);
  // A setting's end arrives on the live feed: settled (the mean is stored) or ended with the server's reason.
  useEffect(() => {
    if (!capture || seenCapture.current === capture) return;
    seenCapture.current = capture;
    if (capture.status === 'settled' && capture.reading) {
      const r = capture.reading;
      setLast(
        `Saved #${r.seq}: dial ${formatNumber(capture.dial, Number.isInteger(capture.dial) ? 0 : 3)} ${dialUnit} → ${formatHz(r.frequency)} (mean of ${capture.n}, s = ${capture.sd === null ? '—' : `${formatNumber(capture.sd, capture.sd < 10 ? 2 : 1)} Hz`})`,
      );
      setProblem(null);
      setDial('');
      dialRef.current?.focus();
      // After the saved line is on the screen: the page's refresh (fit, charts, next mark) must not hold it up.
      setTimeout(() => assist?.onSettled?.(capture), 0);
    } else if (capture.status === 'timed_out' || capture.status === 'failed') {
      setProblem({ field: 'dial', message: `Not taken — ${capture.message ?? 'the setting ended'}` });
    } else if (capture.status === 'abandoned') {
      setProblem(null);
      setLast(`Abandoned dial ${formatNumber(capture.dial, Number.isInteger(capture.dial) ? 0 : 3)}: nothing was stored for it.`);
    }
  }, [capture, dialUnit, assist]);
  // The procedure's next mark is proposed (selected, so typing replaces it) while the dial is empty.
  const nextMark = assist?.nextMark ?? null;
  useEffect(() => {
    if (!counterMode || nextMark === null || waiting) return;
    setDial((current) => (current.trim() === '' ? String(nextMark) : current));
    requestAnimationFrame(() => dialRef.current?.select());
  }, [counterMode, nextMark, waiting]);

  // What was sent: on success only these are cleared, so anything typed meanwhile stays.
  const sent = useRef<{ dial: string; counter: string } | null>(null);
  const append = useAppendReadings({
    onSuccess: (answer) => {
      const stored = answer.stored[answer.stored.length - 1];
      setLast(
        stored
          ? `Saved #${stored.seq}: dial ${stored.dial ?? '—'} ${dialUnit} → ${formatHz(stored.frequency)}`
          : `Saved (${answer.accepted} stored, ${answer.duplicates} already there)`,
      );
      const was = sent.current;
      sent.current = null;
      const dialNow = dialRef.current?.value ?? '';
      const counterNow = counterRef.current?.value ?? '';
      const untouched = was !== null && dialNow === was.dial && counterNow === was.counter;
      if (untouched) {
        setDial('');
        setCounter('');
        dialRef.current?.focus();
      }
      setProblem(null);
      setConfirming(null);
      onSaved?.(answer);
    },
  });

  const readOnly = Boolean(refusal);
  const frequency = understandFrequency(counter, freqMinHz, freqMaxHz);
  let dialValue: number | null = null;
  let dialError: string | null = null;
  if (dial.trim()) {
    try {
      dialValue = parseNumber(dial);
    } catch (error) {
      dialError = error instanceof Error ? error.message : String(error);
    }
  }

  /** Sends the pair; `confirmed` stores a frequency outside the range's span as typed. */
  const send = (confirmed: boolean) => {
    if (dialValue === null) return;
    setProblem(null);
    sent.current = { dial, counter };
    append.mutate(
      { runId, body: { readings: [{ dial: dialValue, frequency: counter.trim(), ...(confirmed ? { confirmed: true } : {}) }] } },
      {
        onError: (error) => {
          sent.current = null;
          // 422: refused only for lying outside the span. Offer to store it as typed, one keystroke away.
          if (!confirmed && error instanceof ApiError && error.status === 422) {
            const message = (error.messages[0] ?? error.message).replace(/^readings\[\d+\]\.\w+:\s*/, '');
            setConfirming({ dial, counter, message });
            return;
          }
          setConfirming(null);
          const found = toProblem(error);
          setProblem(found);
          // Nothing is lost: the typed values stay, and the cursor goes where the fix is needed.
          requestAnimationFrame(() => (found.field === 'dial' ? dialRef.current : counterRef.current)?.focus());
        },
      },
    );
  };

  /** Escape: back to the counter, its text selected, to type it again. */
  const correct = () => {
    setConfirming(null);
    requestAnimationFrame(() => {
      counterRef.current?.focus();
      counterRef.current?.select();
    });
  };

  /** Counter mode: Enter sends only the dial; the server takes the counter readings that follow. */
  const takeFromCounter = () => {
    if (dialValue === null) {
      setProblem({ field: 'dial', message: dialError ? `Not a dial setting — ${dialError}` : 'Enter the dial setting first.' });
      dialRef.current?.focus();
      return;
    }
    if (waiting || startCapture.isPending) {
      setProblem({ field: null, message: 'A setting is still waiting for the counter; press Esc to abandon it first.' });
      return;
    }
    setProblem(null);
    setLast(null);
    startCapture.mutate(
      { runId, body: { dial: dialValue } },
      {
        onError: (error) => {
          const reason = error instanceof ApiError ? error.messages.join('; ') : 'the server could not be reached; press Enter to try again.';
          // No bridge live: the person can still type the counter reading, with the switch off.
          const hint =
            error instanceof ApiError && error.status === 409 && /no bridge/.test(reason)
              ? ' Turn off “Counter fills the reading” to type the counter yourself.'
              : '';
          setProblem({ field: 'dial', message: `Not taken — ${reason}.${hint}`.replace('..', '.') });
          dialRef.current?.focus();
        },
      },
    );
  };

  const abandon = () => {
    if (!waiting || abandonCapture.isPending) return;
    abandonCapture.mutate(
      { runId },
      {
        onError: (error) =>
          setProblem({ field: null, message: `Not abandoned — ${error instanceof ApiError ? error.messages.join('; ') : 'the server could not be reached'}` }),
      },
    );
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (readOnly) return;
    if (counterMode) {
      takeFromCounter();
      return;
    }
    if (append.isPending) {
      setProblem({ field: null, message: 'Still saving the previous reading; press Enter again in a moment.' });
      return;
    }
    if (dialValue === null) {
      setProblem({ field: 'dial', message: dialError ? `Not saved — dial: ${dialError}` : 'Enter the dial setting first.' });
      dialRef.current?.focus();
      return;
    }
    if (!counter.trim()) {
      setProblem({ field: 'frequency', message: 'Enter the counter reading.' });
      counterRef.current?.focus();
      return;
    }
    if (frequency && !frequency.ok) {
      setProblem({ field: 'frequency', message: `Not saved — counter: ${frequency.text}` });
      counterRef.current?.focus();
      return;
    }
    // Enter again on the same pair after the refusal stores it as typed.
    send(confirming !== null && confirming.dial === dial && confirming.counter === counter);
  };

  // Enter on the dial moves on to the counter while the counter is still empty, but only with a dial it can
  // read: a dial it cannot read (`abc`) keeps the cursor where the fix is needed, with the reason.
  const onDialKey = (event: KeyboardEvent<HTMLInputElement>) => {
    if (counterMode) {
      if (event.key === 'Escape' && waiting) {
        event.preventDefault();
        abandon();
      }
      return; // Enter submits the form: the dial alone
    }
    if (event.key !== 'Enter' || counter.trim() || !dial.trim()) return;
    event.preventDefault();
    if (dialValue === null) {
      setProblem({ field: 'dial', message: `Not a dial setting — ${dialError ?? 'type a number'}` });
      return;
    }
    counterRef.current?.focus();
  };

  const mono = { fontFamily: numberSx.fontFamily, fontSize: '1.125rem' };

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Enter a reading
      </Typography>
      {refusal ? (
        <Alert severity="info" sx={{ mb: 1 }}>
          This run takes no readings now: {refusal}.
        </Alert>
      ) : counterMode ? (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
          Set the dial, type it and press <kbd>Enter</kbd>: the counter fills the reading once it settles. <kbd>Esc</kbd> abandons a setting.
          {!bridgeLive && ' No bridge is live for this run now.'}
        </Typography>
      ) : (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
          Dial, <kbd>Tab</kbd>, counter as shown (<Num>1735 kHz</Num>, <Num>1.7352 MHz</Num> or <Num>1735200</Num> in Hz), <kbd>Enter</kbd>. Repeat a setting as
          often as you like.
        </Typography>
      )}
      {assist && !readOnly && (
        <FormControlLabel
          sx={{ mb: 1 }}
          control={<Switch size="small" checked={fromCounter} onChange={(e) => setFromCounter(e.target.checked)} disabled={Boolean(waiting)} />}
          label="Counter fills the reading"
        />
      )}
      <Box
        component="form"
        noValidate
        onSubmit={submit}
        aria-label="Reading entry"
        sx={{
          display: 'grid',
          gridTemplateColumns: { xs: 'minmax(0, 1fr)', sm: counterMode ? 'minmax(0, 1fr) auto' : 'minmax(0, 1fr) minmax(0, 2fr) auto' },
          gap: 1.5,
          alignItems: 'start',
        }}
      >
        <TextField
          label={`Dial (${dialUnit})`}
          value={dial}
          onChange={(e) => {
            setDial(e.target.value);
            setConfirming(null);
            if (problem?.field === 'dial') setProblem(null);
          }}
          onKeyDown={onDialKey}
          inputRef={dialRef}
          autoFocus={!readOnly}
          autoComplete="off"
          error={Boolean(dialError) || problem?.field === 'dial'}
          helperText={dialError ?? (dialValue !== null ? `dial ${formatNumber(dialValue, Number.isInteger(dialValue) ? 0 : 3)}` : ' ')}
          slotProps={{ htmlInput: { inputMode: 'decimal', readOnly, style: mono } }}
        />
        {!counterMode && (
          <TextField
            label="Counter"
            value={counter}
            onChange={(e) => {
              setCounter(e.target.value);
              setConfirming(null);
              if (problem?.field === 'frequency') setProblem(null);
            }}
            inputRef={counterRef}
            autoComplete="off"
            error={(frequency !== null && !frequency.ok) || problem?.field === 'frequency'}
            helperText={
              frequency === null ? (
                'Understood as: —'
              ) : frequency.ok ? (
                <Box component="span" data-testid="counter-understood" sx={{ color: frequency.far ? 'warning.main' : undefined }}>
                  <Num>{frequency.text}</Num>
                  {frequency.far &&
                    ` — far outside this range (${formatHz(freqMinHz)} – ${formatHz(freqMaxHz)}); ${frequency.probableHz !== null ? `did you mean ${formatHz(frequency.probableHz)}?` : 'check the unit'}`}
                </Box>
              ) : (
                frequency.text
              )
            }
            slotProps={{ htmlInput: { readOnly, style: mono } }}
          />
        )}
        <Button type="submit" variant="contained" disabled={readOnly || Boolean(waiting)} sx={{ mt: 0.5, minWidth: 96 }} tabIndex={-1}>
          {counterMode ? (startCapture.isPending ? 'Sending…' : 'Take') : append.isPending ? 'Saving…' : 'Save'}
        </Button>
      </Box>
      <Box aria-live="polite" sx={{ minHeight: 24, mt: 0.5 }}>
        {waiting && counterMode ? (
          <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
            <Typography
              variant="body2"
              data-testid="capture-waiting"
              sx={{ flex: '1 1 16rem', minWidth: 0, overflowWrap: 'anywhere', fontVariantNumeric: 'tabular-nums' }}
            >
              {waitingText(waiting)}
            </Typography>
            <Button size="small" color="inherit" onClick={abandon} disabled={abandonCapture.isPending}>
              Abandon (Esc)
            </Button>
          </Box>
        ) : confirming ? (
          <Alert
            severity="warning"
            role="alert"
            data-testid="confirm-reading"
            onKeyDown={(event) => {
              if (event.key === 'Escape') {
                event.preventDefault();
                correct();
              }
            }}
          >
            <Box component="span" sx={{ display: 'block' }}>
              Not saved — {confirming.message}
            </Box>
            <Box component="span" sx={{ display: 'block', mt: 0.5 }}>
              Press <kbd>Enter</kbd> again to store it as typed, or <kbd>Esc</kbd> to correct it.
            </Box>
            <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', mt: 1 }}>
              <Button ref={confirmRef} variant="contained" color="warning" size="small" onClick={() => send(true)} disabled={append.isPending}>
                Store as typed
              </Button>
              <Button size="small" color="inherit" onClick={correct}>
                Correct it
              </Button>
            </Box>
          </Alert>
        ) : problem ? (
          <Alert severity="error" role="alert" sx={{ py: 0 }}>
            {problem.message}
          </Alert>
        ) : (
          last && (
            <Typography
              variant="body2"
              color="success.main"
              data-testid="last-saved"
              data-settled-at={capture?.status === 'settled' ? (capture.settledAt ?? undefined) : undefined}
              data-sent-at={capture?.status === 'settled' ? liveCapture?.sentAt : undefined}
              sx={{ overflowWrap: 'anywhere' }}
            >
              <Num sx={{ whiteSpace: 'normal' }}>{last}</Num>
            </Typography>
          )
        )}
      </Box>
    </Paper>
  );
}

const TIME_INTERVAL = RUN_DATA_KIND_NAMES.phase;
const TIME_INTERVAL_LABEL = `${TIME_INTERVAL.value} (${TIME_INTERVAL.unit})`;

/** What the typed time interval will be stored as (seconds), read by common's parseTimeInterval as the server reads it. */
function understandTimeInterval(text: string): string {
  if (!text.trim()) return 'Understood as: —';
  try {
    return `= ${formatSeconds(parseTimeInterval(text))} s`;
  } catch (error) {
    return error instanceof Error ? error.message : 'not a time interval';
  }
}

/**
 * A phase run's typed readings: the time-interval counter's reading in seconds, Enter. Sent as `timeInterval`
 * (a frequency reading would make the run a mixed run, which the server refuses). A refused reading stays, with the reason.
 */
function TimeIntervalEntry({ runId, refusal, onSaved }: TimeIntervalEntryProps) {
  const inputRef = useRef<HTMLInputElement>(null);
  const [value, setValue] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [last, setLast] = useState<string | null>(null);
  const sent = useRef<string | null>(null);
  const append = useAppendReadings({
    onSuccess: (answer) => {
      const stored = answer.stored[answer.stored.length - 1];
      setLast(
        stored
          ? `Saved #${stored.seq}: ${formatSeconds(stored.frequency)} s at ${formatNumber(stored.t, 1)} s`
          : `Saved (${answer.accepted} stored, ${answer.duplicates} already there)`,
      );
      // Only what was sent is cleared: anything typed meanwhile stays.
      if (sent.current !== null && (inputRef.current?.value ?? '') === sent.current) setValue('');
      sent.current = null;
      setProblem(null);
      inputRef.current?.focus();
      onSaved?.(answer);
    },
  });
  const readOnly = Boolean(refusal);

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (readOnly) return;
    if (append.isPending) {
      setProblem('Still saving the previous reading; press Enter again in a moment.');
      return;
    }
    if (!value.trim()) {
      setProblem('Enter the time interval.');
      inputRef.current?.focus();
      return;
    }
    setProblem(null);
    sent.current = value;
    append.mutate(
      { runId, body: { readings: [{ timeInterval: value.trim() }] } },
      {
        onError: (error) => {
          sent.current = null;
          const message =
            error instanceof ApiError
              ? `Not saved — ${error.messages.map((m) => m.replace(/^readings\[\d+\]\.\w+:\s*/, '')).join('; ')}`
              : 'Not saved — the server could not be reached. The value is still here; press Enter to try again.';
          setProblem(message);
          requestAnimationFrame(() => inputRef.current?.focus());
        },
      },
    );
  };

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Enter a reading
      </Typography>
      {refusal ? (
        <Alert severity="info" sx={{ mb: 1 }}>
          This run takes no readings now: {refusal}.
        </Alert>
      ) : (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
          The time-interval counter’s reading in seconds (<Num>12.5e-9</Num>, or with a unit: <Num>12.5 ns</Num>), <kbd>Enter</kbd>.
        </Typography>
      )}
      <Box
        component="form"
        noValidate
        onSubmit={submit}
        aria-label="Reading entry"
        sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', sm: 'minmax(0, 1fr) auto' }, gap: 1.5, alignItems: 'start' }}
      >
        <TextField
          label={TIME_INTERVAL_LABEL}
          value={value}
          onChange={(e) => {
            setValue(e.target.value);
            setProblem(null);
          }}
          inputRef={inputRef}
          autoFocus={!readOnly}
          autoComplete="off"
          error={problem !== null}
          helperText={
            <Box component="span" data-testid="time-interval-understood" sx={{ overflowWrap: 'anywhere' }}>
              {understandTimeInterval(value)}
            </Box>
          }
          slotProps={{ htmlInput: { readOnly, style: { fontFamily: numberSx.fontFamily, fontSize: '1.125rem' } } }}
        />
        <Button type="submit" variant="contained" disabled={readOnly} sx={{ mt: 0.5, minWidth: 96 }} tabIndex={-1}>
          {append.isPending ? 'Saving…' : 'Save'}
        </Button>
      </Box>
      <Box aria-live="polite" sx={{ minHeight: 24, mt: 0.5 }}>
        {problem ? (
          <Alert severity="error" role="alert" sx={{ py: 0 }}>
            {problem}
          </Alert>
        ) : (
          last && (
            <Typography variant="body2" color="success.main" data-testid="last-saved" sx={{ overflowWrap: 'anywhere' }}>
              <Num sx={{ whiteSpace: 'normal' }}>{last}</Num>
            </Typography>
          )
        )}
      </Box>
    </Paper>
  );
}
