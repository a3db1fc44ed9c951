import { BadRequestException } from '@nestjs/common';
import type { ObjectLiteral, SelectQueryBuilder } from 'typeorm';
import type { ListResponse } from '@kilocycle/common/types';
import type { ListQueryDto } from './list-query.dto.js';

/**
 * Applies page, pageSize and sort to a query builder and returns `{items, total}`.
 * `sortable` maps the API's field names to SQL expressions, so only those can be sorted on.
 */
export async function paginate<E extends ObjectLiteral, T>(
  qb: SelectQueryBuilder<E>,
  query: ListQueryDto,
  sortable: Record<string, string>,
  defaultSort: string,
  map: (entity: E) => T,
): Promise<ListResponse<T>> {
  const page = query.page ?? 1;
  const pageSize = query.pageSize ?? 25;
  const sort = query.sort ?? defaultSort;
  const descending = sort.startsWith('-');
  const field = descending ? sort.slice(1) : sort;
  const column = sortable[field];
  if (!column) {
    throw new BadRequestException(`sort must be one of: ${Object.keys(sortable).join(', ')} (got "${field}")`);
  }
  qb.orderBy(column, descending ? 'DESC' : 'ASC')
    .skip((page - 1) * pageSize)
    .take(pageSize);
  const [entities, total] = await qb.getManyAndCount();
  return { items: entities.map(map), total };
}

/** Escapes % and _ so a search box's text is matched literally in LIKE. */
export function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
