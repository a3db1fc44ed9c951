import { describe, expect, it } from 'vitest';
import { fromPaginationModel, fromSortParam, toPaginationModel, toSortParam } from '../data-grid';

describe('DataGrid ⇄ API list parameters', () => {
  it('maps the 0-based grid page to the 1-based API page and back', () => {
    expect(toPaginationModel(1, 25)).toEqual({ page: 0, pageSize: 25 });
    expect(fromPaginationModel({ page: 3, pageSize: 50 })).toEqual({ page: 4, pageSize: 50 });
  });

  it('writes descending sorts with a leading minus and reads them back', () => {
    expect(toSortParam([{ field: 'createdAt', sort: 'desc' }])).toBe('-createdAt');
    expect(toSortParam([{ field: 'name', sort: 'asc' }])).toBe('name');
    expect(toSortParam([])).toBe('');
    expect(fromSortParam('-createdAt')).toEqual([{ field: 'createdAt', sort: 'desc' }]);
    expect(fromSortParam('email')).toEqual([{ field: 'email', sort: 'asc' }]);
    expect(fromSortParam('')).toEqual([]);
  });
});
