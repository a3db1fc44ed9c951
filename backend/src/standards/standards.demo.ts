import { addDays } from '../shared/demo-signals.js';
import type { EntityManager } from 'typeorm';
import { recordStandardVersion } from './standard-versions.js';
import { Standard } from './standard.entity.js';

/** The demo lab's two counters: one in date, one whose calibration has lapsed (for the override flow). */
export const DEMO_STANDARDS = { inDate: 'Bench counter A', lapsed: 'Bench counter B (spare)' } as const;

export async function seedDemoStandards({ manager }: { manager: EntityManager }): Promise<void> {
  const today = new Date();
  const inserted = await manager.insert(Standard, [
    {
      name: DEMO_STANDARDS.inDate,
      kind: 'counter',
      makeModel: 'Fernhill FC-120 reciprocal counter, oven-controlled time base',
      serial: 'FC120-02231',
      certificateNumber: 'WRL-24-11873',
      dueDate: addDays(today, 365),
      timebaseAccuracyPpm: 0.05,
      resolutionHz: 0.001,
      calibrationUPpm: 0.02,
      calibrationK: 2,
      active: true,
    },
    {
      name: DEMO_STANDARDS.lapsed,
      kind: 'counter',
      makeModel: 'Fernhill FC-90 counter, room-temperature crystal time base',
      serial: 'FC90-00417',
      certificateNumber: 'WRL-22-06412',
      dueDate: addDays(today, -45),
      timebaseAccuracyPpm: 1,
      resolutionHz: 1,
      calibrationUPpm: 0.3,
      calibrationK: 2,
      active: true,
    },
  ]);
  for (const { id } of inserted.identifiers) await recordStandardVersion(manager, id as number, null);
}
