/** Every list endpoint answers this shape. */
export type ListResponse<T> = { items: T[]; total: number };

/** Query parameters every list endpoint accepts (filters are added per endpoint). */
export type ListQuery = {
  page?: number;
  pageSize?: number;
  /** `field` or `-field` (descending). */
  sort?: string;
  q?: string;
};

export const MAX_PAGE_SIZE = 500;

/** Highest page number a list accepts (far past any lab's data; keeps OFFSET a plain integer). */
export const MAX_PAGE = 100_000;
