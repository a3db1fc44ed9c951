import { verifyPath } from '@/config/paths';
import { CertificatesTable } from '@/features/certificates/components/certificates-table';
import { WelcomePanel } from '@/features/overview/components/welcome-panel';
import { PortalOverview } from '@/features/portal/components/portal-overview';
import { useCurrentUser } from '@/lib/auth';

export default function OverviewRoute() {
  const user = useCurrentUser();
  // A customer's overview is their own instruments, jobs and certificates.
  if (user.role === 'client') return <PortalOverview certificates={<CertificatesTable embedded verifyPath={verifyPath} />} />;
  return <WelcomePanel />;
}
