import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { OrganizationKind } from '@kilocycle/common/types';
import { Organization } from './organization.entity.js';

/** An organisation as other modules read it (mail, recall, users, instruments). */
export type OrganizationContact = { id: number; name: string; kind: OrganizationKind; contactEmail: string | null; active: boolean };

const toContact = (o: Organization): OrganizationContact => ({ id: o.id, name: o.name, kind: o.kind, contactEmail: o.contactEmail, active: o.active });

/**
 * Organisations for other modules. Also built by hand (`new OrganizationsReader(dataSource)`) where no
 * Nest container runs: the mailer and the recall run of the CLI.
 */
@Injectable()
export class OrganizationsReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The lab's own organisation (the first one of kind lab), or null before one exists. */
  async lab(manager?: EntityManager): Promise<OrganizationContact | null> {
    const found = await (manager ?? this.dataSource.manager).findOne(Organization, { where: { kind: 'lab' }, order: { id: 'ASC' } });
    return found ? toContact(found) : null;
  }

  /** One organisation, or null. */
  async byId(id: number, manager?: EntityManager): Promise<OrganizationContact | null> {
    const found = await (manager ?? this.dataSource.manager).findOneBy(Organization, { id });
    return found ? toContact(found) : null;
  }

  /** Every organisation of a kind (active or not), by name. */
  async ofKind(kind: OrganizationKind, manager?: EntityManager): Promise<OrganizationContact[]> {
    const found = await (manager ?? this.dataSource.manager).find(Organization, { where: { kind }, order: { name: 'ASC' } });
    return found.map(toContact);
  }

  /** These organisations, by id. */
  async byIds(ids: readonly number[], manager?: EntityManager): Promise<Map<number, OrganizationContact>> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return new Map();
    const found = await (manager ?? this.dataSource.manager).find(Organization, { where: { id: In(unique) } });
    return new Map(found.map((o) => [o.id, toContact(o)]));
  }
}
