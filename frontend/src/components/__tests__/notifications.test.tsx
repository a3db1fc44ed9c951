import { act, fireEvent, screen } from '@testing-library/react';
import { Link } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { notify } from '@/lib/notifications';
import { renderWithApp } from '@/testing/test-utils';
import { DismissNoticesOnNavigation } from '../notifications';

function Page({ name }: { name: string }) {
  return (
    <>
      <DismissNoticesOnNavigation />
      <h1>{name}</h1>
      <Link to="/jobs/7">Job page</Link>
      <Link to="/corrections">Corrections page</Link>
    </>
  );
}

const routes = [
  { path: '/jobs/7', element: <Page name="Job" /> },
  { path: '/corrections', element: <Page name="Corrections" /> },
];

describe('<Notifications>', () => {
  afterEach(() => {
    vi.useRealTimers();
    vi.restoreAllMocks();
  });

  it('keeps the notice through the page change its own action makes, and closes it on the next one', async () => {
    const now = vi.spyOn(Date, 'now').mockReturnValue(1_000_000);
    renderWithApp(<Page name="Jobs" />, { path: '/', routes });
    act(() => notify('success', 'Job J-0007 opened for a signal generator.'));
    // The action opens the new job's page at once: the notice comes along.
    fireEvent.click(screen.getByRole('link', { name: 'Job page' }));
    await screen.findByRole('heading', { name: 'Job' });
    expect(screen.getByText('Job J-0007 opened for a signal generator.')).toBeTruthy();
    // Ten seconds later the person moves on: the notice does not follow.
    now.mockReturnValue(1_010_000);
    fireEvent.click(screen.getByRole('link', { name: 'Corrections page' }));
    await screen.findByRole('heading', { name: 'Corrections' });
    expect(screen.queryByText('Job J-0007 opened for a signal generator.')).toBeNull();
  });

  it('hides a success notice by itself after five seconds, an error after eight', () => {
    vi.useFakeTimers();
    renderWithApp(<Page name="Jobs" />, { path: '/', routes });
    act(() => notify('success', 'Ranges saved.'));
    expect(screen.getByText('Ranges saved.')).toBeTruthy();
    act(() => vi.advanceTimersByTime(4900));
    expect(screen.getByText('Ranges saved.')).toBeTruthy();
    act(() => vi.advanceTimersByTime(200));
    // The snackbar closes (its exit transition may still be running: it is no longer shown as open).
    act(() => vi.advanceTimersByTime(1000));
    expect(screen.queryByText('Ranges saved.')).toBeNull();

    act(() => notify('error', 'The job could not be opened.'));
    act(() => vi.advanceTimersByTime(7900));
    expect(screen.getByText('The job could not be opened.')).toBeTruthy();
    act(() => vi.advanceTimersByTime(1200));
    expect(screen.queryByText('The job could not be opened.')).toBeNull();
  });
});
