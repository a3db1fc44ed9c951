import { useParams } from 'react-router-dom';
import { NotFound } from '@/components/errors/not-found';
import { jobPath, paths, runPath } from '@/config/paths';
import { ReviewPage } from '@/features/reviews/components/review-page';

export default function ReviewRoute() {
  const jobId = Number(useParams().jobId);
  if (!Number.isInteger(jobId) || jobId <= 0) return <NotFound />;
  return <ReviewPage key={jobId} jobId={jobId} queuePath={paths.reviews} jobPath={jobPath(jobId)} runPath={runPath} />;
}
