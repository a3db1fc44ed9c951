import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';

/** Who is told when a certificate is issued (inside the issuing transaction when a manager is given). */
@Injectable()
export class CertificateRecipientsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The e-mail addresses of an organisation's active client accounts, sorted. */
  async clientEmails(organizationId: number, manager?: EntityManager): Promise<string[]> {
    const rows: Array<{ email: string }> = await (manager ?? this.dataSource.manager).query(
      "SELECT email FROM users WHERE organization_id = ? AND role = 'client' AND active = 1 ORDER BY email",
      [organizationId],
    );
    return rows.map((row) => row.email);
  }
}
