import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Bench } from '@kilocycle/common/types';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { BenchesTable } from '../benches-table';

const bench = (overrides: Partial<Bench>): Bench => ({
  id: 1,
  name: 'Bench 1',
  location: 'Workshop',
  defaultStandardId: null,
  defaultStandardName: null,
  hasToken: false,
  tokenIssuedAt: null,
  active: true,
  ...overrides,
});
const TOKEN = 'kcb_abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQ';

describe('<BenchesTable> bridge tokens', () => {
  it('asks before replacing a token, saying a running bridge is cut off, and only then issues it; the command comes with the caution', async () => {
    signInAs({ id: 1, role: 'admin' });
    const { requests } = mockFetch([
      { path: '/api/benches', body: { items: [bench({ hasToken: true, tokenIssuedAt: '2026-11-30T09:00:00.000Z' })], total: 1 } },
      { method: 'POST', path: '/api/benches/1/token', body: { benchId: 1, token: TOKEN } },
    ]);
    renderWithApp(<BenchesTable isAdmin />, { path: '/benches' });

    fireEvent.click(await screen.findByRole('button', { name: 'Issue bridge token for Bench 1' }));
    const confirm = screen.getByRole('dialog', { name: 'Issue a new bridge token?' });
    expect(confirm.textContent).toContain('a bridge running with the old token is cut off at once');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);

    fireEvent.click(within(confirm).getByRole('button', { name: 'Issue new token' }));
    await waitFor(() => expect(requests.filter((r) => r.method === 'POST').map((r) => r.url)).toEqual(['/api/benches/1/token']));
    const shown = await screen.findByRole('dialog', { name: 'Bridge token for Bench 1' });
    expect(within(shown).getByTestId('Command').textContent).toContain(`--token ${TOKEN}`);
    const caution = within(shown).getByRole('note', { name: 'Safety caution' });
    expect(caution.textContent).toContain('hundreds of volts');
    expect(caution.textContent).toContain('local electrical codes and licensed practice');
    expect(caution.textContent).toContain('does not judge whether a procedure is safe');
  });

  it('issues a first token without asking (nothing runs on it yet)', async () => {
    signInAs({ id: 1, role: 'admin' });
    const { requests } = mockFetch([
      { path: '/api/benches', body: { items: [bench({})], total: 1 } },
      { method: 'POST', path: '/api/benches/1/token', body: { benchId: 1, token: TOKEN } },
    ]);
    renderWithApp(<BenchesTable isAdmin />, { path: '/benches' });

    fireEvent.click(await screen.findByRole('button', { name: 'Issue bridge token for Bench 1' }));
    expect(await screen.findByRole('dialog', { name: 'Bridge token for Bench 1' })).toBeTruthy();
    expect(screen.queryByRole('dialog', { name: 'Issue a new bridge token?' })).toBeNull();
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(1);
  });
});
