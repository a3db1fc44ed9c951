import { useNavigate, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { CertificateVerification } from '@/features/verification/components/certificate-verification';
import { PublicLayout } from '@/features/verification/components/public-layout';

export default function VerifyCertificateRoute() {
  const number = useParams().number ?? '';
  const navigate = useNavigate();
  return (
    <PublicLayout homePath={paths.verify}>
      <CertificateVerification key={number} number={number} onOtherNumber={() => navigate(paths.verify)} />
    </PublicLayout>
  );
}
