import type { AppendReadingsResponse, Instrument, InstrumentRange, Reading } from '@kilocycle/common/types';

let sequence = 500;
const nextId = () => ++sequence;

export function createRange(overrides: Partial<InstrumentRange> = {}): InstrumentRange {
  return {
    id: nextId(),
    position: 1,
    label: 'A  1750–2000 kHz',
    dialUnit: 'kHz',
    dialLaw: { kind: 'direct', unit: 'kHz' },
    dialMin: 1750,
    dialMax: 2000,
    freqMinHz: 1_750_000,
    freqMaxHz: 2_000_000,
    tolerance: { kind: 'percent', percent: 0.5 },
    multipliers: [1, 2, 4],
    ...overrides,
  };
}

export function createInstrument(overrides: Partial<Instrument> = {}): Instrument {
  const id = overrides.id ?? nextId();
  return {
    id,
    organizationId: 2,
    organizationName: 'Northgate Radio Club',
    make: 'Harwick Radio',
    model: 'SG-4 signal generator',
    serial: `N-${id}`,
    assetTag: null,
    description: null,
    recallIntervalMonths: 12,
    nextDueDate: null,
    ranges: [createRange()],
    createdAt: '2025-01-15T09:30:00.000Z',
    ...overrides,
  };
}

export function createReading(overrides: Partial<Reading> = {}): Reading {
  const id = overrides.id ?? nextId();
  return {
    id,
    seq: 1,
    t: 12,
    dial: 1750,
    frequency: 1_735_000,
    aux: null,
    source: 'manual',
    receivedAt: '2025-03-07T14:05:00.000Z',
    excluded: false,
    excludedReason: null,
    author: { kind: 'user', id: 3, name: 'Tomas Reyes' },
    ...overrides,
  };
}

export function createAppendAnswer(stored: Reading[]): AppendReadingsResponse {
  return { accepted: stored.length, duplicates: 0, rejected: [], lastSeq: stored[stored.length - 1]?.seq ?? 0, stored };
}
