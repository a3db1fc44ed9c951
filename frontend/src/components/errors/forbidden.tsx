import Button from '@mui/material/Button';
import { Link as RouterLink } from 'react-router-dom';
import { paths } from '@/config/paths';
import { MessageScreen } from './message-screen';

export function Forbidden() {
  return (
    <MessageScreen
      code="403"
      title="Not allowed"
      actions={
        <Button component={RouterLink} to={paths.home} variant="contained">
          Back to the overview
        </Button>
      }
    >
      Your role does not give you access to this page. If you need it for your work, ask the lab’s administrator.
    </MessageScreen>
  );
}
