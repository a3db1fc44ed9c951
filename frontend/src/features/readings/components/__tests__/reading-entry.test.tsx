import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { createAppendAnswer, createReading } from '@/testing/lab-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { ReadingEntry } from '../reading-entry';

function renderEntry(onSaved = vi.fn()) {
  renderWithApp(<ReadingEntry runId={7} dialUnit="kHz" freqMinHz={1_750_000} freqMaxHz={2_000_000} onSaved={onSaved} />, { path: '/runs/7' });
  return {
    dial: screen.getByLabelText('Dial (kHz)') as HTMLInputElement,
    counter: screen.getByLabelText('Counter') as HTMLInputElement,
    form: screen.getByRole('form', { name: 'Reading entry' }),
    onSaved,
  };
}

describe('<ReadingEntry>', () => {
  it('should save the pair as typed on Enter, then clear both fields and put the cursor back on the dial', async () => {
    signInAs({ role: 'technician' });
    const stored = createReading({ seq: 4, dial: 1750, frequency: 1_735_000 });
    const { requests } = mockFetch([{ method: 'POST', path: '/api/runs/7/readings', status: 201, body: createAppendAnswer([stored]) }]);
    const { dial, counter, form, onSaved } = renderEntry();

    expect(document.activeElement).toBe(dial);
    fireEvent.change(dial, { target: { value: '1750' } });
    fireEvent.change(counter, { target: { value: '1735 kHz' } });
    // What the counter text will be stored as, before it is sent.
    expect(screen.getByTestId('counter-understood').textContent).toContain('= 1 735.000 kHz');
    fireEvent.submit(form);

    await waitFor(() => expect(dial.value).toBe(''));
    expect(counter.value).toBe('');
    expect(document.activeElement).toBe(dial);
    expect(requests).toHaveLength(1);
    expect(requests[0]!.url).toBe('/api/runs/7/readings');
    expect(requests[0]!.body).toEqual({ readings: [{ dial: 1750, frequency: '1735 kHz' }] });
    expect(screen.getByTestId('last-saved').textContent).toContain('Saved #4: dial 1750 kHz → 1 735.000 kHz');
    expect(onSaved).toHaveBeenCalledOnce();
  });

  it('should keep the typed values and show the reason when the server refuses the reading', async () => {
    signInAs({ role: 'technician' });
    mockFetch([
      {
        method: 'POST',
        path: '/api/runs/7/readings',
        status: 400,
        body: {
          statusCode: 400,
          error: 'Bad Request',
          message: ["readings[0].dial: dial 2300 is outside the range's dial span 1750 to 2000 by more than 10 %"],
        },
      },
    ]);
    const { dial, counter, form, onSaved } = renderEntry();

    fireEvent.change(dial, { target: { value: '2300' } });
    fireEvent.change(counter, { target: { value: '1.7352 MHz' } });
    fireEvent.submit(form);

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toBe("Not saved — dial: dial 2300 is outside the range's dial span 1750 to 2000 by more than 10 %");
    expect(dial.value).toBe('2300');
    expect(counter.value).toBe('1.7352 MHz');
    await waitFor(() => expect(document.activeElement).toBe(dial));
    expect(onSaved).not.toHaveBeenCalled();
  });

  it('should say what a counter entry was read as, and refuse one it cannot read without sending it', async () => {
    signInAs({ role: 'technician' });
    const { fetchMock } = mockFetch([]);
    const { dial, counter, form } = renderEntry();

    fireEvent.change(counter, { target: { value: '1735000' } });
    expect(screen.getByTestId('counter-understood').textContent).toContain('= 1 735.000 kHz (1 735 000 Hz)');
    // A bare number is hertz: 1735 alone is far below this range, and the page says so.
    fireEvent.change(counter, { target: { value: '1735' } });
    expect(screen.getByTestId('counter-understood').textContent).toMatch(/far outside this range/);

    fireEvent.change(dial, { target: { value: '1750' } });
    fireEvent.change(counter, { target: { value: '1,735.5 kHz' } });
    fireEvent.submit(form);

    expect((await screen.findByRole('alert')).textContent).toMatch(/^Not saved — counter: .*mixes a comma and a point/);
    expect(counter.value).toBe('1,735.5 kHz');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("should show the server's refusal of a reading outside the span and store it as typed on one more Enter, with confirmed", async () => {
    signInAs({ role: 'technician' });
    const slip = '1900 read as 1.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?';
    const stored = createReading({ seq: 1, dial: 1900, frequency: 1900 });
    // The first answer is the refusal; once it is taken, the second (the confirmed reading stored).
    const routes = [
      {
        method: 'POST',
        path: '/api/runs/7/readings',
        status: 422,
        body: { statusCode: 422, error: 'Unprocessable Entity', message: [`readings[0].frequency: ${slip}`] },
      },
      { method: 'POST', path: '/api/runs/7/readings', status: 201, body: createAppendAnswer([stored]) },
    ];
    const { requests } = mockFetch(routes);
    const { dial, counter, form, onSaved } = renderEntry();

    fireEvent.change(dial, { target: { value: '1900' } });
    fireEvent.change(counter, { target: { value: '1900' } });
    // The early warning, from the same rule the server applies.
    expect(screen.getByTestId('counter-understood').textContent).toContain('did you mean 1 900.000 kHz?');
    fireEvent.submit(form);

    const prompt = await screen.findByTestId('confirm-reading');
    expect(prompt.textContent).toContain(`Not saved — ${slip}`);
    expect(prompt.textContent).toContain('Press Enter again to store it as typed, or Esc to correct it.');
    const store = screen.getByRole('button', { name: 'Store as typed' });
    await waitFor(() => expect(document.activeElement).toBe(store));
    expect(onSaved).not.toHaveBeenCalled();
    routes.shift();

    // Enter on the focused button is its click: one keystroke.
    fireEvent.click(store);
    await waitFor(() => expect(onSaved).toHaveBeenCalledOnce());
    expect(requests.map((r) => r.body)).toEqual([
      { readings: [{ dial: 1900, frequency: '1900' }] },
      { readings: [{ dial: 1900, frequency: '1900', confirmed: true }] },
    ]);
    expect(screen.queryByTestId('confirm-reading')).toBeNull();
    expect(dial.value).toBe('');
  });

  it('should go back to the counter with its text selected on Escape, and send nothing', async () => {
    signInAs({ role: 'technician' });
    const { requests } = mockFetch([
      {
        method: 'POST',
        path: '/api/runs/7/readings',
        status: 422,
        body: { statusCode: 422, error: 'Unprocessable Entity', message: ['readings[0].frequency: 1900 read as 1.900 kHz, outside this range'] },
      },
    ]);
    const { dial, counter, form } = renderEntry();
    fireEvent.change(dial, { target: { value: '1900' } });
    fireEvent.change(counter, { target: { value: '1900' } });
    fireEvent.submit(form);
    const prompt = await screen.findByTestId('confirm-reading');
    fireEvent.keyDown(prompt, { key: 'Escape' });
    await waitFor(() => expect(document.activeElement).toBe(counter));
    expect(screen.queryByTestId('confirm-reading')).toBeNull();
    expect(counter.value).toBe('1900');
    expect(requests).toHaveLength(1);
  });

  it('should keep the cursor on the dial with the reason when Enter follows a dial it cannot read, and move on after a number', () => {
    signInAs({ role: 'technician' });
    const { requests } = mockFetch([]);
    const { dial, counter } = renderEntry();
    dial.focus();
    fireEvent.change(dial, { target: { value: 'abc' } });
    fireEvent.keyDown(dial, { key: 'Enter' });
    expect(document.activeElement).toBe(dial);
    expect(screen.getByRole('alert').textContent).toContain('Not a dial setting');
    expect(requests).toHaveLength(0);

    fireEvent.change(dial, { target: { value: '1800' } });
    fireEvent.keyDown(dial, { key: 'Enter' });
    expect(document.activeElement).toBe(counter);
  });
});

describe('<ReadingEntry> with the counter filling the reading', () => {
  const waiting = {
    runId: 7,
    dial: 1800,
    status: 'waiting' as const,
    startedAt: '2026-12-03T10:00:00.000Z',
    count: 3,
    spreadHz: 4.2,
    lastHz: 1_800_120,
    settleCount: 5,
    toleranceHz: 5,
    timeoutS: 30,
    reading: null,
    mean: null,
    n: null,
    sd: null,
    settledAt: null,
    message: null,
  };

  it("should send only the dial on Enter while the bridge is live, and show the server's refusal when it has none", async () => {
    signInAs({ role: 'technician' });
    const { requests } = mockFetch([
      {
        method: 'POST',
        path: '/api/runs/7/capture',
        status: 409,
        body: { statusCode: 409, error: 'Conflict', message: 'no bridge is connected for run 7 (offline since 10:02:03 UTC): start the bridge' },
      },
    ]);
    renderWithApp(
      <ReadingEntry runId={7} dialUnit="kHz" freqMinHz={1_750_000} freqMaxHz={2_000_000} counter={{ bridgeLive: true, capture: null, nextMark: null }} />,
      { path: '/runs/7' },
    );
    expect(screen.queryByLabelText('Counter')).toBeNull();
    const dial = screen.getByLabelText('Dial (kHz)') as HTMLInputElement;
    fireEvent.change(dial, { target: { value: '1800' } });
    fireEvent.submit(screen.getByRole('form', { name: 'Reading entry' }));
    await waitFor(() => expect(screen.getByRole('alert').textContent).toContain('Not taken — no bridge is connected for run 7'));
    expect(requests[0]!.body).toEqual({ dial: 1800 });
    expect(document.activeElement).toBe(dial);
  });

  it('should show the waiting line with the spread so far, and abandon the setting on Esc', async () => {
    signInAs({ role: 'technician' });
    const { requests } = mockFetch([
      { method: 'DELETE', path: '/api/runs/7/capture', status: 200, body: { ...waiting, status: 'abandoned', message: 'abandoned' } },
    ]);
    renderWithApp(
      <ReadingEntry runId={7} dialUnit="kHz" freqMinHz={1_750_000} freqMaxHz={2_000_000} counter={{ bridgeLive: true, capture: waiting, nextMark: null }} />,
      { path: '/runs/7' },
    );
    expect(screen.getByTestId('capture-waiting').textContent).toContain(
      'Waiting for the counter to settle at dial 1 800: 3 readings, spread 4.20 Hz over the last 3 (needs 5 within 5.00 Hz',
    );
    fireEvent.keyDown(screen.getByLabelText('Dial (kHz)'), { key: 'Escape' });
    await waitFor(() => expect(requests).toHaveLength(1));
    expect(requests[0]!.method).toBe('DELETE');
  });

  it("should propose the procedure's next dial mark in the dial field", () => {
    signInAs({ role: 'technician' });
    mockFetch([]);
    renderWithApp(
      <ReadingEntry runId={7} dialUnit="kHz" freqMinHz={1_750_000} freqMaxHz={2_000_000} counter={{ bridgeLive: true, capture: null, nextMark: 1900 }} />,
      { path: '/runs/7' },
    );
    expect((screen.getByLabelText('Dial (kHz)') as HTMLInputElement).value).toBe('1900');
  });
});

describe('<ReadingEntry> in a phase (time-interval) run', () => {
  it('should take the time interval in seconds, with no dial, and send it as timeInterval', async () => {
    signInAs({ role: 'engineer' });
    const stored = createReading({ seq: 3, t: 2, dial: null, frequency: 1.25e-8 });
    const { requests } = mockFetch([{ method: 'POST', path: '/api/runs/9/readings', status: 201, body: createAppendAnswer([stored]) }]);
    const onSaved = vi.fn();
    renderWithApp(<ReadingEntry dataKind="phase" runId={9} onSaved={onSaved} />, { path: '/runs/9' });

    expect(screen.queryByLabelText(/^Dial/)).toBeNull();
    expect(screen.queryByLabelText('Counter')).toBeNull();
    const value = screen.getByLabelText('Time interval (s)') as HTMLInputElement;
    fireEvent.change(value, { target: { value: '1.25e-8' } });
    expect(screen.getByTestId('time-interval-understood').textContent).toBe('= 1.250 00×10⁻⁸ s');
    fireEvent.submit(screen.getByRole('form', { name: 'Reading entry' }));

    await waitFor(() => expect(value.value).toBe(''));
    expect(requests[0]!.body).toEqual({ readings: [{ timeInterval: '1.25e-8' }] });
    expect(screen.getByTestId('last-saved').textContent).toBe('Saved #3: 1.250 00×10⁻⁸ s at 2.0 s');
    expect(onSaved).toHaveBeenCalledOnce();
  });

  it("should keep a refused time interval with the server's reason", async () => {
    signInAs({ role: 'engineer' });
    const refusal = 'run 9 holds phase readings (time interval, s): a frequency reading would make it a mixed run; send timeInterval';
    mockFetch([{ method: 'POST', path: '/api/runs/9/readings', status: 400, body: { statusCode: 400, error: 'Bad Request', message: [refusal] } }]);
    renderWithApp(<ReadingEntry dataKind="phase" runId={9} />, { path: '/runs/9' });

    const value = screen.getByLabelText('Time interval (s)') as HTMLInputElement;
    fireEvent.change(value, { target: { value: '12.5 ns' } });
    // 12.5 ns = 1.25 × 10⁻⁸ s (SI prefix nano).
    expect(screen.getByTestId('time-interval-understood').textContent).toBe('= 1.250 00×10⁻⁸ s');
    fireEvent.change(value, { target: { value: '12.5 MHz' } });
    expect(screen.getByTestId('time-interval-understood').textContent).toBe("unknown unit 'MHz' in '12.5 MHz' (use s, ms, µs, ns or ps)");
    fireEvent.change(value, { target: { value: '12.5 ns' } });
    fireEvent.submit(screen.getByRole('form', { name: 'Reading entry' }));

    expect((await screen.findByRole('alert')).textContent).toBe(`Not saved — ${refusal}`);
    expect(value.value).toBe('12.5 ns');
  });
});
