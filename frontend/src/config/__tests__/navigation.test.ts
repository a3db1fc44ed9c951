import { describe, expect, it } from 'vitest';
import { ROLES } from '@kilocycle/common/types';
import { NAV_ITEMS, navItemsFor, rolesFor } from '../navigation';

const labels = (role: Parameters<typeof navItemsFor>[0]) => navItemsFor(role).map((item) => item.label);

describe('navigation', () => {
  it('shows an administrator the overview and both admin pages', () => {
    expect(labels('admin')).toEqual([
      'Overview',
      'Jobs',
      'Instruments',
      'Standards',
      'Benches',
      'Certificates',
      'Invoices',
      'Prices',
      'Outbox',
      'Users',
      'Organisations',
    ]);
  });

  it('shows a client the overview, its jobs and instruments, its certificates, quotes and invoices', () => {
    expect(labels('client')).toEqual(['Overview', 'Jobs', 'Instruments', 'Certificates', 'Quotes', 'Invoices']);
    expect(navItemsFor('client').find((item) => item.label === 'Invoices')?.path).toBe('/portal/invoices');
    expect(labels('client')).not.toContain('Prices');
    expect(labels('client')).not.toContain('Users');
    expect(labels('client')).not.toContain('Organisations');
  });

  it.each(['lead', 'technician', 'engineer'] as const)('keeps the admin pages from a %s', (role) => {
    expect(labels(role)).not.toContain('Users');
    expect(labels(role)).not.toContain('Outbox');
  });

  it('gives the review queue and the procedures to the lead alone', () => {
    expect(labels('lead')).toEqual([
      'Overview',
      'Jobs',
      'Instruments',
      'Standards',
      'Benches',
      'Review',
      'Certificates',
      'Invoices',
      'Prices',
      'Comparisons',
      'Procedures',
    ]);
    expect(labels('technician')).toEqual(['Overview', 'Jobs', 'Instruments', 'Standards', 'Benches', 'Certificates', 'Invoices', 'Prices']);
  });

  it('gives the comparisons of studies to the engineer and the lead', () => {
    expect(labels('engineer')).toEqual(['Overview', 'Jobs', 'Instruments', 'Standards', 'Benches', 'Certificates', 'Invoices', 'Prices', 'Comparisons']);
    expect(rolesFor('/comparisons')).toEqual(['engineer', 'lead']);
  });

  it('gives lab staff the standards and benches, and nobody outside the lab', () => {
    for (const role of ['admin', 'lead', 'technician', 'engineer'] as const)
      expect(labels(role)).toEqual(expect.arrayContaining(['Jobs', 'Instruments', 'Standards', 'Benches']));
    expect(labels('client')).not.toContain('Standards');
    expect(labels('client')).not.toContain('Benches');
    expect(rolesFor('/benches')).toEqual(['admin', 'lead', 'technician', 'engineer']);
  });

  it('gives every role the overview and every entry a unique path', () => {
    for (const role of ROLES) expect(labels(role)).toContain('Overview');
    const pathsSeen = NAV_ITEMS.map((item) => item.path);
    expect(new Set(pathsSeen).size).toBe(pathsSeen.length);
  });

  it('gives the lab’s staff the prices and invoices, read-only for technicians and engineers on the pages themselves', () => {
    expect(rolesFor('/prices')).toEqual(['admin', 'lead', 'technician', 'engineer']);
    expect(rolesFor('/invoices')).toEqual(['admin', 'lead', 'technician', 'engineer']);
    expect(rolesFor('/portal/quotes')).toEqual(['client']);
    expect(rolesFor('/portal/invoices')).toEqual(['client']);
  });

  it('gives the router the same roles as the navigation entry', () => {
    expect(rolesFor('/admin/users')).toEqual(['admin']);
    expect(() => rolesFor('/nowhere')).toThrow('No navigation entry for /nowhere');
  });
});
