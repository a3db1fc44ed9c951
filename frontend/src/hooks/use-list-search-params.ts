import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { MAX_PAGE, MAX_PAGE_SIZE } from '@kilocycle/common/types';

type ListDefaults = {
  pageSize: number;
  sort?: string;
  /** Fields the API can sort by; a `sort` naming any other field is ignored. */
  sortFields?: readonly string[];
};

type ListChange<F extends string> = Partial<Record<'page' | 'pageSize' | 'sort' | 'q' | F, string | number | undefined>>;

function positiveInt(raw: string | null, fallback: number, max = Number.MAX_SAFE_INTEGER) {
  const n = raw === null ? NaN : Number(raw);
  return Number.isInteger(n) && n >= 1 ? Math.min(n, max) : fallback;
}

function allowedSort(raw: string | null, { sort: fallback = '', sortFields }: ListDefaults) {
  if (raw === null) return fallback;
  if (raw === '') return '';
  const field = raw.startsWith('-') ? raw.slice(1) : raw;
  return !sortFields || sortFields.includes(field) ? raw : fallback;
}

/**
 * Paging, sorting, search and filters of a list kept in the address bar, so a filtered page can be
 * bookmarked or shared and the back button works. `page` is 1-based, as in the API.
 */
export function useListSearchParams<F extends string = never>(defaults: ListDefaults, filterKeys: readonly F[] = []) {
  const [params, setParams] = useSearchParams();

  const state = useMemo(() => {
    const filters = {} as Record<F, string>;
    for (const key of filterKeys) filters[key] = params.get(key) ?? '';
    return {
      page: positiveInt(params.get('page'), 1, MAX_PAGE),
      pageSize: positiveInt(params.get('pageSize'), defaults.pageSize, MAX_PAGE_SIZE),
      sort: allowedSort(params.get('sort'), defaults),
      q: params.get('q') ?? '',
      filters,
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- filterKeys is a constant list per page; defaults is read field by field.
  }, [params, defaults.pageSize, defaults.sort, defaults.sortFields]);

  const update = useCallback(
    (changes: ListChange<F>) => {
      setParams(
        (previous) => {
          const next = new URLSearchParams(previous);
          for (const [key, value] of Object.entries(changes) as [string, string | number | undefined][]) {
            if (value === undefined || value === '') next.delete(key);
            else next.set(key, String(value));
          }
          // Any change but the page itself starts again at the first page.
          if (!('page' in changes)) next.delete('page');
          if (next.get('page') === '1') next.delete('page');
          return next;
        },
        { replace: true },
      );
    },
    [setParams],
  );

  return { ...state, update };
}
