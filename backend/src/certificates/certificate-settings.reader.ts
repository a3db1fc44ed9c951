import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import type { CertificateSettings } from '@kilocycle/common/types';
import { readSettings } from './certificate-settings.js';

/**
 * The certificate settings (self-signing, number prefix, lab address, recall notice days) for the modules
 * that act on them: reviews (self-signing) and recall (the notice period). Also built by hand
 * (`new CertificateSettingsReader(dataSource)`) for the recall run of the CLI.
 */
@Injectable()
export class CertificateSettingsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The settings as an admin left them, defaults for the ones never set (in the caller's transaction when a manager is given). */
  read(manager?: EntityManager): Promise<CertificateSettings> {
    return readSettings(manager ?? this.dataSource.manager);
  }
}
