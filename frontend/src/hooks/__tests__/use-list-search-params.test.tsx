import { renderHook } from '@testing-library/react';
import type { ReactNode } from 'react';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { useListSearchParams } from '../use-list-search-params';

const at =
  (search: string) =>
  ({ children }: { children: ReactNode }) => <MemoryRouter initialEntries={[`/list${search}`]}>{children}</MemoryRouter>;

describe('useListSearchParams()', () => {
  // The API refuses a page past 100,000 and a page size past 500 (400): a hand-edited address clamps instead.
  it.each([
    ['?page=1e20', 100_000],
    ['?page=250000', 100_000],
    ['?page=7', 7],
    ['?page=0', 1],
    ['?page=abc', 1],
  ])('%s reads as page %d', (search, page) => {
    const { result } = renderHook(() => useListSearchParams({ pageSize: 25 }), { wrapper: at(search) });
    expect(result.current.page).toBe(page);
  });

  it('a page size past 500 reads as 500', () => {
    const { result } = renderHook(() => useListSearchParams({ pageSize: 25 }), { wrapper: at('?pageSize=9000') });
    expect(result.current.pageSize).toBe(500);
  });
});
