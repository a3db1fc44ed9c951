import { PageHeader } from '@/components/ui/page-header';
import { PortalQuotes } from '@/features/quotes/components/portal-quotes';

export default function PortalQuotesRoute() {
  return (
    <>
      <PageHeader
        title="Quotes"
        description="The lab’s quotes for your instruments. Accept one to let the work start, or decline it; each is open for the days it states."
      />
      <PortalQuotes />
    </>
  );
}
