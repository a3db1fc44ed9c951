import { Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';

/** The size of the runs.notes column (TEXT). */
const NOTES_COLUMN_LIMIT = 65_000;

/** A run's free-text notes for modules that add to them (a CSV import lists the rows it skipped there). */
@Injectable()
export class RunNotesWriter {
  /** The run's notes (empty when it has none), in the caller's transaction. */
  async read(runId: number, manager: EntityManager): Promise<string> {
    const [row] = await manager.query('SELECT notes FROM runs WHERE id = ?', [runId]);
    return row?.notes ?? '';
  }

  /** Replaces the notes (cut to the column's size) in the caller's transaction. */
  async write(runId: number, notes: string, manager: EntityManager): Promise<void> {
    await manager.query('UPDATE runs SET notes = ? WHERE id = ?', [notes.slice(0, NOTES_COLUMN_LIMIT), runId]);
  }
}
