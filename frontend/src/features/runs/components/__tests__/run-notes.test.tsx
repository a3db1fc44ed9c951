import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { AuditEventView, Run } from '@kilocycle/common/types';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { RunNotes } from '../run-notes';

const NOTES = `Cold start after a night off.

Import of "warmup.csv" on 2026-11-30 09:12 UTC by Tomas Reyes: 498 readings imported, 2 rows skipped:
- line 7, frequency: not a number
- line 12, time: earlier than the line before`;

const run = (notes: string | null) => ({ id: 41, kind: 'warmup', status: 'open', notes }) as unknown as Run;
const event = (action: string, changes: Record<string, unknown>, id: number): AuditEventView => ({
  id,
  actorId: 3,
  actorName: 'Tomas Reyes',
  at: '2026-11-30T09:12:00.000Z',
  entity: 'run',
  entityId: '41',
  action,
  changes,
});

/** Answers GET /api/audit by its action parameter, as the server filters it. */
function serveAudit(byAction: Record<string, AuditEventView[]>) {
  const urls: string[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
      urls.push(url.pathname + url.search);
      if (url.pathname !== '/api/audit') throw new Error(`Unhandled request in test: ${url.href}`);
      const items = byAction[url.searchParams.get('action') ?? ''] ?? [];
      return new Response(JSON.stringify({ items, total: items.length }), { headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return urls;
}

afterEach(() => vi.unstubAllGlobals());

describe('<RunNotes>', () => {
  it('shows the run notes with the skipped rows of an import, each import, and the corrections', async () => {
    signInAs({ role: 'technician' });
    const urls = serveAudit({
      import: [
        event('import', { file: 'warmup.csv', mode: 'valid', rows: 500, imported: 498, skipped: 2 }, 7),
        event('import', { file: 'first.csv', mode: 'all', rows: 1200, imported: 1200, skipped: 0 }, 5),
      ],
      update: [event('update', { configuration: { from: 'In case', to: 'Out of its case' }, reason: 'Typed the wrong one' }, 9)],
    });
    renderWithApp(<RunNotes run={run(NOTES)} />);

    const panel = await screen.findByRole('region', { name: 'Notes' });
    const text = within(panel).getByTestId('run-notes-text').textContent ?? '';
    expect(text).toContain('Cold start after a night off.');
    expect(text).toContain('- line 7, frequency: not a number');
    expect(text).toContain('- line 12, time: earlier than the line before');
    const imports = await within(panel).findByRole('region', { name: 'Imports into this run' });
    const items = within(imports)
      .getAllByRole('listitem')
      .map((li) => li.textContent);
    expect(items[0]).toContain('“warmup.csv”: 498 readings imported of 500 rows, 2 rows skipped, listed in the notes above (valid rows only)');
    expect(items[1]).toContain('“first.csv”: 1 200 readings imported of 1 200 rows, none skipped');
    const corrections = await within(panel).findByRole('region', { name: 'Corrections of this run' });
    expect(corrections.textContent).toContain('Out of its case');
    expect(corrections.textContent).toContain('Why: Typed the wrong one');
    // Both lists come from the run's own audit trail, newest first.
    expect(urls.some((u) => u.includes('entity=run') && u.includes('entityId=41') && u.includes('action=import') && u.includes('sort=-at'))).toBe(true);
  });

  it('shows nothing when the run has no notes, imports or corrections', async () => {
    signInAs({ role: 'engineer' });
    const urls = serveAudit({});
    const { container } = renderWithApp(<RunNotes run={run(null)} />);
    await vi.waitFor(() => expect(urls.length).toBe(2));
    await new Promise((done) => setTimeout(done, 20));
    expect(container.querySelector('[data-testid="run-notes"]')).toBeNull();
  });
});
