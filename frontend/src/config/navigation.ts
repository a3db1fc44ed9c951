import BusinessOutlined from '@mui/icons-material/BusinessOutlined';
import BuildOutlined from '@mui/icons-material/BuildOutlined';
import PrecisionManufacturingOutlined from '@mui/icons-material/PrecisionManufacturingOutlined';
import SettingsInputAntennaOutlined from '@mui/icons-material/SettingsInputAntennaOutlined';
import WorkOutlineOutlined from '@mui/icons-material/WorkOutlineOutlined';
import OutboxOutlined from '@mui/icons-material/OutboxOutlined';
import PeopleOutlined from '@mui/icons-material/PeopleOutlined';
import ReceiptLongOutlined from '@mui/icons-material/ReceiptLongOutlined';
import RequestQuoteOutlined from '@mui/icons-material/RequestQuoteOutlined';
import SellOutlined from '@mui/icons-material/SellOutlined';
import RateReviewOutlined from '@mui/icons-material/RateReviewOutlined';
import RuleOutlined from '@mui/icons-material/RuleOutlined';
import StackedLineChartOutlined from '@mui/icons-material/StackedLineChartOutlined';
import WorkspacePremiumOutlined from '@mui/icons-material/WorkspacePremiumOutlined';
import SpaceDashboardOutlined from '@mui/icons-material/SpaceDashboardOutlined';
import type SvgIcon from '@mui/material/SvgIcon';
import { LAB_ROLES, STUDY_ROLES } from '@kilocycle/common/rules';
import { ROLES, type Role } from '@kilocycle/common/types';
import { paths } from './paths';

export type NavItem = {
  label: string;
  path: string;
  icon: typeof SvgIcon;
  roles: readonly Role[];
};

// The single list of pages in the side navigation. The router guards each page with the same roles.
export const NAV_ITEMS: readonly NavItem[] = [
  { label: 'Overview', path: paths.home, icon: SpaceDashboardOutlined, roles: ROLES },
  { label: 'Jobs', path: paths.jobs, icon: WorkOutlineOutlined, roles: ROLES },
  { label: 'Instruments', path: paths.instruments, icon: SettingsInputAntennaOutlined, roles: ROLES },
  { label: 'Standards', path: paths.standards, icon: PrecisionManufacturingOutlined, roles: LAB_ROLES },
  { label: 'Benches', path: paths.benches, icon: BuildOutlined, roles: LAB_ROLES },
  { label: 'Review', path: paths.reviews, icon: RateReviewOutlined, roles: ['lead'] },
  { label: 'Certificates', path: paths.certificates, icon: WorkspacePremiumOutlined, roles: ROLES },
  // The money side: the lab's staff read prices and invoices (admin and lead change them); a client its own quotes and invoices.
  { label: 'Quotes', path: paths.portalQuotes, icon: RequestQuoteOutlined, roles: ['client'] },
  { label: 'Invoices', path: paths.portalInvoices, icon: ReceiptLongOutlined, roles: ['client'] },
  { label: 'Invoices', path: paths.invoices, icon: ReceiptLongOutlined, roles: LAB_ROLES },
  { label: 'Prices', path: paths.prices, icon: SellOutlined, roles: LAB_ROLES },
  { label: 'Comparisons', path: paths.comparisons, icon: StackedLineChartOutlined, roles: STUDY_ROLES },
  { label: 'Procedures', path: paths.procedures, icon: RuleOutlined, roles: ['lead'] },
  { label: 'Outbox', path: paths.adminOutbox, icon: OutboxOutlined, roles: ['admin'] },
  { label: 'Users', path: paths.adminUsers, icon: PeopleOutlined, roles: ['admin'] },
  { label: 'Organisations', path: paths.adminOrganisations, icon: BusinessOutlined, roles: ['admin'] },
];

export function navItemsFor(role: Role, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) => item.roles.includes(role));
}

/** The roles allowed on a navigation entry's page; throws for a path that has no entry. */
export function rolesFor(path: string, items: readonly NavItem[] = NAV_ITEMS): readonly Role[] {
  const item = items.find((entry) => entry.path === path);
  if (!item) throw new Error(`No navigation entry for ${path}`);
  return item.roles;
}
