import type { EntityManager } from 'typeorm';
import type { BillingLineInput } from '@kilocycle/common/types';
import { Instrument } from '../instruments/instrument.entity.js';
import { seedDemoInvoice } from '../invoices/invoices.demo.js';
import { insertDemoJob, nextDemoJobNumber } from '../jobs/jobs.demo.js';
import { addDays } from '../shared/demo-signals.js';
import type { DemoContext } from './demo-seed.js';

// Invented lines for the earlier jobs, at last year's prices (the newest job's invoice starts from its quote or the price list).
const LINES = {
  dial: (ranges: number): BillingLineInput => ({
    code: 'CAL-RNG',
    description: 'Calibration, per range',
    unit: 'per_range',
    quantityMilli: ranges * 1000,
    unitPriceMinor: 4_500,
  }),
  job: (): BillingLineInput => ({
    code: 'JOB-ADM',
    description: 'Job handling and certificate',
    unit: 'per_job',
    quantityMilli: 1000,
    unitPriceMinor: 3_500,
  }),
  study: (milli: number): BillingLineInput => ({
    code: 'STAB-HR',
    description: 'Stability study, per hour',
    unit: 'per_hour',
    quantityMilli: milli,
    unitPriceMinor: 2_800,
  }),
};

/**
 * Invoices in every state for the demo customers, issued in date order so the numbers run INV-000001 upwards:
 *   Northgate: an earlier job paid; one credited in full (calibration repeated at the lab's cost); and the VFO
 *   job's invoice issued and unpaid (pay before release), so the Northgate client sees the certificate held and
 *   the button that pays.
 *   Saltmarsh: one overdue, one part paid with a small credit note, one issued and not yet due, and a draft the
 *   lead has not issued.
 * The earlier jobs are closed visits of an instrument of each customer's that is not due again for months (issued,
 * without a certificate of their own here), so the other demo instruments' newest jobs stay what they were.
 */
export async function seedDemoInvoices({ manager, customerIds, userIds }: DemoContext): Promise<void> {
  const today = new Date();
  const at = (offset: number, hour = 10) => new Date(`${addDays(today, offset)}T${String(hour).padStart(2, '0')}:00:00Z`);
  const lead = userIds['lead@kilocycle.test']!;
  const tech = userIds['tech@kilocycle.test']!;
  const northgateVfoJob = await issuedJobOf(manager, customerIds.northgate);
  const instruments = {
    northgate: await earlierInstrument(manager, customerIds.northgate, { make: 'Pellham', model: 'Crystal marker CM-4', serial: 'N-0288', today }),
    saltmarsh: await earlierInstrument(manager, customerIds.saltmarsh, { make: 'Ostrander', model: 'Heterodyne wavemeter HW-2', serial: 'SW-5512', today }),
  };
  const pastJob = (customer: keyof typeof instruments, offset: number) =>
    earlierJob(manager, { organizationId: customerIds[customer], instrumentId: instruments[customer], receivedOffset: offset, technicianId: tech, today });

  const northgatePaid = await pastJob('northgate', -130);
  const saltmarshOverdue = await pastJob('saltmarsh', -95);
  const northgateCredited = await pastJob('northgate', -75);
  const saltmarshPartPaid = await pastJob('saltmarsh', -40);
  const saltmarshIssued = await pastJob('saltmarsh', -16);
  const saltmarshDraft = await pastJob('saltmarsh', -5);

  await seedDemoInvoice(manager, {
    jobId: northgatePaid,
    createdAt: at(-122),
    lines: [LINES.dial(2), LINES.job()],
    actorId: lead,
    steps: [
      { kind: 'issue', at: at(-121) },
      { kind: 'payment', amountMinor: 'balance', at: at(-118, 15) },
    ],
  });
  await seedDemoInvoice(manager, {
    jobId: saltmarshOverdue,
    createdAt: at(-86),
    lines: [LINES.dial(3), LINES.study(4_250), LINES.job()],
    actorId: lead,
    steps: [{ kind: 'issue', at: at(-85) }],
  });
  await seedDemoInvoice(manager, {
    jobId: northgateCredited,
    createdAt: at(-66),
    lines: [LINES.dial(1), LINES.job()],
    actorId: lead,
    steps: [
      { kind: 'issue', at: at(-65) },
      { kind: 'credit', amountMinor: 'balance', reason: 'Calibration repeated at the laboratory’s cost after a counter fault', at: at(-60) },
    ],
  });
  await seedDemoInvoice(manager, {
    jobId: saltmarshPartPaid,
    createdAt: at(-31),
    lines: [LINES.dial(4), LINES.study(2_000), LINES.job()],
    actorId: lead,
    steps: [
      { kind: 'issue', at: at(-30) },
      { kind: 'credit', amountMinor: 1_000, reason: 'Courier charge refunded: the instrument was collected by hand', at: at(-28) },
      { kind: 'payment', amountMinor: 10_000, at: at(-20, 14) },
    ],
  });
  await seedDemoInvoice(manager, {
    jobId: saltmarshIssued,
    createdAt: at(-9),
    lines: [LINES.dial(2), LINES.job()],
    actorId: lead,
    steps: [{ kind: 'issue', at: at(-8) }],
  });
  // The VFO job: its invoice from the quote (or the price list), issued at signing and not yet paid.
  await seedDemoInvoice(manager, {
    jobId: northgateVfoJob,
    createdAt: at(-6, 11),
    linesWhenNone: [LINES.dial(3), LINES.job()],
    actorId: lead,
    steps: [{ kind: 'issue', at: at(-6, 12) }],
  });
  await seedDemoInvoice(manager, { jobId: saltmarshDraft, createdAt: at(-2), lines: [LINES.dial(1), LINES.job()], actorId: lead, steps: [] });
}

/** The customer's job with an issued certificate (the certificate demo's VFO job for Northgate). */
async function issuedJobOf(manager: EntityManager, organizationId: number): Promise<number> {
  const [row] = (await manager.query("SELECT id FROM jobs WHERE organization_id = ? AND status = 'issued' ORDER BY id DESC LIMIT 1", [
    organizationId,
  ])) as Array<{
    id: number;
  }>;
  if (!row) throw new Error('the invoices demo needs the certificate demo’s issued job');
  return Number(row.id);
}

/** An instrument the customer has had calibrated before, next due well after the recall notice period. */
async function earlierInstrument(
  manager: EntityManager,
  organizationId: number,
  input: { make: string; model: string; serial: string; today: Date },
): Promise<number> {
  const result = await manager.insert(Instrument, {
    organizationId,
    make: input.make,
    model: input.model,
    serial: input.serial,
    assetTag: null,
    description: 'Bench reference, calibrated yearly.',
    recallIntervalMonths: 12,
    nextDueDate: addDays(input.today, 240),
  });
  return result.identifiers[0].id as number;
}

/** An earlier, closed visit of that instrument. */
async function earlierJob(
  manager: EntityManager,
  input: { organizationId: number; instrumentId: number; receivedOffset: number; technicianId: number; today: Date },
): Promise<number> {
  const receivedDate = addDays(input.today, input.receivedOffset);
  const { id } = await insertDemoJob(manager, {
    number: await nextDemoJobNumber(manager, receivedDate),
    instrumentId: input.instrumentId,
    organizationId: input.organizationId,
    receivedDate,
    status: 'issued',
    technicianId: input.technicianId,
    conditionReceived: 'Good; returned after calibration.',
    ambientTempC: 21.5,
    humidityPct: 44,
  });
  return id;
}
