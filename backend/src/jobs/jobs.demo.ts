import type { EntityManager } from 'typeorm';
import type { DialLaw, JobStatus, RunKind, Tolerance } from '@kilocycle/common/types';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { Run } from '../runs/run.entity.js';
import type { DemoContext } from '../seed/demo-seed.js';
import { DEMO_STANDARDS } from '../standards/standards.demo.js';
import { Standard } from '../standards/standard.entity.js';
import { addDays, lcOscillator, seededGaussian, warmupCurve } from './demo-signals.js';
import { Job } from './job.entity.js';

// The demo scenario is invented: the instruments, makers, serials and readings below exist nowhere else.

type RangeSpec = { label: string; dialUnit: 'kHz' | 'MHz'; law: DialLaw; dial: [number, number]; hz: [number, number]; tolerance: Tolerance; multipliers: number[] };
type ReadingRow = [number, number, number | null, number, number | null];

const HALF_PERCENT: Tolerance = { kind: 'percent', percent: 0.5 };
const kHzRange = (label: string, low: number, high: number, multipliers: number[]): RangeSpec => ({
  label,
  dialUnit: 'kHz',
  law: { kind: 'direct', unit: 'kHz' },
  dial: [low, high],
  hz: [low * 1e3, high * 1e3],
  tolerance: HALF_PERCENT,
  multipliers,
});
// The club's generator: a band-spread range per band it is used on, plus the IF alignment range.
const GENERATOR_RANGES: RangeSpec[] = [
  kHzRange('A  1750–2000 kHz', 1750, 2000, [1, 2, 4]),
  kHzRange('B  3500–4000 kHz', 3500, 4000, [1, 2]),
  kHzRange('C  7000–7300 kHz', 7000, 7300, [1, 2, 3, 4]),
  kHzRange('D  150–400 kHz (IF alignment)', 150, 400, [1]),
];
// The receiver's dial reads the signal frequency; its local oscillator runs 455 kHz above it.
const receiverLo = (label: string, low: number, high: number): RangeSpec => ({
  label,
  dialUnit: 'MHz',
  law: { kind: 'table', points: [{ dial: low, frequency: low * 1e6 + 455e3 }, { dial: high, frequency: high * 1e6 + 455e3 }] },
  dial: [low, high],
  hz: [low * 1e6 + 455e3, high * 1e6 + 455e3],
  tolerance: { kind: 'percent', percent: 0.2 },
  multipliers: [1],
});
const RECEIVER_RANGES = [receiverLo('Band 2 LO (signal 1.6–4.0 MHz)', 1.6, 4.0), receiverLo('Band 3 LO (signal 4.0–10.0 MHz)', 4.0, 10.0)];
const REFERENCE_RANGES: RangeSpec[] = [
  { label: '5 MHz output', dialUnit: 'MHz', law: { kind: 'direct', unit: 'MHz' }, dial: [4.99, 5.01], hz: [4.99e6, 5.01e6], tolerance: { kind: 'ppm_hz', ppm: 1, hz: 0 }, multipliers: [1] },
  { label: '1 MHz output', dialUnit: 'MHz', law: { kind: 'direct', unit: 'MHz' }, dial: [0.99, 1.01], hz: [0.99e6, 1.01e6], tolerance: { kind: 'ppm_hz', ppm: 1, hz: 0 }, multipliers: [1] },
];

/** Instruments with ranges, jobs at several stages, and runs with generated readings. */
export async function seedDemoLabRecords({ manager, labId, customerIds, userIds }: DemoContext): Promise<void> {
  const today = new Date();
  const day = (offset: number, hour = 9, minute = 0) => {
    const d = new Date(`${addDays(today, offset)}T00:00:00Z`);
    d.setUTCHours(hour, minute);
    return d;
  };
  const tech = userIds['tech@kilocycle.test']!;
  const lead = userIds['lead@kilocycle.test']!;
  const engineer = userIds['engineer@kilocycle.test']!;
  const counterA = await manager.findOneByOrFail(Standard, { name: DEMO_STANDARDS.inDate });

  const generator1 = await insertInstrument(manager, {
    organizationId: customerIds.northgate, make: 'Harwick Radio', model: 'SG-4 signal generator', serial: 'N-1041', assetTag: 'NRC-07',
    description: 'Valve signal generator with a kHz-marked band-spread dial; the club station’s bench generator.', nextDueDate: addDays(today, 20),
  }, GENERATOR_RANGES);
  const generator2 = await insertInstrument(manager, {
    organizationId: customerIds.northgate, make: 'Harwick Radio', model: 'SG-4 signal generator', serial: 'N-1187', assetTag: 'NRC-11',
    description: 'The club’s second SG-4, used for receiver alignment evenings.', nextDueDate: addDays(today, -10),
  }, GENERATOR_RANGES);
  const receiver = await insertInstrument(manager, {
    organizationId: customerIds.saltmarsh, make: 'Marlow & Reade', model: 'CR-7 communications receiver', serial: 'CR7-5520', assetTag: null,
    description: 'Restoration project; local oscillator measured at the LO test point.', nextDueDate: null,
  }, RECEIVER_RANGES);
  const reference = await insertInstrument(manager, {
    organizationId: labId, make: 'Quarry Lane', model: 'XR-5 crystal reference', serial: 'QL-XR5-01', assetTag: 'QL-014',
    description: 'The lab’s own 5 MHz / 1 MHz crystal reference, house-built; checked against Bench counter A.', nextDueDate: addDays(today, 150),
  }, REFERENCE_RANGES);

  const numbers = jobNumbers();
  // 1. Northgate generator N-1041: as-found and as-left done, submitted for review.
  const job1 = await insertJob(manager, numbers, {
    instrument: generator1, receivedDate: addDays(today, -20), status: 'in_review', technicianId: tech,
    conditionReceived: 'Working. Dial reads high at the low end of range A; case and knobs complete.', ambientTempC: 21.5, humidityPct: 46,
  });
  const lowRange = generator1.ranges[0]!;
  const settings = Array.from({ length: 11 }, (_, i) => 1750 + 25 * i);
  const asFoundModel = lcOscillator({ inductanceH: 10e-6, strayF: 40e-12, inductanceDrift: 0.045, strayDriftF: -21e-12 });
  const asLeftModel = lcOscillator({ inductanceH: 10e-6, strayF: 40e-12, inductanceDrift: 0.0012, strayDriftF: -0.9e-12 });
  const asFound = await insertRun(manager, { job: job1, range: lowRange, kind: 'as_found', standardId: counterA.id, createdBy: tech, startedAt: day(-14, 9, 10), minutes: 25,
    configuration: 'In its case, 30 min warm-up, output into 50 Ω, counter on 1 s gate' });
  await insertReadings(manager, asFound.id, asFound.startedAt, calibrationReadings(settings, asFoundModel, 11));
  const asLeft = await insertRun(manager, { job: job1, range: lowRange, kind: 'as_left', standardId: counterA.id, createdBy: tech, startedAt: day(-13, 14, 5), minutes: 25,
    configuration: 'After oscillator coil slug and trimmer adjustment; in its case, 30 min warm-up', notes: 'Coil slug turned in about a quarter turn, trimmer reset at 2000 kHz.' });
  await insertReadings(manager, asLeft.id, asLeft.startedAt, calibrationReadings(settings, asLeftModel, 12));

  // 2. Northgate generator N-1187: in progress, an as-found run open and empty for the bench page.
  const job2 = await insertJob(manager, numbers, {
    instrument: generator2, receivedDate: addDays(today, -5), status: 'in_progress', technicianId: tech,
    conditionReceived: 'Working; frequency drifts for the first minutes after switch-on.', ambientTempC: 21.8, humidityPct: 44,
  });
  await insertRun(manager, { job: job2, range: generator2.ranges[0]!, kind: 'as_found', standardId: counterA.id, createdBy: tech, startedAt: day(-1, 10, 0), minutes: null,
    configuration: 'In its case, output into 50 Ω' });

  // 3. Saltmarsh receiver: two warm-up studies on the LO, before and after a regulator was fitted.
  const job3 = await insertJob(manager, numbers, {
    instrument: receiver, receivedDate: addDays(today, -10), status: 'in_progress', technicianId: tech,
    conditionReceived: 'Recapped by the owner; LO drifts noticeably after switch-on.', ambientTempC: 22.0, humidityPct: 50,
  });
  const band3 = receiver.ranges[1]!;
  const before = await insertRun(manager, { job: job3, range: band3, kind: 'warmup', standardId: counterA.id, createdBy: engineer, startedAt: day(-9, 8, 30), minutes: 120,
    configuration: 'Dial at 7.000 MHz, BFO off, cold start after 12 h off; original unregulated HT', notes: 'Before the regulator change.' });
  await insertReadings(manager, before.id, before.startedAt, warmupReadings(warmupCurve(7_453_820, 2_350, 840), 2.0, 21));
  const after = await insertRun(manager, { job: job3, range: band3, kind: 'warmup', standardId: counterA.id, createdBy: engineer, startedAt: day(-6, 8, 30), minutes: 120,
    configuration: 'Dial at 7.000 MHz, BFO off, cold start after 12 h off; gas regulator valve fitted on the oscillator HT', notes: 'After the regulator change.' });
  await insertReadings(manager, after.id, after.startedAt, warmupReadings(warmupCurve(7_453_905, 900, 520), 2.0, 22));

  // 4. The lab's own reference: a one-hour stability run at one reading a second.
  const job4 = await insertJob(manager, numbers, {
    instrument: reference, receivedDate: addDays(today, -3), status: 'in_progress', technicianId: null,
    conditionReceived: 'In service; routine stability check.', ambientTempC: 21.0, humidityPct: 42,
  });
  const stability = await insertRun(manager, { job: job4, range: reference.ranges[0]!, kind: 'stability', standardId: counterA.id, createdBy: engineer, startedAt: day(-2, 7, 0), minutes: 60,
    configuration: 'Oven at temperature for 48 h; 1 s gate, one reading a second' });
  await insertReadings(manager, stability.id, stability.startedAt, stabilityReadings(5_000_000.0123, 3600, 23));

  await insertAudit(manager, [
    [tech, 'job', job1.id, 'create', { number: job1.number }, day(-20, 11)],
    [tech, 'run', asFound.id, 'create', { jobId: job1.id, kind: 'as_found', rangeLabel: lowRange.label }, asFound.startedAt],
    [tech, 'job', job1.id, 'status', { from: 'received', to: 'in_progress', comment: `run ${asFound.id} opened` }, asFound.startedAt],
    [tech, 'run', asFound.id, 'status', { from: 'open', to: 'closed' }, day(-14, 9, 35)],
    [tech, 'run', asLeft.id, 'create', { jobId: job1.id, kind: 'as_left', rangeLabel: lowRange.label }, asLeft.startedAt],
    [tech, 'run', asLeft.id, 'status', { from: 'open', to: 'closed' }, day(-13, 14, 30)],
    [tech, 'job', job1.id, 'status', { from: 'in_progress', to: 'in_review', comment: 'Range A aligned; ready for review.' }, day(-13, 15)],
    [tech, 'job', job2.id, 'create', { number: job2.number }, day(-5, 10)],
    [tech, 'job', job3.id, 'create', { number: job3.number }, day(-10, 10)],
    [lead, 'job', job4.id, 'create', { number: job4.number }, day(-3, 10)],
  ]);
}

async function insertInstrument(
  manager: EntityManager,
  fields: Pick<Instrument, 'organizationId' | 'make' | 'model' | 'serial' | 'assetTag' | 'description' | 'nextDueDate'>,
  ranges: RangeSpec[],
): Promise<{ id: number; ranges: InstrumentRange[] }> {
  const id = (await manager.insert(Instrument, { ...fields, recallIntervalMonths: 12 })).identifiers[0].id as number;
  await manager.insert(
    InstrumentRange,
    ranges.map((r, index) => ({
      instrumentId: id, position: index + 1, label: r.label, dialUnit: r.dialUnit, dialLaw: r.law,
      dialMin: r.dial[0], dialMax: r.dial[1], freqMinHz: r.hz[0], freqMaxHz: r.hz[1], tolerance: r.tolerance, multipliers: r.multipliers,
    })),
  );
  return { id, ranges: await manager.find(InstrumentRange, { where: { instrumentId: id }, order: { position: 'ASC' } }) };
}

function jobNumbers(): (receivedDate: string) => string {
  const counters = new Map<string, number>();
  return (receivedDate) => {
    const year = receivedDate.slice(0, 4);
    const next = (counters.get(year) ?? 0) + 1;
    counters.set(year, next);
    return `J${year}-${String(next).padStart(4, '0')}`;
  };
}

async function insertJob(
  manager: EntityManager,
  numbers: (receivedDate: string) => string,
  spec: { instrument: { id: number }; receivedDate: string; status: JobStatus; technicianId: number | null; conditionReceived: string; ambientTempC: number; humidityPct: number },
): Promise<{ id: number; number: string }> {
  const instrument = await manager.findOneByOrFail(Instrument, { id: spec.instrument.id });
  const number = numbers(spec.receivedDate);
  const result = await manager.insert(Job, {
    number, instrumentId: instrument.id, organizationId: instrument.organizationId, status: spec.status, receivedDate: spec.receivedDate,
    conditionReceived: spec.conditionReceived, technicianId: spec.technicianId, ambientTempC: spec.ambientTempC, humidityPct: spec.humidityPct, notes: null,
  });
  return { id: result.identifiers[0].id as number, number };
}

async function insertRun(
  manager: EntityManager,
  spec: { job: { id: number }; range: InstrumentRange; kind: RunKind; standardId: number; createdBy: number; startedAt: Date; minutes: number | null; configuration: string; notes?: string },
): Promise<{ id: number; startedAt: Date }> {
  const result = await manager.insert(Run, {
    jobId: spec.job.id, rangeId: spec.range.id, kind: spec.kind, status: spec.minutes === null ? 'open' : 'closed', benchId: null, standardId: spec.standardId,
    standardOverrideReason: null, supplyVoltage: null, configuration: spec.configuration, notes: spec.notes ?? null, startedAt: spec.startedAt,
    endedAt: spec.minutes === null ? null : new Date(spec.startedAt.getTime() + spec.minutes * 60_000), createdById: spec.createdBy,
  });
  return { id: result.identifiers[0].id as number, startedAt: spec.startedAt };
}

/** Two readings at each dial setting, half a minute apart, with a few hertz of counter scatter. */
function calibrationReadings(settingsKhz: number[], oscillator: (markedHz: number) => number, seed: number): ReadingRow[] {
  const noise = seededGaussian(seed);
  const rows: ReadingRow[] = [];
  settingsKhz.forEach((dial) => {
    for (let k = 0; k < 2; k++) rows.push([rows.length + 1, 60 * rows.length, dial, Math.round((oscillator(dial * 1e3) + 12 * noise()) * 10) / 10, null]);
  });
  return rows;
}

/** One reading every 10 s for two hours after a cold start, with white counter noise. */
function warmupReadings(curve: (t: number) => number, noiseHz: number, seed: number): ReadingRow[] {
  const noise = seededGaussian(seed);
  return Array.from({ length: 720 }, (_, i): ReadingRow => [i + 1, 10 * i, null, Math.round((curve(10 * i) + noiseHz * noise()) * 100) / 100, null]);
}

/** One reading a second: white frequency noise plus a slow random walk, as a good crystal oscillator shows. */
function stabilityReadings(centreHz: number, count: number, seed: number): ReadingRow[] {
  const noise = seededGaussian(seed);
  let walk = 0;
  return Array.from({ length: count }, (_, i): ReadingRow => {
    walk += 2e-5 * noise();
    return [i + 1, i, null, centreHz + walk + 1e-3 * noise(), null];
  });
}

/** Multi-row INSERTs of a run's readings (source import), 1,000 a statement. */
async function insertReadings(manager: EntityManager, runId: number, startedAt: Date, rows: ReadingRow[]): Promise<void> {
  for (let from = 0; from < rows.length; from += 1000) {
    const values = rows.slice(from, from + 1000).map(([seq, t, dial, frequency, aux]) => [runId, seq, t, dial, frequency, aux, 'import', new Date(startedAt.getTime() + t * 1000)]);
    await manager.query('INSERT INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source, received_at) VALUES ?', [values]);
  }
}

async function insertAudit(manager: EntityManager, events: Array<[number, string, number, string, Record<string, unknown>, Date]>): Promise<void> {
  const values = events.map(([actor, entity, id, action, changes, at]) => [actor, at, entity, String(id), action, JSON.stringify(changes)]);
  await manager.query('INSERT INTO audit_events (actor_id, at, entity, entity_id, action, changes) VALUES ?', [values]);
}
