import type { EntityManager } from 'typeorm';
import type { StandardVersion } from '@kilocycle/common/types';
import { dateOnly } from '../shared/dto-helpers.js';
import { StandardVersionRow } from './standard-version.entity.js';
import { Standard } from './standard.entity.js';

/** What a version of a standard keeps: identity, certificate, due date and accuracy. */
export function standardFigures(s: Standard): StandardVersion {
  return {
    id: s.id,
    version: s.version,
    name: s.name,
    makeModel: s.makeModel,
    serial: s.serial,
    certificateNumber: s.certificateNumber,
    dueDate: dateOnly(s.dueDate) ?? '',
    timebaseAccuracyPpm: Number(s.timebaseAccuracyPpm),
    resolutionHz: Number(s.resolutionHz),
    calibrationUPpm: Number(s.calibrationUPpm),
    calibrationK: Number(s.calibrationK),
  };
}

/**
 * Writes the standard's current row as its version `standard.version`, inside the caller's transaction:
 * called when a standard is created and after every edit (which raises the version by one).
 */
export async function recordStandardVersion(manager: EntityManager, standardId: number, actorId: number | null): Promise<void> {
  const standard = await manager.findOneByOrFail(Standard, { id: standardId });
  await manager.insert(StandardVersionRow, { standardId, version: standard.version, figures: standardFigures(standard), createdById: actorId });
}
