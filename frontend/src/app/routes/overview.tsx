import { WelcomePanel } from '@/features/overview/components/welcome-panel';

export default function OverviewRoute() {
  return <WelcomePanel />;
}
