import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { In, type DataSource, type EntityManager } from 'typeorm';
import { User } from './user.entity.js';

/** Who a certificate names (its signatory, the technician) and who is told when it is issued (inside the issuing transaction when a manager is given). */
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

  /** The names of these users, by id (ids that name no user are left out). */
  async namesOf(ids: readonly number[], manager?: EntityManager): Promise<Map<number, string>> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return new Map();
    const found = await (manager ?? this.dataSource.manager).find(User, { select: { id: true, name: true }, where: { id: In(unique) } });
    return new Map(found.map((u) => [u.id, u.name]));
  }
}
