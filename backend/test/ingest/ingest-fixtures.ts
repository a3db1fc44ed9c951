import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { io, type Socket } from 'socket.io-client';
import type { DataSource } from 'typeorm';
import type { RunKind } from '@kilocycle/common/types';
import { hashBenchToken, newBenchToken } from '../../src/benches/bench-token.js';
import type { TestApp } from '../support/test-app.js';

/** Lab records for socket tests, written straight to the tables (the REST modules are tested elsewhere). */
export type RunFixture = { runId: number; jobId: number; rangeId: number; organizationId: number };

export async function organizationId(ds: DataSource, name: string): Promise<number> {
  const [row] = await ds.query('SELECT id FROM organizations WHERE name = ?', [name]);
  return Number(row.id);
}

/** A bench with a fresh token (returned in clear, as the admin would see it once). */
export async function createBench(ds: DataSource, name = `Bench ${randomUUID().slice(0, 8)}`): Promise<{ benchId: number; token: string; name: string }> {
  const token = newBenchToken();
  const result = await ds.query('INSERT INTO benches (name, token_hash, token_issued_at) VALUES (?, ?, UTC_TIMESTAMP())', [name, hashBenchToken(token)]);
  return { benchId: Number(result.insertId), token, name };
}

/** An instrument with one 3.5–7.5 MHz range (dial in kHz), a job for it and a run on the range. */
export async function createRun(
  ds: DataSource,
  options: {
    organizationId: number;
    benchId: number | null;
    kind?: RunKind;
    dataKind?: 'frequency' | 'phase';
    status?: 'open' | 'closed';
    jobStatus?: string;
    startedAt?: Date;
  },
): Promise<RunFixture> {
  const tag = randomUUID().slice(0, 8);
  const instrument = await ds.query('INSERT INTO instruments (organization_id, make, model, serial) VALUES (?, ?, ?, ?)', [
    options.organizationId,
    'Test Oscillator Co',
    'VFO-7',
    `SN-${tag}`,
  ]);
  const range = await ds.query(
    `INSERT INTO instrument_ranges (instrument_id, position, label, dial_unit, dial_law, dial_min, dial_max, freq_min_hz, freq_max_hz, tolerance, multipliers)
     VALUES (?, 1, 'Band A', 'kHz', ?, 3500, 7500, 3500000, 7500000, ?, '[1]')`,
    [instrument.insertId, JSON.stringify({ kind: 'direct', unit: 'kHz' }), JSON.stringify({ kind: 'percent', percent: 0.5 })],
  );
  const job = await ds.query('INSERT INTO jobs (number, instrument_id, organization_id, status, received_date) VALUES (?, ?, ?, ?, CURRENT_DATE())', [
    `T-${tag}`,
    instrument.insertId,
    options.organizationId,
    options.jobStatus ?? 'in_progress',
  ]);
  const [creator] = await ds.query("SELECT id FROM users WHERE role = 'technician' LIMIT 1");
  const run = await ds.query('INSERT INTO runs (job_id, range_id, kind, data_kind, status, bench_id, started_at, created_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?)', [
    job.insertId,
    range.insertId,
    options.kind ?? 'warmup',
    options.dataKind ?? 'frequency',
    options.status ?? 'open',
    options.benchId,
    options.startedAt ?? new Date(),
    creator.id,
  ]);
  return { runId: Number(run.insertId), jobId: Number(job.insertId), rangeId: Number(range.insertId), organizationId: options.organizationId };
}

export async function readingCount(ds: DataSource, runId: number): Promise<number> {
  const [row] = await ds.query('SELECT COUNT(*) AS n FROM readings WHERE run_id = ?', [runId]);
  return Number(row.n);
}

/** Makes the test app listen on a free loopback port and returns its base URL. */
export async function listen(t: TestApp): Promise<string> {
  await t.app.listen(0, '127.0.0.1');
  const { port } = t.app.getHttpServer().address() as AddressInfo;
  return `http://127.0.0.1:${port}`;
}

/** Connects a socket.io client and waits for connect (resolves) or connect_error (rejects with its message). */
export function connect(url: string, namespace: string, token: string | undefined, sockets: Socket[]): Promise<Socket> {
  const socket = io(url + namespace, { auth: token === undefined ? {} : { token }, transports: ['websocket'], reconnection: false, forceNew: true });
  sockets.push(socket);
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', (error: Error & { data?: unknown }) => reject(error));
  });
}

/** Emits with an acknowledgement and a time limit (socket.timeout), resolving to the server's answer. */
export function request<T>(socket: Socket, event: string, payload: unknown, timeoutMs = 5000): Promise<T> {
  return socket.timeout(timeoutMs).emitWithAck(event, payload) as Promise<T>;
}
