import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import type { CustomerTerms, ListResponse, PriceItem as PriceItemView, PriceItemsResponse, TaxRate as TaxRateView } from '@kilocycle/common/types';
import { In, Not, type DataSource, type EntityManager, type Repository } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { OrganizationsReader, type OrganizationContact } from '../organizations/organizations.reader.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { paginateFlat, sortColumn } from '../shared/page-query.js';
import type { ListQueryDto } from '../shared/list-query.dto.js';
import { likePattern } from '../shared/paginate.js';
import { labCurrency } from '../shared/currency.js';
import { CustomerTermsRow } from './customer-terms.entity.js';
import { CustomerTermsReader, toCustomerTerms } from './customer-terms.reader.js';
import type {
  CreatePriceItemDto,
  CreateTaxRateDto,
  ListPriceItemsQueryDto,
  ListTaxRatesQueryDto,
  UpdateCustomerTermsDto,
  UpdatePriceItemDto,
  UpdateTaxRateDto,
} from './dto/prices.dto.js';
import { PriceItem } from './price-item.entity.js';
import { TaxRate } from './tax-rate.entity.js';

export function toPriceItemView(item: PriceItem): PriceItemView {
  return {
    id: item.id,
    code: item.code,
    description: item.description,
    unit: item.unit,
    unitPriceMinor: item.unitPriceMinor,
    proposeOnQuotes: item.proposeOnQuotes,
    active: item.active,
    updatedAt: item.updatedAt.toISOString(),
  };
}

export function toTaxRateView(rate: TaxRate): TaxRateView {
  return { id: rate.id, name: rate.name, rateBasisPoints: rate.rateBasisPoints, active: rate.active };
}

const ITEM_SORT = {
  id: 'p.id',
  code: 'p.code',
  description: 'p.description',
  unit: 'p.unit',
  unitPriceMinor: 'p.unitPriceMinor',
  active: 'p.active',
  updatedAt: 'p.updatedAt',
};
const RATE_SORT = { id: 't.id', name: 't.name', rateBasisPoints: 't.rateBasisPoints', active: 't.active' };
const TERMS_SORT = ['organizationName', 'organizationId', 'paymentTerms', 'netDays', 'requiresQuote', 'updatedAt'] as const;
const ITEM_FIELDS = ['code', 'description', 'unit', 'unitPriceMinor', 'proposeOnQuotes', 'active'] as const;
const RATE_FIELDS = ['name', 'rateBasisPoints', 'active'] as const;

/** Changes between a row and a patch, as the audit records them, and the patch of only what changed. */
function diff<T extends object, K extends keyof T & string>(row: T, body: Partial<Pick<T, K>>, fields: readonly K[]) {
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  const patch: Partial<T> = {};
  for (const key of fields) {
    const value = body[key];
    if (value !== undefined && value !== row[key]) {
      changes[key] = { from: row[key], to: value };
      patch[key] = value as T[K];
    }
  }
  return { changes, patch };
}

/** The price list, tax rates and customer terms: reads for the lab, changes by admin and lead, every change audited. */
@Injectable()
export class PricesService {
  constructor(
    @InjectRepository(PriceItem) private readonly items: Repository<PriceItem>,
    @InjectRepository(TaxRate) private readonly rates: Repository<TaxRate>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly organizations: OrganizationsReader,
    private readonly termsReader: CustomerTermsReader,
  ) {}

  // ---- price items ----

  /** The price list, with the lab's currency (an empty list still says what its prices are in). */
  async listItems(query: ListPriceItemsQueryDto): Promise<PriceItemsResponse> {
    const qb = this.items.createQueryBuilder('p');
    if (query.active !== undefined) qb.andWhere('p.active = :active', { active: query.active });
    if (query.q) qb.andWhere('(p.code LIKE :q OR p.description LIKE :q)', { q: likePattern(query.q) });
    const page = await paginateFlat(qb, query, ITEM_SORT, 'code', 'p.id', (found) => found.map(toPriceItemView));
    return { ...page, currency: labCurrency() };
  }

  async createItem(actor: AuthUser, body: CreatePriceItemDto): Promise<PriceItemView> {
    const id = await this.dataSource.transaction(async (manager) => {
      await this.assertCodeFree(manager, body.code);
      const values = { ...body, proposeOnQuotes: body.proposeOnQuotes ?? false };
      const result = await manager.insert(PriceItem, values);
      const newId = result.identifiers[0].id as number;
      await this.audit.record({ actorId: actor.id, entity: 'price_item', entityId: newId, action: 'create', changes: values }, manager);
      return newId;
    });
    return toPriceItemView(await this.items.findOneByOrFail({ id }));
  }

  async updateItem(actor: AuthUser, id: number, body: UpdatePriceItemDto): Promise<PriceItemView> {
    await this.dataSource.transaction(async (manager) => {
      const item = await manager.findOne(PriceItem, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!item) throw new NotFoundException(`Price item ${id} not found`);
      const { changes, patch } = diff(item, body, ITEM_FIELDS);
      if (Object.keys(patch).length === 0) return;
      if (patch.code !== undefined) await this.assertCodeFree(manager, patch.code, id);
      await manager.update(PriceItem, { id }, patch);
      await this.audit.record({ actorId: actor.id, entity: 'price_item', entityId: id, action: 'update', changes }, manager);
    });
    return toPriceItemView(await this.items.findOneByOrFail({ id }));
  }

  /** The ids among these that name no price item (lines of quotes and invoices name items by id). */
  async unknownItemIds(ids: readonly number[], manager?: EntityManager): Promise<number[]> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return [];
    const found = await (manager ?? this.dataSource.manager).find(PriceItem, { select: { id: true }, where: { id: In(unique) } });
    const known = new Set(found.map((f) => f.id));
    return unique.filter((id) => !known.has(id));
  }

  private async assertCodeFree(manager: EntityManager, code: string, exceptId?: number): Promise<void> {
    const taken = await manager.findOne(PriceItem, { where: { code, ...(exceptId ? { id: Not(exceptId) } : {}) } });
    if (taken) throw new ConflictException(`code ${code} is already on the price list (${taken.description})`);
  }

  // ---- tax rates ----

  listTaxRates(query: ListTaxRatesQueryDto): Promise<ListResponse<TaxRateView>> {
    const qb = this.rates.createQueryBuilder('t');
    if (query.active !== undefined) qb.andWhere('t.active = :active', { active: query.active });
    if (query.q) qb.andWhere('t.name LIKE :q', { q: likePattern(query.q) });
    return paginateFlat(qb, query, RATE_SORT, 'id', 't.id', (found) => found.map(toTaxRateView));
  }

  async createTaxRate(actor: AuthUser, body: CreateTaxRateDto): Promise<TaxRateView> {
    const id = await this.dataSource.transaction(async (manager) => {
      await this.assertRateNameFree(manager, body.name);
      const result = await manager.insert(TaxRate, { name: body.name, rateBasisPoints: body.rateBasisPoints });
      const newId = result.identifiers[0].id as number;
      await this.audit.record({ actorId: actor.id, entity: 'tax_rate', entityId: newId, action: 'create', changes: { ...body } }, manager);
      return newId;
    });
    return toTaxRateView(await this.rates.findOneByOrFail({ id }));
  }

  async updateTaxRate(actor: AuthUser, id: number, body: UpdateTaxRateDto): Promise<TaxRateView> {
    await this.dataSource.transaction(async (manager) => {
      const rate = await manager.findOne(TaxRate, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!rate) throw new NotFoundException(`Tax rate ${id} not found`);
      const { changes, patch } = diff(rate, body, RATE_FIELDS);
      if (Object.keys(patch).length === 0) return;
      if (patch.name !== undefined) await this.assertRateNameFree(manager, patch.name, id);
      if (patch.active === false) {
        const charged = await manager.count(CustomerTermsRow, { where: { taxRateId: id } });
        if (charged > 0)
          throw new ConflictException(
            `tax rate ${rate.name} is charged to ${charged} customer${charged === 1 ? '' : 's'}: give them another rate before retiring it`,
          );
      }
      await manager.update(TaxRate, { id }, patch);
      await this.audit.record({ actorId: actor.id, entity: 'tax_rate', entityId: id, action: 'update', changes }, manager);
    });
    return toTaxRateView(await this.rates.findOneByOrFail({ id }));
  }

  private async assertRateNameFree(manager: EntityManager, name: string, exceptId?: number): Promise<void> {
    const taken = await manager.findOne(TaxRate, { where: { name, ...(exceptId ? { id: Not(exceptId) } : {}) } });
    if (taken) throw new ConflictException(`a tax rate named "${name}" already exists`);
  }

  // ---- customer terms ----

  /** One row per customer organisation (active or not), the defaults shown for those without terms. */
  async listTerms(query: ListQueryDto): Promise<ListResponse<CustomerTerms>> {
    const { column, direction } = sortColumn(query.sort ?? 'organizationName', Object.fromEntries(TERMS_SORT.map((k) => [k, k])));
    let customers = await this.organizations.ofKind('customer');
    if (query.q) {
      const needle = query.q.toLowerCase();
      customers = customers.filter((c) => c.name.toLowerCase().includes(needle));
    }
    const rows =
      customers.length === 0
        ? []
        : await this.dataSource.manager.find(CustomerTermsRow, { where: { organizationId: In(customers.map((c) => c.id)) }, relations: { taxRate: true } });
    const byOrg = new Map(rows.map((r) => [r.organizationId, r]));
    const defaultRate = await this.termsReader.defaultRate();
    const all = customers.map((c) => toCustomerTerms(c, byOrg.get(c.id) ?? null, defaultRate));
    const key = column as (typeof TERMS_SORT)[number];
    all.sort((a, b) => {
      const x = a[key];
      const y = b[key];
      const order = typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y));
      return (direction === 'ASC' ? order : -order) || a.organizationId - b.organizationId;
    });
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 25;
    return { items: all.slice((page - 1) * pageSize, page * pageSize), total: all.length };
  }

  /** A customer's terms; a client only its own organisation's (another's answers 404). */
  async getTerms(actor: AuthUser, organizationId: number): Promise<CustomerTerms> {
    const scope = organizationScope(actor);
    if (scope !== null && scope !== organizationId) throw new NotFoundException(`Customer ${organizationId} not found`);
    await this.customer(organizationId);
    return this.termsReader.termsFor(organizationId);
  }

  async putTerms(actor: AuthUser, organizationId: number, body: UpdateCustomerTermsDto): Promise<CustomerTerms> {
    const registration = body.taxRegistration ?? null;
    if (body.taxRateId === null && !registration)
      throw new BadRequestException('taxRegistration: an exempt customer (taxRateId null) needs its tax registration number');
    if (body.paymentTerms === 'pay_before_release' && body.netDays !== 0)
      throw new BadRequestException('netDays must be 0 when paymentTerms is pay_before_release (the customer pays before the certificate is released)');
    await this.dataSource.transaction(async (manager) => {
      await this.customer(organizationId, manager);
      if (body.taxRateId !== null) {
        const rate = await manager.findOneBy(TaxRate, { id: body.taxRateId });
        if (!rate || !rate.active) throw new BadRequestException(`taxRateId: tax rate ${body.taxRateId} does not exist or is retired`);
      }
      const before = await manager.findOne(CustomerTermsRow, { where: { organizationId }, lock: { mode: 'pessimistic_write' } });
      const values = {
        taxRateId: body.taxRateId,
        taxRegistration: registration,
        paymentTerms: body.paymentTerms,
        netDays: body.netDays,
        requiresQuote: body.requiresQuote,
      };
      if (before) await manager.update(CustomerTermsRow, { organizationId }, values);
      else await manager.insert(CustomerTermsRow, { organizationId, ...values });
      const from = before
        ? {
            taxRateId: before.taxRateId,
            taxRegistration: before.taxRegistration,
            paymentTerms: before.paymentTerms,
            netDays: before.netDays,
            requiresQuote: before.requiresQuote,
          }
        : null;
      await this.audit.record(
        { actorId: actor.id, entity: 'customer_terms', entityId: organizationId, action: 'update', changes: { from, to: values } },
        manager,
      );
    });
    return this.termsReader.termsFor(organizationId);
  }

  /** The customer organisation, or 404 (the lab's own organisation has no customer terms). */
  private async customer(organizationId: number, manager?: EntityManager): Promise<OrganizationContact> {
    const organization = await this.organizations.byId(organizationId, manager);
    if (!organization || organization.kind !== 'customer') throw new NotFoundException(`Customer ${organizationId} not found`);
    return organization;
  }
}
