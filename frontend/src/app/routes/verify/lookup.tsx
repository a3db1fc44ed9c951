import { useNavigate } from 'react-router-dom';
import { paths, verifyPath } from '@/config/paths';
import { PublicLayout } from '@/features/verification/components/public-layout';
import { VerifyLookup } from '@/features/verification/components/verify-lookup';

export default function VerifyLookupRoute() {
  const navigate = useNavigate();
  return (
    <PublicLayout homePath={paths.verify}>
      <VerifyLookup onLookup={(number) => navigate(verifyPath(number))} />
    </PublicLayout>
  );
}
