import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import { useSearchParams } from 'react-router-dom';
import { BILLING_ROLES } from '@kilocycle/common/rules';
import { PageHeader } from '@/components/ui/page-header';
import { CustomerTermsTable } from '@/features/prices/components/customer-terms-table';
import { PriceItemsTable } from '@/features/prices/components/price-items-table';
import { TaxRatesTable } from '@/features/prices/components/tax-rates-table';
import { useCurrentUser } from '@/lib/auth';

const TABS = [
  { value: 'items', label: 'Price list' },
  { value: 'tax-rates', label: 'Tax rates' },
  { value: 'customers', label: 'Customer terms' },
] as const;
type TabValue = (typeof TABS)[number]['value'];

export default function PricesRoute() {
  const user = useCurrentUser();
  const canEdit = BILLING_ROLES.includes(user.role);
  const [params, setParams] = useSearchParams();
  const tab: TabValue = TABS.find((t) => t.value === params.get('tab'))?.value ?? 'items';
  // Each tab has its own list: paging, sort and filters start afresh on another tab.
  const show = (next: TabValue) => setParams(next === 'items' ? {} : { tab: next }, { replace: true });

  return (
    <>
      <PageHeader
        title="Prices"
        description="The services the lab charges for, the tax rates, and each customer’s tax treatment and payment terms. Quotes and invoices are priced from here."
      />
      {!canEdit && (
        <Alert severity="info" sx={{ mb: 2 }}>
          You can read the prices; the administrator and the calibration lead change them.
        </Alert>
      )}
      <Box sx={{ borderBottom: 1, borderColor: 'divider', mb: 2 }}>
        <Tabs value={tab} onChange={(_event, next: TabValue) => show(next)} variant="scrollable" allowScrollButtonsMobile aria-label="Price list sections">
          {TABS.map((t) => (
            <Tab key={t.value} value={t.value} label={t.label} />
          ))}
        </Tabs>
      </Box>
      {tab === 'items' && <PriceItemsTable canEdit={canEdit} />}
      {tab === 'tax-rates' && <TaxRatesTable canEdit={canEdit} />}
      {tab === 'customers' && <CustomerTermsTable canEdit={canEdit} />}
    </>
  );
}
