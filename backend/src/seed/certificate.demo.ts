import type { EntityManager } from 'typeorm';
import type { DialLaw, Tolerance } from '@kilocycle/common/types';
import { insertDemoJobProcedure, insertDemoProcedure } from '../budgets/budgets.demo.js';
import { issueDemoCertificate, writeDemoCertificateSettings } from '../certificates/certificates.demo.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { insertDemoJob, nextDemoJobNumber } from '../jobs/jobs.demo.js';
import { insertDemoReadings, type DemoReadingRow } from '../readings/readings.demo.js';
import { JobReviewEventsWriter } from '../reviews/job-review-events.writer.js';
import { insertDemoRun } from '../runs/runs.demo.js';
import { addDays, lcOscillator, seededGaussian } from '../shared/demo-signals.js';
import { Standard } from '../standards/standard.entity.js';
import type { DemoContext } from './demo-seed.js';

// Invented: the oscillator, its serial and its readings exist nowhere else.
const VFO_RANGES: Array<{ label: string; low: number; high: number; step: number }> = [
  { label: '1.75–2.0 MHz', low: 1750, high: 2000, step: 25 },
  { label: '3.5–4.0 MHz', low: 3500, high: 4000, step: 50 },
  { label: '5.0–5.5 MHz (mixer drive)', low: 5000, high: 5500, step: 50 },
];
const TOLERANCE: Tolerance = { kind: 'percent', percent: 0.25 };

type At = (offset: number, hour: number, minute?: number) => Date;

/**
 * An issued certificate for Northgate Radio Club: the club's VFO, calibrated on three ranges (as found and
 * as left, three readings a setting) and signed by the demo lead through the same code path as the API,
 * so the stored PDF verifies. Also the laboratory's address and a guarded-acceptance procedure. Each
 * module writes its own rows (its demo helper); the job's review events go through the reviews module's writer.
 */
export async function seedDemoCertificates({ manager, customerIds, userIds }: DemoContext): Promise<void> {
  const today = new Date();
  const at: At = (offset, hour, minute = 0) => new Date(`${addDays(today, offset)}T${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}:00Z`);
  const tech = userIds['tech@kilocycle.test']!;
  const lead = userIds['lead@kilocycle.test']!;
  const reviewEvents = new JobReviewEventsWriter(manager.connection);

  await writeDemoCertificateSettings(manager);
  const guarded = await seedGuardedProcedure(manager);
  const counter = await manager.findOne(Standard, { where: { active: true }, order: { dueDate: 'DESC' } });
  if (!counter) throw new Error('the certificate demo needs a reference standard from the lab-records demo');
  const { instrumentId, ranges } = await seedVfo(manager, customerIds.northgate, today);
  const jobId = await seedVfoJob(manager, { instrumentId, organizationId: customerIds.northgate, technicianId: tech, procedureId: guarded, today });
  await seedVfoRuns(manager, { jobId, ranges, standardId: counter.id, technicianId: tech, at });
  await reviewEvents.record(
    { jobId, action: 'submit', actorId: tech, comment: 'All three ranges aligned; as-found range 3 was well out.', at: at(-7, 16) },
    manager,
  );
  await issueDemoCertificate(manager, reviewEvents, { jobId, signerId: lead, now: at(-6, 11, 20) });
}

/** A guarded-acceptance procedure with one extra component, and its first version. */
function seedGuardedProcedure(manager: EntityManager): Promise<number> {
  return insertDemoProcedure(manager, {
    name: 'Dial calibration, guarded acceptance',
    method:
      'Output measured at each marked setting with a frequency counter referenced to the standard named below, three readings a setting, ' +
      'after a 30-minute warm-up in the case; as found, then as left after alignment. Conformity decided with a guard band equal to U.',
    decisionRule: 'guarded',
    dialHalfDivisionPercentOfSpan: 0.1,
    driftPpm: 2,
    driftHz: 0,
    extraComponents: [{ name: 'Output loading (50 Ω pad changed)', distribution: 'rectangular', value: 1, unit: 'ppm' }],
    isDefault: false,
  });
}

/** Northgate's three-range valve VFO with a kHz-marked dial. */
async function seedVfo(manager: EntityManager, organizationId: number, today: Date): Promise<{ instrumentId: number; ranges: InstrumentRange[] }> {
  const instrumentId = (
    await manager.insert(Instrument, {
      organizationId,
      make: 'Harwick Radio',
      model: 'VFO-3 variable frequency oscillator',
      serial: 'N-0952',
      assetTag: 'NRC-03',
      description: 'Valve VFO driving the club transmitter; three switched ranges, kHz-marked dial.',
      recallIntervalMonths: 12,
      nextDueDate: addDays(today, 359),
    })
  ).identifiers[0].id as number;
  await manager.insert(
    InstrumentRange,
    VFO_RANGES.map((r, index) => ({
      instrumentId,
      position: index + 1,
      label: r.label,
      dialUnit: 'kHz' as const,
      dialLaw: { kind: 'direct', unit: 'kHz' } as DialLaw,
      dialMin: r.low,
      dialMax: r.high,
      freqMinHz: r.low * 1e3,
      freqMaxHz: r.high * 1e3,
      tolerance: TOLERANCE,
      multipliers: [1],
    })),
  );
  const ranges = await manager.find(InstrumentRange, { where: { instrumentId }, order: { position: 'ASC' } });
  return { instrumentId, ranges };
}

/** The VFO's job, in review, numbered after the year's existing jobs, with the guarded procedure chosen. */
async function seedVfoJob(
  manager: EntityManager,
  input: { instrumentId: number; organizationId: number; technicianId: number; procedureId: number; today: Date },
): Promise<number> {
  const { instrumentId, organizationId, technicianId, procedureId, today } = input;
  const receivedDate = addDays(today, -12);
  const { id: jobId } = await insertDemoJob(manager, {
    number: await nextDemoJobNumber(manager, receivedDate),
    instrumentId,
    organizationId,
    status: 'in_review',
    receivedDate,
    conditionReceived: 'Working; tuning slightly stiff on range 3; dial glass cracked at the left edge (does not obscure the scale).',
    technicianId,
    ambientTempC: 21.2,
    humidityPct: 45,
  });
  await insertDemoJobProcedure(manager, jobId, procedureId);
  return jobId;
}

/** An as-found and an as-left run on every range, three readings a setting from a drifting and a re-aligned LC model. */
async function seedVfoRuns(
  manager: EntityManager,
  input: { jobId: number; ranges: InstrumentRange[]; standardId: number; technicianId: number; at: At },
): Promise<void> {
  const { jobId, ranges, standardId, technicianId, at } = input;
  let seed = 600;
  for (const range of ranges) {
    const spec = VFO_RANGES[range.position - 1]!;
    const settings: number[] = [];
    for (let dial = spec.low; dial <= spec.high + 1e-9; dial += spec.step) settings.push(dial);
    const models = {
      as_found: lcOscillator({ inductanceH: 8e-6, strayF: 30e-12, inductanceDrift: 0.0062 + 0.001 * range.position, strayDriftF: -1.4e-12 }),
      as_left: lcOscillator({ inductanceH: 8e-6, strayF: 30e-12, inductanceDrift: 0.0002, strayDriftF: -0.08e-12 }),
    };
    for (const [index, kind] of (['as_found', 'as_left'] as const).entries()) {
      const run = await insertDemoRun(manager, {
        jobId,
        rangeId: range.id,
        kind,
        standardId,
        createdBy: technicianId,
        startedAt: at(-9 + index, 9 + range.position, 15),
        minutes: 30,
        supplyVoltage: 230,
        configuration:
          kind === 'as_found' ? 'In its case, 30 min warm-up, into 50 Ω, counter on 1 s gate' : 'After coil and trimmer alignment; in its case, 30 min warm-up',
      });
      const noise = seededGaussian(seed++);
      const rows: DemoReadingRow[] = [];
      for (const dial of settings) {
        for (let k = 0; k < 3; k++) rows.push([rows.length + 1, 20 * rows.length, dial, Math.round((models[kind](dial * 1e3) + 4 * noise()) * 10) / 10, null]);
      }
      await insertDemoReadings(manager, run.id, run.startedAt, rows, 'manual');
    }
  }
}
