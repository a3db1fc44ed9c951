import LogoutIcon from '@mui/icons-material/Logout';
import MenuIcon from '@mui/icons-material/Menu';
import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Divider from '@mui/material/Divider';
import Drawer from '@mui/material/Drawer';
import IconButton from '@mui/material/IconButton';
import List from '@mui/material/List';
import ListItem from '@mui/material/ListItem';
import ListItemButton from '@mui/material/ListItemButton';
import ListItemIcon from '@mui/material/ListItemIcon';
import ListItemText from '@mui/material/ListItemText';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import { useState, type ReactNode } from 'react';
import { NavLink, useNavigate } from 'react-router-dom';
import { navItemsFor } from '@/config/navigation';
import { paths } from '@/config/paths';
import { ROLE_LABELS } from '@/config/roles';
import { useCurrentUser, useSignOut } from '@/lib/auth';
import { Logo } from './logo';

const DRAWER_WIDTH = 224;

function MainNavigation({ onNavigate }: { onNavigate?: () => void }) {
  const user = useCurrentUser();
  const items = navItemsFor(user.role);
  return (
    <Box component="nav" aria-label="Main" sx={{ p: 1 }}>
      <List disablePadding dense>
        {/* Each link sits in its own list item: a list may hold only list items (WCAG 1.3.1). */}
        {items.map(({ label, path, icon: Icon }) => (
          <ListItem key={path} disablePadding sx={{ mb: 0.25 }}>
            <ListItemButton component={NavLink} to={path} end={path === paths.home} onClick={onNavigate}>
              <ListItemIcon sx={{ minWidth: 36 }}>
                <Icon fontSize="small" />
              </ListItemIcon>
              <ListItemText primary={label} />
            </ListItemButton>
          </ListItem>
        ))}
      </List>
    </Box>
  );
}

function UserBadge() {
  const user = useCurrentUser();
  return (
    <Box sx={{ textAlign: 'right', lineHeight: 1.2, minWidth: 0 }}>
      <Typography variant="body2" noWrap sx={{ fontWeight: 500, maxWidth: { xs: 120, sm: 240 } }}>
        {user.name}
      </Typography>
      <Typography variant="caption" sx={{ opacity: 0.8 }}>
        {ROLE_LABELS[user.role]}
      </Typography>
    </Box>
  );
}

export function AppLayout({ children }: { children: ReactNode }) {
  const [mobileOpen, setMobileOpen] = useState(false);
  const signOut = useSignOut();
  const navigate = useNavigate();

  const handleSignOut = () => {
    signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn, { replace: true }) });
  };

  return (
    <Box sx={{ display: 'flex', minHeight: '100vh' }}>
      <AppBar position="fixed" sx={{ zIndex: (t) => t.zIndex.drawer + 1 }}>
        <Toolbar variant="dense" sx={{ gap: 1.5 }}>
          <IconButton color="inherit" edge="start" aria-label="Open navigation" onClick={() => setMobileOpen(true)} sx={{ display: { md: 'none' } }}>
            <MenuIcon />
          </IconButton>
          <Logo />
          <Box sx={{ flex: 1 }} />
          <UserBadge />
          <Button
            color="inherit"
            variant="outlined"
            size="small"
            startIcon={<LogoutIcon fontSize="small" />}
            onClick={handleSignOut}
            disabled={signOut.isPending}
            sx={{ borderColor: 'rgba(255,255,255,0.5)' }}
          >
            Sign out
          </Button>
        </Toolbar>
      </AppBar>

      <Drawer
        variant="temporary"
        open={mobileOpen}
        onClose={() => setMobileOpen(false)}
        ModalProps={{ keepMounted: false }}
        sx={{ display: { xs: 'block', md: 'none' }, '& .MuiDrawer-paper': { width: DRAWER_WIDTH } }}
      >
        <Toolbar variant="dense" />
        <Divider />
        <MainNavigation onNavigate={() => setMobileOpen(false)} />
      </Drawer>

      <Drawer
        variant="permanent"
        sx={{
          display: { xs: 'none', md: 'block' },
          width: DRAWER_WIDTH,
          flexShrink: 0,
          '& .MuiDrawer-paper': { width: DRAWER_WIDTH, boxSizing: 'border-box' },
        }}
        open
      >
        <Toolbar variant="dense" />
        <MainNavigation />
      </Drawer>

      <Box component="main" sx={{ flex: 1, minWidth: 0, p: { xs: 2, md: 3 } }}>
        <Toolbar variant="dense" />
        {children}
      </Box>
    </Box>
  );
}
