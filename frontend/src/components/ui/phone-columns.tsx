import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme, type Theme } from '@mui/material/styles';
import type { SystemStyleObject } from '@mui/system';
import type { DataGridProps, GridColDef, GridRenderCellParams, GridValidRowModel } from '@mui/x-data-grid';
import { useMemo } from 'react';

export type PhoneLayout<R extends GridValidRowModel> = {
  /**
   * The columns that stay on a phone, with their width there: `'fill'` for the one that takes the rest of the
   * row and carries the hidden columns' values on a second line (one column only).
   */
  keep: Readonly<Record<string, number | 'fill'>>;
  /** What the hidden columns say, as short texts (empty ones left out), joined on the fill column's second line. */
  secondLine: (row: R) => readonly (string | null | undefined | false)[];
};

type PhoneColumns<R extends GridValidRowModel> = Required<Pick<DataGridProps<R>, 'columns' | 'columnVisibilityModel' | 'getRowHeight'>> & {
  phone: boolean;
  /** Narrower cell padding and no column separators on a phone (a resize handle or a column menu is of no use there). */
  sx: SystemStyleObject<Theme>;
};

const NOTHING_HIDDEN = {};
const PHONE_SX: SystemStyleObject<Theme> = {
  '& .MuiDataGrid-cell:not(.MuiDataGrid-cellEmpty), & .MuiDataGrid-columnHeader': { px: 0.75 },
  '& .MuiDataGrid-columnSeparator': { display: 'none' },
};
const AUTO_HEIGHT = () => 'auto' as const;
const DEFAULT_HEIGHT = () => null;

/**
 * The house way for a data grid below the `sm` breakpoint (a phone): the columns that matter stay, the others
 * are hidden and their values shown in a second line of the kept `'fill'` column, so the row needs no sideways
 * scrolling. From `sm` up the columns are as given. Spread the result into the DataGrid's props.
 */
export function usePhoneColumns<R extends GridValidRowModel>(columns: readonly GridColDef<R>[], layout: PhoneLayout<R>): PhoneColumns<R> {
  const phone = useMediaQuery(useTheme().breakpoints.down('sm'));
  const { keep, secondLine } = layout;
  return useMemo(() => {
    if (!phone) return { phone, columns: [...columns], columnVisibilityModel: NOTHING_HIDDEN, getRowHeight: DEFAULT_HEIGHT, sx: {} };
    const visibility = Object.fromEntries(columns.map((column) => [column.field, column.field in keep]));
    const phoneColumns = columns.map((column): GridColDef<R> => {
      const width = keep[column.field];
      if (width === undefined) return column;
      const fitted = { ...column, disableColumnMenu: true, resizable: false };
      if (width !== 'fill') return { ...fitted, width, minWidth: width, flex: undefined };
      return {
        ...fitted,
        flex: 1,
        width: undefined,
        minWidth: 90,
        renderCell: (params: GridRenderCellParams<R>) => (
          <Box sx={{ display: 'flex', flexDirection: 'column', justifyContent: 'center', minWidth: 0, py: 0.75, lineHeight: 1.3 }}>
            <Box sx={{ overflow: 'hidden', textOverflow: 'ellipsis' }}>{column.renderCell ? column.renderCell(params) : params.formattedValue}</Box>
            <Typography variant="caption" color="text.secondary" sx={{ whiteSpace: 'normal', overflowWrap: 'anywhere' }}>
              {secondLine(params.row).filter(Boolean).join(' · ')}
            </Typography>
          </Box>
        ),
      };
    });
    return { phone, columns: phoneColumns, columnVisibilityModel: visibility, getRowHeight: AUTO_HEIGHT, sx: PHONE_SX };
  }, [phone, columns, keep, secondLine]);
}

/** The same way for a plain MUI table: `sx` for the cells (head and body) of a column that hides on a phone. */
export const HIDE_ON_PHONE = { display: { xs: 'none', sm: 'table-cell' } } as const;

/** The hidden cells' values, as a second line in a kept cell; shown on a phone only. */
export function PhoneSecondLine({ parts }: { parts: readonly (string | null | undefined | false)[] }) {
  return (
    <Typography component="div" variant="caption" color="text.secondary" sx={{ display: { xs: 'block', sm: 'none' }, overflowWrap: 'anywhere' }}>
      {parts.filter(Boolean).join(' · ')}
    </Typography>
  );
}
