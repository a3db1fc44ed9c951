import { Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';

/** Stamps runs with the version of the standard they were measured against (signing keeps it with the record). */
@Injectable()
export class RunStandardVersionWriter {
  /** Sets each run's standard_version to its standard's version (`versionOf`, by standard id), in the caller's transaction; runs whose standard is not in it keep theirs. */
  async stamp(runIds: readonly number[], versionOf: ReadonlyMap<number, number>, manager: EntityManager): Promise<void> {
    if (runIds.length === 0) return;
    for (const [standardId, version] of versionOf) {
      await manager.query('UPDATE runs SET standard_version = ? WHERE id IN (?) AND standard_id = ?', [version, [...runIds], standardId]);
    }
  }
}
