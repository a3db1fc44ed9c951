import { createServer, type Server } from 'node:net';
import type { MailMessageView } from '@kilocycle/common/types';
import { jobReturnedMail } from '../../src/mail/mail-templates.js';
import { Mailer } from '../../src/mail/mailer.js';
import { parseMessage } from '../../src/mail/read-message.js';
import { MailService } from '../../src/mail/mail.service.js';
import { createTestApp, DEMO, tokenFor, type TestApp } from '../support/test-app.js';

describe('mail: the local SMTP fake and the outbox (e2e, MariaDB)', () => {
  let t: TestApp;
  let admin: { Authorization: string };
  beforeAll(async () => {
    t = await createTestApp();
    admin = { Authorization: `Bearer ${await tokenFor(t.http, DEMO.admin)}` };
  });
  afterAll(async () => {
    await t.close();
  });

  it('should capture what the app sends over SMTP, with subject, text and attachment readable', async () => {
    const mail = t.app.get(MailService);
    expect(mail.mailer.usesFake).toBe(true);
    const attachment = Buffer.from('%PDF-1.7 not really a pdf \u00e9', 'utf8');
    await mail.mailer.send({
      kind: 'other',
      to: ['someone@example.test', 'other@example.test'],
      subject: 'Prüfung 7 001.250 kHz — ±0.5 %',
      text: 'Zeile eins\nline two: Ω and µs\n',
      attachments: [{ filename: 'Zertifikat Nr 1.pdf', content: attachment, contentType: 'application/pdf' }],
    });
    const list = await t.http.get('/api/mail?q=Pr%C3%BCfung').set(admin);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(1);
    const item = list.body.items[0];
    expect(item).toMatchObject({
      kind: 'other',
      to: ['someone@example.test', 'other@example.test'],
      subject: 'Prüfung 7 001.250 kHz — ±0.5 %',
      attachmentCount: 1,
    });
    const view: MailMessageView = (await t.http.get(`/api/mail/${item.id}`).set(admin)).body;
    expect(view.text).toContain('line two: Ω and µs');
    expect(view.attachments).toEqual([{ filename: 'Zertifikat Nr 1.pdf', contentType: 'application/pdf', size: attachment.length }]);
    const file = await t.http.get(`/api/mail/${item.id}/attachments/0`).set(admin).buffer(true);
    expect(Buffer.compare(Buffer.from(file.body as Buffer), attachment)).toBe(0);
    const raw = await t.http.get(`/api/mail/${item.id}/raw`).set(admin);
    expect(raw.headers['content-type']).toContain('message/rfc822');
    expect((await t.http.get(`/api/mail/${item.id}/attachments/5`).set(admin)).status).toBe(404);
  });

  it('should keep the outbox to the admin', async () => {
    for (const who of ['lead', 'northgate'] as const) {
      const token = await tokenFor(t.http, DEMO[who]);
      expect((await t.http.get('/api/mail').set({ Authorization: `Bearer ${token}` })).status).toBe(403);
    }
    expect((await t.http.get('/api/mail')).status).toBe(401);
  });

  it('should fall back to a free port when the configured one is taken', async () => {
    const blocker: Server = createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
    const taken = (blocker.address() as { port: number }).port;
    const warnings: string[] = [];
    const mailer = new Mailer(t.dataSource, { host: null, port: taken, secure: false, user: null, password: null, from: 'Test <t@example.test>' }, (m) =>
      warnings.push(m),
    );
    try {
      await mailer.start();
      expect(mailer.port).not.toBe(taken);
      expect(warnings[0]).toContain(`port ${taken} is in use`);
      await mailer.send({ kind: 'other', to: ['x@example.test'], subject: 'fallback works', text: 'ok' });
      const [row] = await t.dataSource.query("SELECT COUNT(*) AS n FROM mail_messages WHERE subject = 'fallback works'");
      expect(Number(row.n)).toBe(1);
    } finally {
      await mailer.stop();
      blocker.close();
    }
  });

  describe('where replies go, and the HTML part', () => {
    // The demo lab's organisation record carries its contact address; the sender is the configured From.
    const LAB = 'Quarry Lane Frequency Lab';
    const LAB_EMAIL = 'bench@quarrylane.test';
    // SMTP carries CRLF line ends; the footer is compared line by line.
    const lf = (text: string) => text.replace(/\r\n/g, '\n').trimEnd();
    const header = (view: MailMessageView, name: string) => view.headers.filter((h) => h.name.toLowerCase() === name.toLowerCase()).map((h) => h.value);
    const sendReturned = async (subjectTag: string) => {
      const mail = jobReturnedMail({
        to: 'tech@kilocycle.test',
        technician: 'Tess Tech',
        lead: 'Lee Lead',
        jobNumber: `J-2026-${subjectTag}`,
        instrument: 'Test Works TG-1',
        comment: 'Repeat dial 1900 <script>alert(1)</script> & see Pay now at http://pay.invalid/',
        jobUrl: 'http://127.0.0.1:5180/jobs/77',
      });
      await t.app.get(MailService).mailer.send(mail);
      const list = await t.http.get(`/api/mail?q=J-2026-${subjectTag}`).set(admin);
      expect(list.body.total).toBe(1);
      return (await t.http.get(`/api/mail/${list.body.items[0].id}`).set(admin)).body as MailMessageView;
    };

    it("should set Reply-To to the lab's contact address and say so in the footer, text and HTML alike", async () => {
      const view = await sendReturned('9101');
      expect(header(view, 'Reply-To')).toEqual([`${LAB} <${LAB_EMAIL}>`]);
      expect(view.from).toMatch(/no-reply@/);
      expect(lf(view.text!).endsWith(`-- \nSent by Kilocycle for ${LAB}. Replies to this message go to ${LAB} at ${LAB_EMAIL}.`)).toBe(true);
      expect(view.text).not.toMatch(/Replies reach the laboratory/);
      // The HTML part: present, every stored character escaped, only the template's own link a link.
      expect(view.html).toContain(`Replies to this message go to ${LAB} at ${LAB_EMAIL}.`);
      expect(view.html).toContain('Repeat dial 1900 &lt;script&gt;alert(1)&lt;/script&gt; &amp; see Pay now at http://pay.invalid/');
      expect(view.html).not.toMatch(/<script/i);
      expect(view.html).toContain('<a href="http://127.0.0.1:5180/jobs/77">http://127.0.0.1:5180/jobs/77</a>');
      expect(view.html).not.toContain('href="http://pay.invalid');
    });

    it('should set no Reply-To when the lab has no contact address, and then not promise that replies are read', async () => {
      await t.dataSource.query("UPDATE organizations SET contact_email = NULL WHERE kind = 'lab'");
      try {
        const view = await sendReturned('9102');
        expect(header(view, 'Reply-To')).toEqual([]);
        expect(lf(view.text!).endsWith(`-- \nSent by Kilocycle for ${LAB} from an address that is not read: to answer, contact ${LAB} directly.`)).toBe(true);
      } finally {
        await t.dataSource.query("UPDATE organizations SET contact_email = ? WHERE kind = 'lab'", [LAB_EMAIL]);
      }
    });
  });

  it('should read quoted-printable parts and encoded words', async () => {
    const raw = [
      'From: a@example.test',
      'Subject: =?UTF-8?Q?Kalibrierschein_f=C3=BCr?= =?UTF-8?B?IE7DpGNoc3Rl?=',
      'X-Kilocycle-Kind: recall_reminder',
      'Content-Type: text/plain; charset=utf-8',
      'Content-Transfer-Encoding: quoted-printable',
      '',
      'f=C3=BCnf =',
      'Zeilen',
    ].join('\r\n');
    const parsed = await parseMessage(raw);
    expect(parsed.subject).toBe('Kalibrierschein für Nächste');
    expect(parsed.kind).toBe('recall_reminder');
    expect(parsed.text).toBe('fünf Zeilen');
    expect(parsed.attachments).toEqual([]);
  });
});
