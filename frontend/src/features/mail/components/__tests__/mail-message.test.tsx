import { fireEvent, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { MailMessageView } from '@kilocycle/common/types';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { MailMessage } from '../mail-message';

const HTML =
  '<!doctype html>\n<html><head><meta charset="utf-8"></head><body><p>Hello &lt;b&gt;</p><script>parent.document.title = "owned"</script></body></html>';

const message = (overrides: Partial<MailMessageView> = {}): MailMessageView => ({
  id: 41,
  messageId: '<m41@kilocycle.test>',
  kind: 'job_returned',
  from: 'Kilocycle <no-reply@kilocycle.local>',
  to: ['tech@kilocycle.test'],
  subject: 'Job J-2026-0041 returned for rework',
  size: 2048,
  attachmentCount: 0,
  receivedAt: '2026-11-30T10:00:00.000Z',
  text: 'Hello,\n\nRepeat dial 1900.',
  html: HTML,
  attachments: [],
  headers: [{ name: 'Reply-To', value: 'Quarry Lane Frequency Lab <bench@quarrylane.test>' }],
  ...overrides,
});

function show(view: MailMessageView) {
  signInAs({ role: 'admin' });
  mockFetch([{ path: `/api/mail/${view.id}`, body: view }]);
  renderWithApp(<MailMessage id={view.id} outboxPath="/admin/mail" />);
}

describe('<MailMessage>', () => {
  it('opens on the HTML part, in a sandboxed frame with no scripts and a policy that loads nothing', async () => {
    show(message());
    const frame = (await screen.findByTitle('Message body (HTML)')) as HTMLIFrameElement;
    expect(screen.getByRole('tab', { name: 'HTML' }).getAttribute('aria-selected')).toBe('true');
    expect(screen.getByRole('tab', { name: 'HTML' }).hasAttribute('disabled')).toBe(false);
    // sandbox="" grants nothing: no scripts, no forms, no same-origin access, no top navigation.
    expect(frame.getAttribute('sandbox')).toBe('');
    const doc = frame.getAttribute('srcdoc')!;
    expect(doc.startsWith('<!doctype html>')).toBe(true);
    expect(doc).toContain(`<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`);
    expect(doc.indexOf('Content-Security-Policy')).toBeLessThan(doc.indexOf('<html>'));
    expect(doc).toContain('<p>Hello &lt;b&gt;</p>');
  });

  it('keeps the HTML tab usable for a message without an HTML part, and says so', async () => {
    show(message({ id: 42, html: null }));
    await screen.findByText('Hello,', { exact: false });
    fireEvent.click(screen.getByRole('tab', { name: 'HTML' }));
    expect(screen.getByText('This message has no HTML part; its plain text is under Plain text.')).toBeTruthy();
    expect(screen.queryByTitle('Message body (HTML)')).toBeNull();
  });

  it('shows where replies go beside the sender, and the Reply-To header among the headers', async () => {
    show(message({ id: 43 }));
    const replyTo = await screen.findByText('Reply-To', { selector: 'dt' });
    expect(replyTo.nextElementSibling?.textContent).toBe('Quarry Lane Frequency Lab <bench@quarrylane.test>');
    fireEvent.click(await screen.findByRole('tab', { name: 'Headers' }));
    expect(screen.getByRole('cell', { name: 'Quarry Lane Frequency Lab <bench@quarrylane.test>' })).toBeTruthy();
  });
});
