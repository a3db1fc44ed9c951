import Button from '@mui/material/Button';
import { paths } from '@/config/paths';
import { MessageScreen } from './message-screen';

type ErrorScreenProps = { message?: string; onRetry?: () => void };

// Plain anchors rather than router links: this also renders when the router itself has failed.
export function ErrorScreen({ message, onRetry }: ErrorScreenProps) {
  return (
    <MessageScreen
      title="Something went wrong"
      actions={
        <>
          <Button variant="contained" onClick={onRetry ?? (() => window.location.reload())}>
            Try again
          </Button>
          <Button href={paths.home}>Back to the overview</Button>
        </>
      }
    >
      <p style={{ marginTop: 0 }}>This page could not be shown. Try again, or go back to the overview.</p>
      {message && (
        <p style={{ marginBottom: 0 }}>
          Details: <code>{message}</code>
        </p>
      )}
    </MessageScreen>
  );
}
