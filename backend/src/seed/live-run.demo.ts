import { AuditEvent } from '../audit/audit-event.entity.js';
import { AuditService } from '../audit/audit.service.js';
import { insertDemoBenches } from '../benches/benches.demo.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { insertDemoJob, nextDemoJobNumber } from '../jobs/jobs.demo.js';
import { insertDemoRun } from '../runs/runs.demo.js';
import type { DemoContext } from './demo-seed.js';

/** The instrument whose open warm-up run on Bench 1 takes the live demo (journey 2). */
export const DEMO_LIVE_INSTRUMENT = { make: 'Brackwell', model: 'BV-12 variable frequency oscillator', serial: 'BV12-0288' } as const;

/**
 * The benches, and for the live demo a Northgate VFO in for a drift complaint, with an open warm-up run
 * assigned to Bench 1 that the bridge can stream into.
 */
export async function seedDemoBenches(context: DemoContext): Promise<void> {
  const { manager } = context;
  // The standards' demo comes first; look the counter up by kind and due date rather than by name.
  const [inDate] = (await manager.query(
    "SELECT id FROM standards WHERE kind = 'counter' AND active = 1 AND due_date >= CURRENT_DATE() ORDER BY due_date DESC, id LIMIT 1",
  )) as Array<{ id: number }>;
  const standardId = inDate ? Number(inDate.id) : null;
  const benchId = await insertDemoBenches(manager, standardId);
  await seedLiveRun(context, benchId, standardId);
}

/** The VFO, its 40 m range, its job (in progress) and the open warm-up run on Bench 1. */
async function seedLiveRun({ manager, customerIds, userIds }: DemoContext, benchId: number, standardId: number | null): Promise<void> {
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
  const job = await insertDemoJob(manager, {
    number: await nextDemoJobNumber(manager, receivedDate),
    instrumentId,
    organizationId: customerIds.northgate,
    status: 'in_progress',
    receivedDate,
    conditionReceived: 'Working; drifts upward for the first half hour after switch-on.',
    technicianId: userIds['tech@kilocycle.test'] ?? null,
    ambientTempC: 21.4,
    humidityPct: 45,
  });
  const engineer = userIds['engineer@kilocycle.test']!;
  const run = await insertDemoRun(manager, {
    jobId: job.id,
    rangeId,
    kind: 'warmup',
    standardId,
    benchId,
    createdBy: engineer,
    startedAt: now,
    minutes: null,
    configuration: 'Cold start after a night off, dial at 7.050 MHz, counter on a 1 s gate; streamed live from Bench 1',
    notes: 'Live study: start the bridge on Bench 1 (bin/kilocycle bridge …) and watch the drift fit settle.',
  });
  const audit = new AuditService(manager.getRepository(AuditEvent));
  await audit.record(
    { actorId: userIds['tech@kilocycle.test'] ?? null, entity: 'job', entityId: job.id, action: 'create', changes: { number: job.number } },
    manager,
  );
  await audit.record({ actorId: engineer, entity: 'run', entityId: run.id, action: 'create', changes: { jobId: job.id, kind: 'warmup', benchId } }, manager);
}
