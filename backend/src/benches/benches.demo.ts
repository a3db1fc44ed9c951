import { AuditEvent } from '../audit/audit-event.entity.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { Job } from '../jobs/job.entity.js';
import { Run } from '../runs/run.entity.js';
import type { DemoContext } from '../seed/demo-seed.js';
import { Bench } from './bench.entity.js';

export const DEMO_BENCHES = { main: 'Bench 1', cage: 'Bench 2 (screened room)' } as const;
/** The instrument whose open warm-up run on Bench 1 takes the live demo (journey 2). */
export const DEMO_LIVE_INSTRUMENT = { make: 'Brackwell', model: 'BV-12 variable frequency oscillator', serial: 'BV12-0288' } as const;

/**
 * Two benches (Bench 1 with the in-date counter as its default standard, no tokens yet: an admin
 * issues one, or `bin/kilocycle bench token "Bench 1"`), and for the live demo a Northgate VFO in
 * for a drift complaint, with an open warm-up run assigned to Bench 1 that the bridge can stream into.
 */
export async function seedDemoBenches({ manager, customerIds, userIds }: DemoContext): Promise<void> {
  // The standards' demo comes first; look the counter up by kind and due date rather than by name.
  const [inDate] = (await manager.query(
    "SELECT id FROM standards WHERE kind = 'counter' AND active = 1 AND due_date >= CURRENT_DATE() ORDER BY due_date DESC, id LIMIT 1",
  )) as Array<{ id: number }>;
  const standardId = inDate ? Number(inDate.id) : null;
  const benchId = (await manager.insert(Bench, { name: DEMO_BENCHES.main, location: 'Main bench, under the window', defaultStandardId: standardId })).identifiers[0].id as number;
  await manager.insert(Bench, { name: DEMO_BENCHES.cage, location: 'Screened room, for receivers', defaultStandardId: standardId });

  const now = new Date();
  const receivedDate = new Date(now.getTime() - 2 * 86400_000).toISOString().slice(0, 10);
  const instrumentId = (
    await manager.insert(Instrument, {
      organizationId: customerIds.northgate,
      ...DEMO_LIVE_INSTRUMENT,
      assetTag: 'NRC-19',
      description: 'The club transmitter’s valve VFO (a pentode Clapp oscillator), kHz dial; members report it drifts for the first half hour.',
      recallIntervalMonths: 12,
      nextDueDate: null,
    })
  ).identifiers[0].id as number;
  const rangeId = (
    await manager.insert(InstrumentRange, {
      instrumentId,
      position: 1,
      label: '40 m (7.000–7.200 MHz)',
      dialUnit: 'kHz',
      dialLaw: { kind: 'direct', unit: 'kHz' },
      dialMin: 7000,
      dialMax: 7200,
      freqMinHz: 7_000_000,
      freqMaxHz: 7_200_000,
      tolerance: { kind: 'percent', percent: 0.05 },
      multipliers: [1],
    })
  ).identifiers[0].id as number;
  const year = receivedDate.slice(0, 4);
  const [last] = (await manager.query('SELECT number FROM jobs WHERE number LIKE ? ORDER BY number DESC LIMIT 1', [`J${year}-%`])) as Array<{ number: string }>;
  const number = `J${year}-${String((last ? Number(last.number.slice(6)) : 0) + 1).padStart(4, '0')}`;
  const jobId = (
    await manager.insert(Job, {
      number,
      instrumentId,
      organizationId: customerIds.northgate,
      status: 'in_progress',
      receivedDate,
      conditionReceived: 'Working; drifts upward for the first half hour after switch-on.',
      technicianId: userIds['tech@kilocycle.test'] ?? null,
      ambientTempC: 21.4,
      humidityPct: 45,
      notes: null,
    })
  ).identifiers[0].id as number;
  const engineer = userIds['engineer@kilocycle.test']!;
  const runId = (
    await manager.insert(Run, {
      jobId,
      rangeId,
      kind: 'warmup',
      status: 'open',
      benchId,
      standardId,
      standardOverrideReason: null,
      supplyVoltage: null,
      configuration: 'Cold start after a night off, dial at 7.050 MHz, counter on a 1 s gate; streamed live from Bench 1',
      notes: 'Live study: start the bridge on Bench 1 (bin/kilocycle bridge …) and watch the drift fit settle.',
      startedAt: now,
      endedAt: null,
      createdById: engineer,
    })
  ).identifiers[0].id as number;
  await manager.insert(AuditEvent, [
    { actorId: null, entity: 'bench', entityId: String(benchId), action: 'create', changes: { name: DEMO_BENCHES.main, defaultStandardId: standardId } as never },
    { actorId: userIds['tech@kilocycle.test'] ?? null, entity: 'job', entityId: String(jobId), action: 'create', changes: { number } as never },
    { actorId: engineer, entity: 'run', entityId: String(runId), action: 'create', changes: { jobId, kind: 'warmup', benchId } as never },
  ]);
}
