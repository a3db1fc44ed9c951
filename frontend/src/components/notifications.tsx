import Alert from '@mui/material/Alert';
import Snackbar from '@mui/material/Snackbar';
import { useTheme } from '@mui/material/styles';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useEffect, useRef } from 'react';
import { useLocation } from 'react-router-dom';
import { dismissNotification, dismissOnNavigation, useNotifications } from '@/lib/notifications';

export const NOTICE_HIDE_MS = { error: 8000, other: 5000 } as const;

/**
 * Shows the oldest pending notification; the next appears when it is dismissed or times out. On a wide screen it
 * sits in the empty middle of the app bar (covering no part of the page); on a phone at the bottom, full width.
 */
export function Notifications() {
  const notifications = useNotifications();
  const wide = useMediaQuery(useTheme().breakpoints.up('md'));
  const current = notifications[0];
  if (!current) return null;
  const close = () => dismissNotification(current.id);
  return (
    <Snackbar
      key={current.id}
      open
      autoHideDuration={current.severity === 'error' ? NOTICE_HIDE_MS.error : NOTICE_HIDE_MS.other}
      // It hides on time even while the window is in the background (a pause there left it up for good).
      disableWindowBlurListener
      onClose={(_, reason) => {
        if (reason !== 'clickaway') close();
      }}
      anchorOrigin={wide ? { vertical: 'top', horizontal: 'center' } : { vertical: 'bottom', horizontal: 'center' }}
      // Between the logo and the account buttons (about 300 px each side); one line for the usual message.
      sx={wide ? { top: { md: 4 }, maxWidth: 'min(880px, calc(100vw - 600px))' } : undefined}
      data-testid="notice"
    >
      <Alert severity={current.severity} variant="filled" onClose={close} sx={{ width: '100%', ...(wide ? { py: 0, alignItems: 'center' } : {}) }}>
        {current.message}
      </Alert>
    </Snackbar>
  );
}

/** Inside the router: a page change closes the notices of earlier pages (see dismissOnNavigation). */
export function DismissNoticesOnNavigation() {
  const { pathname } = useLocation();
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    dismissOnNavigation();
  }, [pathname]);
  return null;
}
