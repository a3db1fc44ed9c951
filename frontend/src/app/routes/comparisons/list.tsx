import AddOutlined from '@mui/icons-material/AddOutlined';
import Button from '@mui/material/Button';
import { Link as RouterLink } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { comparisonPath } from '@/config/paths';
import { ComparisonsList } from '@/features/comparisons/components/comparisons-list';

export default function ComparisonsRoute() {
  return (
    <>
      <PageHeader
        title="Comparisons"
        description="Warm-up and stability studies of one instrument side by side, typically before and after a change: a regulator, a valve, a component, in or out of its case."
        actions={
          <Button component={RouterLink} to={comparisonPath('new')} variant="contained" startIcon={<AddOutlined />}>
            New comparison
          </Button>
        }
      />
      <ComparisonsList comparisonPath={comparisonPath} />
    </>
  );
}
