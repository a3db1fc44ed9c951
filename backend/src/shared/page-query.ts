import { BadRequestException } from '@nestjs/common';
import type { ObjectLiteral, SelectQueryBuilder } from 'typeorm';
import type { ListResponse } from '@kilocycle/common/types';
import type { ListQueryDto } from './list-query.dto.js';

/**
 * Like paginate(), for queries whose joins are all many-to-one: LIMIT/OFFSET go straight into the SQL
 * instead of TypeORM's distinct-id subquery, which costs a scan of every match on large tables.
 * `tieBreak` keeps the order stable between pages.
 */
export async function paginateFlat<E extends ObjectLiteral, T>(
  qb: SelectQueryBuilder<E>,
  query: ListQueryDto,
  sortable: Record<string, string>,
  defaultSort: string,
  tieBreak: string,
  map: (entities: E[]) => Promise<T[]> | T[],
): Promise<ListResponse<T>> {
  const page = query.page ?? 1;
  const pageSize = query.pageSize ?? 25;
  const { column, direction } = sortColumn(query.sort ?? defaultSort, sortable);
  const total = await qb.clone().orderBy().getCount();
  qb.orderBy(column, direction)
    .addOrderBy(tieBreak, direction)
    .offset((page - 1) * pageSize)
    .limit(pageSize);
  const entities = total === 0 ? [] : await qb.getMany();
  return { items: await map(entities), total };
}

/** The SQL column for a `field` / `-field` sort parameter; 400 naming the allowed fields otherwise. */
export function sortColumn(sort: string, sortable: Record<string, string>): { column: string; direction: 'ASC' | 'DESC' } {
  const descending = sort.startsWith('-');
  const field = descending ? sort.slice(1) : sort;
  const column = sortable[field];
  if (!column) throw new BadRequestException(`sort must be one of: ${Object.keys(sortable).join(', ')} (got "${field}")`);
  return { column, direction: descending ? 'DESC' : 'ASC' };
}
