import type { EntityManager } from 'typeorm';
import type { DialLaw, Tolerance } from '@kilocycle/common/types';
import { AuditEvent } from '../audit/audit-event.entity.js';
import { AuditService, type AuditEntry } from '../audit/audit.service.js';
import { insertDemoComparison } from '../comparisons/comparisons.demo.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { demoJobNumbers, insertDemoJob, type DemoJobSpec } from '../jobs/jobs.demo.js';
import { insertDemoReadings, type DemoReadingRow } from '../readings/readings.demo.js';
import { insertDemoRun, type DemoRunSpec } from '../runs/runs.demo.js';
import { addDays, lcOscillator, seededGaussian, warmupCurve } from '../shared/demo-signals.js';
import { DEMO_STANDARDS } from '../standards/standards.demo.js';
import { Standard } from '../standards/standard.entity.js';
import type { DemoContext } from './demo-seed.js';

// The demo scenario is invented: the instruments, makers, serials and readings below exist nowhere else.

type RangeSpec = {
  label: string;
  dialUnit: 'kHz' | 'MHz';
  law: DialLaw;
  dial: [number, number];
  hz: [number, number];
  tolerance: Tolerance;
  multipliers: number[];
};
type ReadingRow = DemoReadingRow;

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
  law: {
    kind: 'table',
    points: [
      { dial: low, frequency: low * 1e6 + 455e3 },
      { dial: high, frequency: high * 1e6 + 455e3 },
    ],
  },
  dial: [low, high],
  hz: [low * 1e6 + 455e3, high * 1e6 + 455e3],
  tolerance: { kind: 'percent', percent: 0.2 },
  multipliers: [1],
});
const RECEIVER_RANGES = [receiverLo('Band 2 LO (signal 1.6–4.0 MHz)', 1.6, 4.0), receiverLo('Band 3 LO (signal 4.0–10.0 MHz)', 4.0, 10.0)];
const REFERENCE_RANGES: RangeSpec[] = [
  {
    label: '5 MHz output',
    dialUnit: 'MHz',
    law: { kind: 'direct', unit: 'MHz' },
    dial: [4.99, 5.01],
    hz: [4.99e6, 5.01e6],
    tolerance: { kind: 'ppm_hz', ppm: 1, hz: 0 },
    multipliers: [1],
  },
  {
    label: '1 MHz output',
    dialUnit: 'MHz',
    law: { kind: 'direct', unit: 'MHz' },
    dial: [0.99, 1.01],
    hz: [0.99e6, 1.01e6],
    tolerance: { kind: 'ppm_hz', ppm: 1, hz: 0 },
    multipliers: [1],
  },
];

type InstrumentFields = Pick<Instrument, 'organizationId' | 'make' | 'model' | 'serial' | 'assetTag' | 'description' | 'nextDueDate'>;
type DemoInstrument = { id: number; organizationId: number; ranges: InstrumentRange[] };

/** What every step of the lab-records demo shares: the transaction, the people, the dates and the job numbering. */
type LabScene = {
  manager: EntityManager;
  audit: AuditService;
  today: Date;
  day: (offset: number, hour?: number, minute?: number) => Date;
  tech: number;
  lead: number;
  engineer: number;
  counterId: number;
  number: (receivedDate: string) => string;
};

/**
 * Instruments with ranges, jobs at several stages, and runs with generated readings, written through the
 * owners' demo helpers (jobs, runs, readings) and AuditService; one step per job.
 */
export async function seedDemoLabRecords({ manager, labId, customerIds, userIds }: DemoContext): Promise<void> {
  const today = new Date();
  const scene: LabScene = {
    manager,
    audit: new AuditService(manager.getRepository(AuditEvent)),
    today,
    day: (offset, hour = 9, minute = 0) => {
      const d = new Date(`${addDays(today, offset)}T00:00:00Z`);
      d.setUTCHours(hour, minute);
      return d;
    },
    tech: userIds['tech@kilocycle.test']!,
    lead: userIds['lead@kilocycle.test']!,
    engineer: userIds['engineer@kilocycle.test']!,
    counterId: (await manager.findOneByOrFail(Standard, { name: DEMO_STANDARDS.inDate })).id,
    number: demoJobNumbers(),
  };
  const instruments = await insertInstruments(scene, labId, customerIds);
  await seedGeneratorInReview(scene, instruments.generator1);
  await seedGeneratorInProgress(scene, instruments.generator2);
  await seedReceiverWarmups(scene, instruments.receiver);
  await seedReferenceStability(scene, instruments.reference);
}

async function insertInstruments(scene: LabScene, labId: number, customerIds: DemoContext['customerIds']) {
  const { manager, today } = scene;
  const generator1 = await insertInstrument(
    manager,
    {
      organizationId: customerIds.northgate,
      make: 'Harwick Radio',
      model: 'SG-4 signal generator',
      serial: 'N-1041',
      assetTag: 'NRC-07',
      description: 'Valve signal generator with a kHz-marked band-spread dial; the club station’s bench generator.',
      nextDueDate: addDays(today, 20),
    },
    GENERATOR_RANGES,
  );
  const generator2 = await insertInstrument(
    manager,
    {
      organizationId: customerIds.northgate,
      make: 'Harwick Radio',
      model: 'SG-4 signal generator',
      serial: 'N-1187',
      assetTag: 'NRC-11',
      description: 'The club’s second SG-4, used for receiver alignment evenings.',
      nextDueDate: addDays(today, -10),
    },
    GENERATOR_RANGES,
  );
  const receiver = await insertInstrument(
    manager,
    {
      organizationId: customerIds.saltmarsh,
      make: 'Marlow & Reade',
      model: 'CR-7 communications receiver',
      serial: 'CR7-5520',
      assetTag: null,
      description: 'Restoration project; local oscillator measured at the LO test point.',
      nextDueDate: null,
    },
    RECEIVER_RANGES,
  );
  const reference = await insertInstrument(
    manager,
    {
      organizationId: labId,
      make: 'Quarry Lane',
      model: 'XR-5 crystal reference',
      serial: 'QL-XR5-01',
      assetTag: 'QL-014',
      description: 'The lab’s own 5 MHz / 1 MHz crystal reference, house-built; checked against Bench counter A.',
      nextDueDate: addDays(today, 150),
    },
    REFERENCE_RANGES,
  );
  return { generator1, generator2, receiver, reference };
}

/** 1. Northgate generator N-1041: as-found and as-left done, submitted for review. */
async function seedGeneratorInReview(scene: LabScene, generator: DemoInstrument): Promise<void> {
  const { manager, today, day, tech } = scene;
  const job = await insertJob(scene, generator, {
    receivedDate: addDays(today, -20),
    status: 'in_review',
    technicianId: tech,
    conditionReceived: 'Working. Dial reads high at the low end of range A; case and knobs complete.',
    ambientTempC: 21.5,
    humidityPct: 46,
  });
  const lowRange = generator.ranges[0]!;
  const settings = Array.from({ length: 11 }, (_, i) => 1750 + 25 * i);
  const asFoundModel = lcOscillator({ inductanceH: 10e-6, strayF: 40e-12, inductanceDrift: 0.045, strayDriftF: -21e-12 });
  const asLeftModel = lcOscillator({ inductanceH: 10e-6, strayF: 40e-12, inductanceDrift: 0.0012, strayDriftF: -0.9e-12 });
  const asFound = await insertRun(scene, {
    jobId: job.id,
    rangeId: lowRange.id,
    kind: 'as_found',
    createdBy: tech,
    startedAt: day(-14, 9, 10),
    minutes: 25,
    configuration: 'In its case, 30 min warm-up, output into 50 Ω, counter on 1 s gate',
  });
  await insertDemoReadings(manager, asFound.id, asFound.startedAt, calibrationReadings(settings, asFoundModel, 11));
  const asLeft = await insertRun(scene, {
    jobId: job.id,
    rangeId: lowRange.id,
    kind: 'as_left',
    createdBy: tech,
    startedAt: day(-13, 14, 5),
    minutes: 25,
    configuration: 'After oscillator coil slug and trimmer adjustment; in its case, 30 min warm-up',
    notes: 'Coil slug turned in about a quarter turn, trimmer reset at 2000 kHz.',
  });
  await insertDemoReadings(manager, asLeft.id, asLeft.startedAt, calibrationReadings(settings, asLeftModel, 12));
  await history(scene, [
    [tech, 'job', job.id, 'create', { number: job.number }, day(-20, 11)],
    [tech, 'run', asFound.id, 'create', { jobId: job.id, kind: 'as_found', rangeLabel: lowRange.label }, asFound.startedAt],
    [tech, 'job', job.id, 'status', { from: 'received', to: 'in_progress', comment: `run ${asFound.id} opened` }, asFound.startedAt],
    [tech, 'run', asFound.id, 'status', { from: 'open', to: 'closed' }, day(-14, 9, 35)],
    [tech, 'run', asLeft.id, 'create', { jobId: job.id, kind: 'as_left', rangeLabel: lowRange.label }, asLeft.startedAt],
    [tech, 'run', asLeft.id, 'status', { from: 'open', to: 'closed' }, day(-13, 14, 30)],
    [tech, 'job', job.id, 'status', { from: 'in_progress', to: 'in_review', comment: 'Range A aligned; ready for review.' }, day(-13, 15)],
  ]);
}

/** 2. Northgate generator N-1187: in progress, an as-found run open and empty for the bench page. */
async function seedGeneratorInProgress(scene: LabScene, generator: DemoInstrument): Promise<void> {
  const { today, day, tech } = scene;
  const job = await insertJob(scene, generator, {
    receivedDate: addDays(today, -5),
    status: 'in_progress',
    technicianId: tech,
    conditionReceived: 'Working; frequency drifts for the first minutes after switch-on.',
    ambientTempC: 21.8,
    humidityPct: 44,
  });
  await insertRun(scene, {
    jobId: job.id,
    rangeId: generator.ranges[0]!.id,
    kind: 'as_found',
    createdBy: tech,
    startedAt: day(-1, 10, 0),
    minutes: null,
    configuration: 'In its case, output into 50 Ω',
  });
  await history(scene, [[tech, 'job', job.id, 'create', { number: job.number }, day(-5, 10)]]);
}

/** 3. Saltmarsh receiver: two warm-up studies on the LO, before and after a regulator was fitted. */
async function seedReceiverWarmups(scene: LabScene, receiver: DemoInstrument): Promise<void> {
  const { manager, today, day, tech, engineer } = scene;
  const job = await insertJob(scene, receiver, {
    receivedDate: addDays(today, -10),
    status: 'in_progress',
    technicianId: tech,
    conditionReceived: 'Recapped by the owner; LO drifts noticeably after switch-on.',
    ambientTempC: 22.0,
    humidityPct: 50,
  });
  const band3 = receiver.ranges[1]!;
  const before = await insertRun(scene, {
    jobId: job.id,
    rangeId: band3.id,
    kind: 'warmup',
    createdBy: engineer,
    startedAt: day(-9, 8, 30),
    minutes: 120,
    configuration: 'Dial at 7.000 MHz, BFO off, cold start after 12 h off; original unregulated HT',
    notes: 'Before the regulator change.',
  });
  await insertDemoReadings(manager, before.id, before.startedAt, warmupReadings(warmupCurve(7_453_820, 2_350, 840), 2.0, 21));
  const after = await insertRun(scene, {
    jobId: job.id,
    rangeId: band3.id,
    kind: 'warmup',
    createdBy: engineer,
    startedAt: day(-6, 8, 30),
    minutes: 120,
    configuration: 'Dial at 7.000 MHz, BFO off, cold start after 12 h off; gas regulator valve fitted on the oscillator HT',
    notes: 'After the regulator change.',
  });
  await insertDemoReadings(manager, after.id, after.startedAt, warmupReadings(warmupCurve(7_453_905, 900, 520), 2.0, 22));
  await insertDemoComparison(manager, { instrumentId: receiver.id, beforeRunId: before.id, afterRunId: after.id, createdById: engineer });
  await history(scene, [[tech, 'job', job.id, 'create', { number: job.number }, day(-10, 10)]]);
}

/** 4. The lab's own reference: a one-hour stability run at one reading a second. */
async function seedReferenceStability(scene: LabScene, reference: DemoInstrument): Promise<void> {
  const { manager, today, day, lead, engineer } = scene;
  const job = await insertJob(scene, reference, {
    receivedDate: addDays(today, -3),
    status: 'in_progress',
    technicianId: null,
    conditionReceived: 'In service; routine stability check.',
    ambientTempC: 21.0,
    humidityPct: 42,
  });
  const stability = await insertRun(scene, {
    jobId: job.id,
    rangeId: reference.ranges[0]!.id,
    kind: 'stability',
    createdBy: engineer,
    startedAt: day(-2, 7, 0),
    minutes: 60,
    configuration: 'Oven at temperature for 48 h; 1 s gate, one reading a second',
  });
  await insertDemoReadings(manager, stability.id, stability.startedAt, stabilityReadings(5_000_000.0123, 3600, 23));
  // The same oscillator against the house reference through the time-interval counter, the next morning: phase data,
  // with the 20 s the counter was re-armed missing half-way (the page offers the longest segment or filling the gap).
  const phase = await insertRun(scene, {
    jobId: job.id,
    rangeId: reference.ranges[0]!.id,
    kind: 'stability',
    dataKind: 'phase',
    createdBy: engineer,
    startedAt: day(-1, 7, 0),
    minutes: 60,
    configuration: 'Time-interval counter: start from the oscillator, stop from the house reference; one reading a second',
    notes: 'Counter re-armed at about 30 min (20 s missing).',
  });
  await insertDemoReadings(manager, phase.id, phase.startedAt, phaseReadings(3600, 1800, 20, 29));
  await history(scene, [[lead, 'job', job.id, 'create', { number: job.number }, day(-3, 10)]]);
}

async function insertInstrument(manager: EntityManager, fields: InstrumentFields, ranges: RangeSpec[]): Promise<DemoInstrument> {
  const id = (await manager.insert(Instrument, { ...fields, recallIntervalMonths: 12 })).identifiers[0].id as number;
  await manager.insert(
    InstrumentRange,
    ranges.map((r, index) => ({
      instrumentId: id,
      position: index + 1,
      label: r.label,
      dialUnit: r.dialUnit,
      dialLaw: r.law,
      dialMin: r.dial[0],
      dialMax: r.dial[1],
      freqMinHz: r.hz[0],
      freqMaxHz: r.hz[1],
      tolerance: r.tolerance,
      multipliers: r.multipliers,
    })),
  );
  return {
    id,
    organizationId: fields.organizationId,
    ranges: await manager.find(InstrumentRange, { where: { instrumentId: id }, order: { position: 'ASC' } }),
  };
}

function insertJob(scene: LabScene, instrument: DemoInstrument, spec: Omit<DemoJobSpec, 'number' | 'instrumentId' | 'organizationId'>) {
  return insertDemoJob(scene.manager, {
    ...spec,
    number: scene.number(spec.receivedDate),
    instrumentId: instrument.id,
    organizationId: instrument.organizationId,
  });
}

function insertRun(scene: LabScene, spec: Omit<DemoRunSpec, 'standardId'>) {
  return insertDemoRun(scene.manager, { ...spec, standardId: scene.counterId });
}

/** The audit trail of a demo job, with the times it would have happened at. */
async function history(scene: LabScene, events: Array<[number, string, number, string, Record<string, unknown>, Date]>): Promise<void> {
  for (const [actorId, entity, entityId, action, changes, at] of events) {
    const entry: AuditEntry = { actorId, entity, entityId, action, changes, at };
    await scene.audit.record(entry, scene.manager);
  }
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

/**
 * Time-interval readings (s) one a second: a fractional frequency offset of 2.4e-9 with white frequency noise of
 * 2e-11 summed into phase, plus 40 ps of white phase noise from the counter; `gapLength` seconds missing from `gapAt`.
 */
function phaseReadings(count: number, gapAt: number, gapLength: number, seed: number): ReadingRow[] {
  const noise = seededGaussian(seed);
  const rows: ReadingRow[] = [];
  let x = 0;
  for (let i = 0; i < count; i++) {
    if (i > 0) x += 2.4e-9 + 2e-11 * noise();
    const reading = Math.round((x + 4e-11 * noise()) * 1e13) / 1e13;
    if (i >= gapAt && i < gapAt + gapLength) continue;
    rows.push([rows.length + 1, i, null, reading, null]);
  }
  return rows;
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
