import { PageHeader } from '@/components/ui/page-header';
import { reviewPath } from '@/config/paths';
import { ReviewQueue } from '@/features/reviews/components/review-queue';

export default function ReviewQueueRoute() {
  return (
    <>
      <PageHeader
        title="Review"
        description="Jobs the technicians have submitted. Open one to look at its data, fits, budgets, decisions and flags, then return it with comments or sign and issue the certificate."
      />
      <ReviewQueue reviewPath={reviewPath} />
    </>
  );
}
