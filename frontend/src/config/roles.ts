import type { Role } from '@kilocycle/common/types';

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  lead: 'Calibration lead',
  technician: 'Technician',
  engineer: 'Engineer',
  client: 'Client',
};

export const ROLE_DUTIES: Record<Role, string> = {
  admin: 'You look after the accounts and organisations, the benches and their bridge tokens, the outgoing mail and the settings.',
  lead: 'You review submitted jobs, send them back with comments or sign and issue the certificates, and you own the procedures, tolerances, uncertainty defaults and reference standards, the prices, quotes and invoices.',
  technician: 'You receive instruments, open jobs, capture dial and counter readings, run warm-up and stability studies, and submit the work for review.',
  engineer: 'You run and compare drift and stability studies, before and after a change to an instrument, and you can read all of the lab’s data.',
  client:
    'You can see your organisation’s instruments, where each job stands and the certificates issued to you, and download them as PDF files; you answer the lab’s quotes and pay its invoices by card.',
};
