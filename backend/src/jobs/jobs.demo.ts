import type { EntityManager } from 'typeorm';
import type { JobStatus } from '@kilocycle/common/types';
import { Job } from './job.entity.js';

/** Job numbers for a seed that writes several jobs: J<year>-0001 upwards within each year received. */
export function demoJobNumbers(): (receivedDate: string) => string {
  const counters = new Map<string, number>();
  return (receivedDate) => {
    const year = receivedDate.slice(0, 4);
    const next = (counters.get(year) ?? 0) + 1;
    counters.set(year, next);
    return `J${year}-${String(next).padStart(4, '0')}`;
  };
}

/** The next job number in the year of `receivedDate` after the jobs already stored (for a seed that runs after others). */
export async function nextDemoJobNumber(manager: EntityManager, receivedDate: string): Promise<string> {
  const year = receivedDate.slice(0, 4);
  const [last] = (await manager.query('SELECT number FROM jobs WHERE number LIKE ? ORDER BY number DESC LIMIT 1', [`J${year}-%`])) as Array<{ number: string }>;
  return `J${year}-${String((last ? Number(last.number.slice(6)) : 0) + 1).padStart(4, '0')}`;
}

export type DemoJobSpec = {
  number: string;
  instrumentId: number;
  organizationId: number;
  receivedDate: string;
  status: JobStatus;
  technicianId: number | null;
  conditionReceived: string;
  ambientTempC: number;
  humidityPct: number;
};

/** Inserts one demo job, part of the seed's one transaction. */
export async function insertDemoJob(manager: EntityManager, spec: DemoJobSpec): Promise<{ id: number; number: string }> {
  const result = await manager.insert(Job, { ...spec, notes: null });
  return { id: result.identifiers[0].id as number, number: spec.number };
}
