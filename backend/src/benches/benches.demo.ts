import type { EntityManager } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { Bench } from './bench.entity.js';

export const DEMO_BENCHES = { main: 'Bench 1', cage: 'Bench 2 (screened room)' } as const;

/**
 * Two benches (Bench 1 with the in-date counter as its default standard, no tokens yet: an admin
 * issues one, or `bin/kilocycle bench token "Bench 1"`); returns Bench 1's id. Part of the seed's one transaction.
 */
export async function insertDemoBenches(manager: EntityManager, standardId: number | null): Promise<number> {
  const benchId = (await manager.insert(Bench, { name: DEMO_BENCHES.main, location: 'Main bench, under the window', defaultStandardId: standardId }))
    .identifiers[0].id as number;
  await manager.insert(Bench, { name: DEMO_BENCHES.cage, location: 'Screened room, for receivers', defaultStandardId: standardId });
  await AuditService.within(manager).record(
    { actorId: null, entity: 'bench', entityId: benchId, action: 'create', changes: { name: DEMO_BENCHES.main, defaultStandardId: standardId } },
    manager,
  );
  return benchId;
}
