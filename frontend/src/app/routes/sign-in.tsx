import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { safeNextPath } from '@/config/paths';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { useSession } from '@/lib/auth';

export default function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { isSignedIn } = useSession();
  const next = safeNextPath(params.get('next'));

  if (isSignedIn) return <Navigate to={next} replace />;

  return (
    <AuthLayout title="Sign in">
      <SignInForm onSuccess={() => navigate(next, { replace: true })} />
    </AuthLayout>
  );
}
