import Button from '@mui/material/Button';
import { Link as RouterLink, useLocation } from 'react-router-dom';
import { paths } from '@/config/paths';
import { MessageScreen } from './message-screen';

export function NotFound() {
  const { pathname } = useLocation();
  return (
    <MessageScreen
      code="404"
      title="Page not found"
      actions={
        <Button component={RouterLink} to={paths.home} variant="contained">
          Back to the overview
        </Button>
      }
    >
      There is no page at <code>{pathname}</code>. The link may be old or mistyped.
    </MessageScreen>
  );
}
