import { DataGrid, type DataGridProps, type GridValidRowModel } from '@mui/x-data-grid';
import type { ListResponse } from '@kilocycle/common/types';
import { fromPaginationModel, fromSortParam, PAGE_SIZE_OPTIONS, toPaginationModel, toSortParam } from '@/lib/data-grid';

/** The part of useListSearchParams a grid drives: the page, its size and the sort, kept in the address bar. */
type ListState = {
  page: number;
  pageSize: number;
  sort: string;
  update: (changes: { page?: number; pageSize?: number; sort?: string }) => void;
};

type ServerDataGridProps<R extends GridValidRowModel> = Omit<
  DataGridProps<R>,
  'rows' | 'rowCount' | 'loading' | 'paginationMode' | 'sortingMode' | 'filterMode' | 'paginationModel' | 'sortModel'
> & {
  label: string;
  /** The list query: `{items, total}` as every list endpoint answers. */
  result: { data?: ListResponse<R>; isFetching: boolean; isError: boolean };
  list: ListState;
  emptyText: string;
  /** Shown when the list request failed. */
  errorText?: string;
};

/** A DataGrid whose paging and sorting are done by the API (1-based pages there, 0-based here). */
export function ServerDataGrid<R extends GridValidRowModel>({
  label,
  result,
  list,
  emptyText,
  errorText = 'The list could not be loaded.',
  sx,
  ...rest
}: ServerDataGridProps<R>) {
  return (
    <DataGrid<R>
      aria-label={label}
      rows={result.data?.items ?? []}
      rowCount={result.data?.total ?? 0}
      loading={result.isFetching}
      paginationMode="server"
      sortingMode="server"
      filterMode="server"
      disableColumnFilter
      paginationModel={toPaginationModel(list.page, list.pageSize)}
      onPaginationModelChange={(model) => list.update(fromPaginationModel(model))}
      pageSizeOptions={PAGE_SIZE_OPTIONS}
      sortModel={fromSortParam(list.sort)}
      onSortModelChange={(model) => list.update({ sort: toSortParam(model) })}
      sortingOrder={['asc', 'desc']}
      localeText={{ noRowsLabel: result.isError ? errorText : emptyText }}
      sx={[{ border: 0 }, ...(Array.isArray(sx) ? sx : [sx])]}
      {...rest}
    />
  );
}
