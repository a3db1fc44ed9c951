import Alert from '@mui/material/Alert';
import Snackbar from '@mui/material/Snackbar';
import { dismissNotification, useNotifications } from '@/lib/notifications';

/** Shows the oldest pending notification; the next appears when it is dismissed or times out. */
export function Notifications() {
  const notifications = useNotifications();
  const current = notifications[0];
  if (!current) return null;
  const close = () => dismissNotification(current.id);
  return (
    <Snackbar
      key={current.id}
      open
      autoHideDuration={current.severity === 'error' ? 8000 : 5000}
      onClose={(_, reason) => {
        if (reason !== 'clickaway') close();
      }}
      anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
    >
      <Alert severity={current.severity} variant="filled" onClose={close} sx={{ width: '100%' }}>
        {current.message}
      </Alert>
    </Snackbar>
  );
}
