import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { StandardReference, StandardVersion } from '@kilocycle/common/types';
import { In, type DataSource, type EntityManager } from 'typeorm';
import { Standard } from './standard.entity.js';
import { standardFigures } from './standard-versions.js';

/** A standard as a certificate names it, with the version of its row read here. */
export type VersionedStandard = { reference: StandardReference; version: number };

/** Standards as job results read them (inside the signing transaction when a manager is given). */
@Injectable()
export class StandardResultsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The standards of these ids, by id (ids not found are absent). */
  async references(ids: readonly number[], manager?: EntityManager): Promise<Map<number, VersionedStandard>> {
    if (ids.length === 0) return new Map();
    const rows: Array<Record<string, unknown>> = await (manager ?? this.dataSource.manager).query(
      `SELECT id, name, make_model, serial, certificate_number, DATE_FORMAT(due_date, '%Y-%m-%d') AS due,
              timebase_accuracy_ppm, resolution_hz, calibration_u_ppm, calibration_k, version
         FROM standards WHERE id IN (?)`,
      [[...new Set(ids)]],
    );
    return new Map(
      rows.map((row) => [
        Number(row.id),
        {
          version: Number(row.version),
          reference: {
            id: Number(row.id),
            name: String(row.name),
            makeModel: String(row.make_model),
            serial: String(row.serial),
            certificateNumber: String(row.certificate_number),
            dueDate: String(row.due),
            timebaseAccuracyPpm: Number(row.timebase_accuracy_ppm),
            resolutionHz: Number(row.resolution_hz),
            calibrationUPpm: Number(row.calibration_u_ppm),
            calibrationK: Number(row.calibration_k),
          },
        },
      ]),
    );
  }

  /** The figures of these standards as their version is kept (what a signed record names), in the order of `ids`. */
  async figures(ids: readonly number[], manager?: EntityManager): Promise<StandardVersion[]> {
    if (ids.length === 0) return [];
    const found = await (manager ?? this.dataSource.manager).findBy(Standard, { id: In([...ids]) });
    return found.map(standardFigures).sort((a, b) => ids.indexOf(a.id) - ids.indexOf(b.id));
  }
}
