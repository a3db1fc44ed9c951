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
