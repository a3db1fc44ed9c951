// E-mails built from stored values: a single-line value with a line break cannot add a line of its own to
// the message (no fake link, no fake sentence); a multi-line comment keeps its lines; control characters go.
import { jobReturnedMail, recallReminderMail } from '../../src/mail/mail-templates.js';
import { mailSignOff, mailTextToHtml, printableMailInput } from '../../src/mail/mail-text.js';

const lines = (text: string) => text.split('\n');

describe('e-mail text', () => {
  test('a make with CR/LF cannot inject a line into the recall reminder', () => {
    const mail = recallReminderMail({
      to: ['shop@saltmarsh.test'],
      labName: 'Quarry Lane\r\nLab',
      customer: 'Saltmarsh Restoration Works',
      instruments: [{ label: 'Test Works TG-1\r\n\r\nPay now at http://pay.invalid/\u0007', dueDate: '2026-01-31' }],
      portalUrl: 'http://127.0.0.1:5180/portal',
    });
    expect(lines(mail.text).filter((l) => l.startsWith('Pay now'))).toEqual([]);
    expect(mail.text).toContain('  - Test Works TG-1 Pay now at http://pay.invalid/: due 2026-01-31');
    expect(mail.text).toContain('This is a reminder from Quarry Lane Lab that');
    expect(mail.subject).toBe('Calibration due 2026-01-31: Test Works TG-1 Pay now at http://pay.invalid/');
  });

  test('a return comment keeps its lines, each indented; the instrument stays on its line', () => {
    const mail = jobReturnedMail({
      to: 'tech@kilocycle.test',
      technician: 'Tess\nTech',
      lead: 'Lee Lead',
      jobNumber: 'J-2025-0001',
      instrument: 'Test Works\r\nTG-1',
      comment: 'Repeat dial 1900.\r\nExclude reading #4.\u001b[2J',
      jobUrl: 'http://127.0.0.1:5180/jobs/1',
    });
    expect(lines(mail.text)).toEqual(expect.arrayContaining(['Hello Tess Tech,', '  Repeat dial 1900.', '  Exclude reading #4.[2J']));
    expect(mail.text).toContain('returned job J-2025-0001 (Test Works TG-1) for rework');
    expect(mail.text).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/);
  });

  test('buffers and numbers pass through', () => {
    const pdf = Buffer.from('%PDF-1.7');
    const safe = printableMailInput({ pdf, revision: 2, name: 'a\tb' });
    expect(safe.pdf).toBe(pdf);
    expect(safe.revision).toBe(2);
    expect(safe.name).toBe('a b');
  });
});

// Where a reply goes, said truthfully whatever the settings: the lab's address (sent as Reply-To), or the sender.
describe('mail sign-off', () => {
  test("names the lab's contact address when there is one", () => {
    expect(mailSignOff({ name: 'Fenwick Lab', email: 'desk@fenwick.test' }, 'no-reply@fenwick.test')).toBe(
      '\n\n-- \nSent by Kilocycle for Fenwick Lab. Replies to this message go to Fenwick Lab at desk@fenwick.test.',
    );
  });
  test('says a no-reply sender is not read, and names any other sender as where replies go', () => {
    expect(mailSignOff({ name: 'Fenwick Lab', email: null }, 'noreply@fenwick.test')).toContain(
      'from an address that is not read: to answer, contact Fenwick Lab directly.',
    );
    expect(mailSignOff({ name: 'Fenwick Lab', email: null }, 'office@fenwick.test')).toContain('Replies to this message go to office@fenwick.test.');
  });
  test('the HTML part sets the signature apart and keeps line breaks', () => {
    const html = mailTextToHtml('Hello,\n\nLine one\nline two\n\n-- \nSent by Kilocycle.');
    expect(html).toContain('<p style="margin:0 0 12px">Line one<br>\nline two</p>');
    expect(html).toMatch(/<hr[^>]*>\n<p[^>]*>Sent by Kilocycle\.<\/p>/);
  });
});
