import ArrowBackOutlined from '@mui/icons-material/ArrowBackOutlined';
import Button from '@mui/material/Button';
import { Link as RouterLink, useNavigate, useParams } from 'react-router-dom';
import { NotFound } from '@/components/errors/not-found';
import { PageHeader } from '@/components/ui/page-header';
import { comparisonPath, paths } from '@/config/paths';
import { ComparisonBuilder } from '@/features/comparisons/components/comparison-builder';
import { SavedComparison } from '@/features/comparisons/components/saved-comparison';
import { useCurrentUser } from '@/lib/auth';

export default function ComparisonRoute() {
  const param = useParams().comparisonId ?? '';
  const navigate = useNavigate();
  const user = useCurrentUser();
  const canEdit = user.role === 'engineer' || user.role === 'lead';

  if (param === 'new') {
    return (
      <>
        <Button component={RouterLink} to={paths.comparisons} size="small" startIcon={<ArrowBackOutlined />} sx={{ mb: 1 }}>
          Comparisons
        </Button>
        <PageHeader
          title="New comparison"
          description="Pick the instrument, then the runs to set side by side. The drift curves are aligned at power-on, and every difference comes with its 95 % interval."
        />
        <ComparisonBuilder canSave={canEdit} onSaved={(saved) => navigate(comparisonPath(saved.id), { replace: true })} />
      </>
    );
  }
  const id = Number(param);
  if (!Number.isInteger(id) || id <= 0) return <NotFound />;
  return <SavedComparison key={id} id={id} listPath={paths.comparisons} canEdit={canEdit} onDeleted={() => navigate(paths.comparisons, { replace: true })} />;
}
