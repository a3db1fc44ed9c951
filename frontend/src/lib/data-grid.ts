import type { GridPaginationModel, GridSortModel } from '@mui/x-data-grid';

export const PAGE_SIZE_OPTIONS = [25, 50, 100];

/** DataGrid sort model → the API's `sort` (`field` or `-field`). */
export function toSortParam(model: GridSortModel): string {
  const first = model[0];
  if (!first?.sort) return '';
  return first.sort === 'desc' ? `-${first.field}` : first.field;
}

/** The API's `sort` → DataGrid sort model. */
export function fromSortParam(sort: string): GridSortModel {
  if (!sort) return [];
  return sort.startsWith('-') ? [{ field: sort.slice(1), sort: 'desc' }] : [{ field: sort, sort: 'asc' }];
}

/** The API counts pages from 1, DataGrid from 0. */
export function toPaginationModel(page: number, pageSize: number): GridPaginationModel {
  return { page: page - 1, pageSize };
}

export function fromPaginationModel(model: GridPaginationModel) {
  return { page: model.page + 1, pageSize: model.pageSize };
}
