import ArrowBack from '@mui/icons-material/ArrowBack';
import Button from '@mui/material/Button';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { StatementView } from '@/features/invoices/components/statement-view';

export default function StatementRoute() {
  const { organizationId } = useParams();
  const id = Number(organizationId);
  return (
    <>
      <Button component={RouterLink} to={`${paths.invoices}?organizationId=${id}`} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
        This customer’s invoices
      </Button>
      <PageHeader title="Statement" description="What the customer owes, has paid and has been credited, and every movement with the running balance." />
      <StatementView organizationId={id} />
    </>
  );
}
