import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardActionArea from '@mui/material/CardActionArea';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import { LAB_ROLES } from '@kilocycle/common/rules';
import { Num } from '@/components/ui/num';
import { useOrganization } from '../api/get-organization';
import { navItemsFor } from '@/config/navigation';
import { paths } from '@/config/paths';
import { ROLE_DUTIES, ROLE_LABELS } from '@/config/roles';
import { useCurrentUser } from '@/lib/auth';

function greeting(hour: number) {
  if (hour < 12) return 'Good morning';
  if (hour < 18) return 'Good afternoon';
  return 'Good evening';
}

export function WelcomePanel() {
  const user = useCurrentUser();
  const pages = navItemsFor(user.role).filter((item) => item.path !== paths.home);
  const labStaff = LAB_ROLES.includes(user.role);
  const organization = useOrganization({ id: user.organizationId });

  return (
    <Box sx={{ maxWidth: 880 }}>
      <Typography variant="h1" component="h1" sx={{ mb: 1 }}>
        {greeting(new Date().getHours())}, {user.name}
      </Typography>
      <Paper variant="outlined" sx={{ p: 2.5, mb: 2 }}>
        <Box
          component="dl"
          sx={{
            display: 'grid',
            gridTemplateColumns: 'max-content 1fr',
            columnGap: 3,
            rowGap: 0.75,
            m: 0,
            mb: 2,
            '& dt': { color: 'text.secondary' },
            '& dd': { m: 0 },
          }}
        >
          <dt>Signed in as</dt>
          <dd>{user.email}</dd>
          <dt>Role</dt>
          <dd>{ROLE_LABELS[user.role]}</dd>
          <dt>Organisation</dt>
          <dd data-testid="organization-name">{organization.data ? organization.data.name : organization.isError ? <Num>#{user.organizationId}</Num> : '…'}</dd>
        </Box>
        <Typography>{ROLE_DUTIES[user.role]}</Typography>
      </Paper>

      {pages.length > 0 && (
        <>
          <Typography variant="h2" component="h2" sx={{ mb: 1 }}>
            Your pages
          </Typography>
          <Box sx={{ display: 'grid', gap: 1.5, gridTemplateColumns: 'repeat(auto-fill, minmax(220px, 1fr))', mb: 2 }}>
            {pages.map(({ label, path, icon: Icon }) => (
              <Card key={path} variant="outlined">
                <CardActionArea component={RouterLink} to={path} sx={{ p: 2, display: 'flex', gap: 1.5, justifyContent: 'flex-start' }}>
                  <Icon color="primary" />
                  <Typography sx={{ fontWeight: 500 }}>{label}</Typography>
                </CardActionArea>
              </Card>
            ))}
          </Box>
        </>
      )}

      {labStaff && user.role !== 'admin' && (
        <Alert severity="warning" variant="outlined">
          Much of the equipment that comes through the lab holds hazardous voltages, often for a long time after it is switched off. Discharge filter
          capacitors, keep one hand out of the chassis, use an isolation transformer, and work to your local electrical codes and licensed practice. Kilocycle
          records the work; it cannot tell you that a procedure is safe.
        </Alert>
      )}
    </Box>
  );
}
