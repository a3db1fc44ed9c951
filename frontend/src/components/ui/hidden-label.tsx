import Box from '@mui/material/Box';
import type { GridColDef, GridValidRowModel } from '@mui/x-data-grid';

// The usual visually-hidden pattern: out of sight, still read by screen readers. Pinned to its containing block's
// corner: left where it falls, inside a table that scrolls in its own box it would escape that box (the box is not
// its containing block) and make the whole page scroll sideways on a phone.
const VISUALLY_HIDDEN = {
  left: 0,
  top: 0,
  border: 0,
  clip: 'rect(0 0 0 0)',
  height: '1px',
  margin: '-1px',
  overflow: 'hidden',
  padding: 0,
  position: 'absolute',
  whiteSpace: 'nowrap',
  width: '1px',
} as const;

/** Words for screen readers only: the header of a column of buttons or icons, which shows no words of its own. */
export function HiddenLabel({ children }: { children: string }) {
  return (
    <Box component="span" sx={VISUALLY_HIDDEN}>
      {children}
    </Box>
  );
}

/** A data grid column of buttons or icons: its header is named for screen readers and stays blank on screen. */
export function unlabelledHeader<R extends GridValidRowModel>(name: string): Pick<GridColDef<R>, 'headerName' | 'renderHeader'> {
  return { headerName: name, renderHeader: () => <HiddenLabel>{name}</HiddenLabel> };
}
