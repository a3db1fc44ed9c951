import type { TestApp } from './test-app.js';

type Headers = { Authorization: string };

/** A direct-reading kHz range, ±0.5 % of setting. */
export function khzRange(label: string, low: number, high: number, multipliers: number[] = [1]) {
  return {
    label,
    dialUnit: 'kHz',
    dialLaw: { kind: 'direct', unit: 'kHz' },
    dialMin: low,
    dialMax: high,
    freqMinHz: low * 1e3,
    freqMaxHz: high * 1e3,
    tolerance: { kind: 'percent', percent: 0.5 },
    multipliers,
  };
}

let serial = 0;

/** Creates an instrument (one kHz range unless given), a job for it and returns their ids. */
export async function instrumentWithJob(
  t: TestApp,
  headers: Headers,
  opts: { organizationId: number; ranges?: unknown[]; make?: string },
): Promise<{ instrumentId: number; rangeIds: number[]; jobId: number; jobNumber: string }> {
  serial += 1;
  const instrument = await t.http
    .post('/api/instruments')
    .set(headers)
    .send({
      organizationId: opts.organizationId,
      make: opts.make ?? 'Test Works',
      model: 'TG-1 test oscillator',
      serial: `T-${process.pid}-${serial}`,
      ranges: opts.ranges ?? [khzRange('Main 1000–2000 kHz', 1000, 2000)],
    });
  if (instrument.status !== 201) throw new Error(`instrument: ${instrument.status} ${JSON.stringify(instrument.body)}`);
  const job = await t.http.post('/api/jobs').set(headers).send({ instrumentId: instrument.body.id, receivedDate: '2025-03-01' });
  if (job.status !== 201) throw new Error(`job: ${job.status} ${JSON.stringify(job.body)}`);
  await acceptedQuoteIfRequired(t, job.body.id as number, opts.organizationId);
  return {
    instrumentId: instrument.body.id,
    rangeIds: instrument.body.ranges.map((r: { id: number }) => r.id),
    jobId: job.body.id,
    jobNumber: job.body.number,
  };
}

/**
 * Work on a job of a customer whose terms require a quote (the demo's Northgate) starts only once a quote is
 * accepted (quotes/quote-start-gate.ts). A fixture job is one the lab is ready to work on, so it gets an accepted
 * quote (no lines, recorded as by phone), written directly: the quote routes are the quotes tests' subject, and
 * sending one would add a mail to the outbox of every test that makes a job.
 */
export async function acceptedQuoteIfRequired(t: TestApp, jobId: number, organizationId: number): Promise<void> {
  const [terms] = await t.dataSource.query('SELECT requires_quote FROM customer_terms WHERE organization_id = ?', [organizationId]);
  if (!terms || !Number(terms.requires_quote)) return;
  const [lead] = await t.dataSource.query("SELECT id FROM users WHERE role = 'lead' ORDER BY id LIMIT 1");
  const result = await t.dataSource.query(
    "INSERT INTO quotes (job_id, organization_id, status, currency, validity_days, created_by, decided_by, decided_at, acceptance_channel, decision_note) VALUES (?, ?, 'accepted', 'EUR', 30, ?, ?, UTC_TIMESTAMP(3), 'phone', 'accepted for a test job')",
    [jobId, organizationId, lead.id, lead.id],
  );
  await t.dataSource.query('UPDATE quotes SET number = ? WHERE id = ?', [`Q-${String(result.insertId).padStart(6, '0')}`, result.insertId]);
}

/**
 * Opens a run and answers its id. A calibration run needs a reference standard: unless the body names
 * one (or null), the demo's in-date counter is used.
 */
export async function openRun(t: TestApp, headers: Headers, jobId: number, body: Record<string, unknown>): Promise<number> {
  if ((body.kind === 'as_found' || body.kind === 'as_left') && !('standardId' in body) && body.benchId == null) {
    body = { ...body, standardId: await inDateStandard(t) };
  }
  const res = await t.http.post(`/api/jobs/${jobId}/runs`).set(headers).send(body);
  if (res.status !== 201) throw new Error(`run: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id as number;
}

/** The id of an active standard that is in date (the demo has one). */
export async function inDateStandard(t: TestApp): Promise<number> {
  const [row] = await t.dataSource.query('SELECT id FROM standards WHERE active = 1 AND due_date >= CURRENT_DATE() ORDER BY id LIMIT 1');
  if (!row) throw new Error('no in-date standard in the test database');
  return Number(row.id);
}

/** Posts readings in batches of 1,000 (the most one request takes). */
export async function postReadings(t: TestApp, headers: Headers, runId: number, readings: Array<Record<string, unknown>>): Promise<void> {
  for (let from = 0; from < readings.length; from += 1000) {
    const res = await t.http
      .post(`/api/runs/${runId}/readings`)
      .set(headers)
      .send({ readings: readings.slice(from, from + 1000) });
    if (res.status !== 201) throw new Error(`readings: ${res.status} ${JSON.stringify(res.body).slice(0, 500)}`);
  }
}

/** Organisation ids by name, as the lab sees them. */
export async function organizationIds(t: TestApp, headers: Headers): Promise<Record<string, number>> {
  const res = await t.http.get('/api/organizations?pageSize=100').set(headers);
  return Object.fromEntries(res.body.items.map((o: { name: string; id: number }) => [o.name, o.id]));
}

export function parseChanges(value: unknown): Record<string, unknown> {
  return (typeof value === 'string' ? JSON.parse(value) : value) as Record<string, unknown>;
}
