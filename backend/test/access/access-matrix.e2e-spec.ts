// Before the app loads: uploads and stored PDFs go to a private var directory.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { REPO_ROOT } from '../../src/config/app-config.js';
process.env.KC_DB_PASSWORD ??= readFileSync(join(REPO_ROOT, 'var', 'db-password'), 'utf8').trim();
const varDir = mkdtempSync(join(tmpdir(), 'kc-access-'));
process.env.KC_VAR_DIR = varDir;

import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import type { Role } from '@kilocycle/common/types';
import type { Response } from 'supertest';
import { MailService } from '../../src/mail/mail.service.js';
import { DEMO_CUSTOMERS } from '../../src/seed/demo-seed.js';
import { createTestApp, DEMO, signInDemo, tokenFor, type AsDemo, type DemoAccount, type TestApp } from '../support/test-app.js';

/*
 * The access matrix: every route of the OpenAPI document × every role × a Northgate and a Saltmarsh record.
 *
 * The table below is written from the product's rules (PRODUCT.md §2), not copied from the @Roles decorators
 * (they are what this suite tests):
 *   - technician receives instruments, opens jobs, captures readings, submits for review;
 *   - lead reviews, returns, signs and amends, owns procedures and reference standards;
 *   - engineer runs and compares drift studies, reads all lab data;
 *   - client sees only its own organisation's instruments, jobs (with their runs, readings and results,
 *     which is what a job's status page shows) and issued certificates;
 *   - admin: users, organisations, benches and their tokens, mail outbox, settings.
 * Where the rules are silent, the decision is written beside the entry.
 *
 * Expected answers: anonymous 401 (public routes excepted); a role outside the entry 403; a client asking
 * for another organisation's record 404; an allowed read 2xx, and every 2xx body a client receives holds
 * none of the other customer's names, serials, asset tags, job or certificate numbers, e-mails or ids.
 *
 * Writes never change the demo data here: a denied role sends the probe body (the guard answers before any
 * validation, so the body only has to reach it) and must get 403 with no row count changed in any table; an
 * allowed role sends the same probe body, which no DTO accepts (an unknown property), and must get 400 —
 * proof it passed the guard — again with no row changed. Writes without a body (token, delete) are called by
 * allowed roles on a record that does not exist (404). Sign-out and the recall run are the two writes that
 * are really performed, each on its own throwaway session or at the end.
 */

type Who = 'anonymous' | DemoAccount;
const WHO: readonly Who[] = ['anonymous', 'admin', 'lead', 'tech', 'engineer', 'northgate', 'saltmarsh'];
const ROLE_OF: Record<DemoAccount, Role> = { admin: 'admin', lead: 'lead', tech: 'technician', engineer: 'engineer', northgate: 'client', saltmarsh: 'client' };
type Customer = 'northgate' | 'saltmarsh';
const OTHER: Record<Customer, Customer> = { northgate: 'saltmarsh', saltmarsh: 'northgate' };

/** Records owned by a customer organisation (a client sees its own, and gets 404 for the other's). */
type Owned = 'instrument' | 'job' | 'run' | 'reading' | 'certificate' | 'attachment' | 'organization' | 'user' | 'quote' | 'invoice' | 'creditNote' | 'payment';
/** Lab records (no customer owns them) and plain values. */
type Lab = 'bench' | 'procedure' | 'standard' | 'comparison' | 'mail' | 'zero' | 'importId' | 'certificateNumber' | 'missing' | 'priceItem' | 'taxRate';
type Rule = {
  /** Who may call it: 'public' (no sign-in), or the roles. A client in the list is scoped to its organisation. */
  roles: 'public' | readonly Role[];
  /** What each path parameter names. */
  ids?: Record<string, Owned | Lab>;
  /** Write body: 'json' (probe body, 400 when allowed), 'multipart' (a form without its file), or 'none'. */
  body?: 'json' | 'multipart' | 'none';
  /** For 'none': the allowed call is really made (logout on a throwaway session, the recall run). */
  performed?: 'own-session' | 'at-end';
  /** A client may also be answered 403 with the reason its record is held (a certificate until its invoice is paid). */
  held?: true;
};

const ALL: readonly Role[] = ['admin', 'lead', 'technician', 'engineer', 'client'];
const LAB: readonly Role[] = ['admin', 'lead', 'technician', 'engineer'];
// Rules are silent on admin and lead at the front desk; in a small lab they receive instruments too.
const RECEIVE: readonly Role[] = ['admin', 'lead', 'technician'];
// Capture (typed, imported, excluded readings; opening and correcting runs) is open to all lab staff: the
// engineer captures drift studies, and the lead's own captures are what the no-self-signing rule reads.
const CAPTURE: readonly Role[] = LAB;
// Prices, quotes and invoices (issue 18): the admin and the lead.
const BILLING: readonly Role[] = ['admin', 'lead'];

export const ACCESS_MATRIX: Record<string, Rule> = {
  // Public: the health check, sign-in and the verification page.
  'GET /api/health': { roles: 'public' },
  'GET /api/health/live': { roles: 'public' },
  'GET /api/health/ready': { roles: 'public' },
  'POST /api/auth/login': { roles: 'public' },
  'GET /api/public/certificates/{number}': { roles: 'public', ids: { number: 'certificateNumber' } },
  'POST /api/public/certificates/{number}/check': { roles: 'public', ids: { number: 'certificateNumber' }, body: 'multipart' },
  'GET /api/public/certificate-key': { roles: 'public' },

  // The session itself.
  'GET /api/auth/me': { roles: ALL },
  'POST /api/auth/logout': { roles: ALL, body: 'none', performed: 'own-session' },

  // Instruments and jobs: read by everyone (clients their own), received by the front desk.
  'GET /api/instruments': { roles: ALL },
  'GET /api/instruments/{id}': { roles: ALL, ids: { id: 'instrument' } },
  'POST /api/instruments': { roles: RECEIVE },
  'PATCH /api/instruments/{id}': { roles: RECEIVE, ids: { id: 'instrument' } },
  'GET /api/instruments/{id}/band-plan': { roles: ALL, ids: { id: 'instrument' } },
  // Supply sensitivity is an engineering study of the lab's, not part of what a client is shown.
  'GET /api/instruments/{id}/sensitivity': { roles: LAB, ids: { id: 'instrument' } },
  'GET /api/jobs': { roles: ALL },
  'GET /api/jobs/{id}': { roles: ALL, ids: { id: 'job' } },
  'POST /api/jobs': { roles: RECEIVE },
  'PATCH /api/jobs/{id}': { roles: RECEIVE, ids: { id: 'job' } },
  'GET /api/jobs/{id}/results': { roles: ALL, ids: { id: 'job' } },
  'GET /api/jobs/{id}/results.csv': { roles: ALL, ids: { id: 'job' } },

  // Photos and documents: shown with the instrument or job; removal is the lead's or admin's (rules silent).
  'POST /api/instruments/{id}/attachments': { roles: RECEIVE, ids: { id: 'instrument' }, body: 'multipart' },
  'POST /api/jobs/{id}/attachments': { roles: RECEIVE, ids: { id: 'job' }, body: 'multipart' },
  'GET /api/instruments/{id}/attachments': { roles: ALL, ids: { id: 'instrument' } },
  'GET /api/jobs/{id}/attachments': { roles: ALL, ids: { id: 'job' } },
  'GET /api/attachments/{id}': { roles: ALL, ids: { id: 'attachment' } },
  'DELETE /api/attachments/{id}': { roles: ['admin', 'lead'], ids: { id: 'missing' }, body: 'none' },

  // Runs and readings: the job's data, captured by lab staff.
  'GET /api/runs': { roles: ALL },
  'GET /api/runs/{id}': { roles: ALL, ids: { id: 'run' } },
  'PATCH /api/runs/{id}': { roles: CAPTURE, ids: { id: 'run' } },
  'GET /api/runs/{id}/analysis': { roles: ALL, ids: { id: 'run' } },
  'GET /api/runs/{id}/readings.csv': { roles: ALL, ids: { id: 'run' } },
  'GET /api/jobs/{jobId}/runs': { roles: ALL, ids: { jobId: 'job' } },
  'POST /api/jobs/{jobId}/runs': { roles: CAPTURE, ids: { jobId: 'job' } },
  'GET /api/runs/{runId}/readings': { roles: ALL, ids: { runId: 'run' } },
  'POST /api/runs/{runId}/readings': { roles: CAPTURE, ids: { runId: 'run' } },
  'POST /api/runs/{runId}/readings/{readingId}/exclusion': { roles: CAPTURE, ids: { runId: 'run', readingId: 'reading' } },
  // Counter-assisted capture: the bench's work, lab staff only (a client sees stored readings, not the bench at work).
  'GET /api/runs/{runId}/capture': { roles: CAPTURE, ids: { runId: 'run' } },
  'POST /api/runs/{runId}/capture': { roles: CAPTURE, ids: { runId: 'run' } },
  'DELETE /api/runs/{runId}/capture': { roles: CAPTURE, ids: { runId: 'missing' }, body: 'none' },
  'POST /api/runs/{id}/imports': { roles: CAPTURE, ids: { id: 'run' }, body: 'multipart' },
  'GET /api/imports/{importId}/progress': { roles: CAPTURE, ids: { importId: 'importId' } },

  // Procedures, budgets and review: lab data. The lead owns procedures; rules are silent on the admin
  // (the admin keeps the lab's settings, and may set up procedures for the lead).
  'GET /api/procedures': { roles: LAB },
  'GET /api/procedures/{id}': { roles: LAB, ids: { id: 'procedure' } },
  'POST /api/procedures': { roles: ['lead', 'admin'] },
  'PATCH /api/procedures/{id}': { roles: ['lead', 'admin'], ids: { id: 'procedure' } },
  'GET /api/jobs/{id}/procedure': { roles: LAB, ids: { id: 'job' } },
  // Choosing the procedure for a job and editing a run's budget before sign-off: the lead and the technician.
  'PUT /api/jobs/{id}/procedure': { roles: ['lead', 'technician'], ids: { id: 'job' } },
  'GET /api/runs/{id}/budget': { roles: LAB, ids: { id: 'run' } },
  'PUT /api/runs/{id}/budget': { roles: ['lead', 'technician'], ids: { id: 'run' } },
  'GET /api/reviews/{jobId}': { roles: LAB, ids: { jobId: 'job' } },
  'POST /api/jobs/{id}/submit': { roles: RECEIVE, ids: { id: 'job' } },
  'POST /api/jobs/{id}/return': { roles: ['lead'], ids: { id: 'job' } },
  'POST /api/jobs/{id}/sign': { roles: ['lead'], ids: { id: 'job' } },

  // Certificates: clients read their own issued ones; only the signatory amends or withdraws.
  'GET /api/certificates': { roles: ALL },
  'GET /api/certificates/{id}': { roles: ALL, ids: { id: 'certificate' } },
  // The demo's Northgate certificate waits for its invoice (pay before release): its client is told why.
  'GET /api/certificates/{id}/pdf': { roles: ALL, ids: { id: 'certificate' }, held: true },
  'POST /api/certificates/{id}/amend': { roles: ['lead'], ids: { id: 'certificate' } },
  'POST /api/certificates/{id}/withdraw': { roles: ['lead'], ids: { id: 'certificate' } },
  // Settings belong to the admin; the lead reads them (they are printed on the certificates he signs).
  'GET /api/settings': { roles: ['admin', 'lead'] },
  'PATCH /api/settings': { roles: ['admin'] },

  // Reference standards: the lead's; the admin keeps the lab's equipment register with him (rules silent).
  'GET /api/standards': { roles: LAB },
  'GET /api/standards/{id}': { roles: LAB, ids: { id: 'standard' } },
  'POST /api/standards': { roles: ['admin', 'lead'] },
  'PATCH /api/standards/{id}': { roles: ['admin', 'lead'], ids: { id: 'standard' } },

  // Comparisons: computed and read by lab staff, saved by those who run the studies.
  'POST /api/comparisons/compute': { roles: LAB },
  'GET /api/comparisons': { roles: LAB },
  'POST /api/comparisons': { roles: ['lead', 'engineer'] },
  'GET /api/comparisons/{id}': { roles: LAB, ids: { id: 'comparison' } },
  'GET /api/comparisons/{id}/result': { roles: LAB, ids: { id: 'comparison' } },
  'GET /api/comparisons/{id}/export.csv': { roles: LAB, ids: { id: 'comparison' } },
  'PATCH /api/comparisons/{id}': { roles: ['lead', 'engineer'], ids: { id: 'comparison' } },
  'DELETE /api/comparisons/{id}': { roles: ['lead', 'engineer'], ids: { id: 'missing' }, body: 'none' },

  // Benches and their tokens, the outbox, users and organisations: the admin's. Lab staff read benches
  // (they pick one for a run); everyone reads users and organisations, a client only its own.
  'GET /api/benches': { roles: LAB },
  'GET /api/benches/{id}': { roles: LAB, ids: { id: 'bench' } },
  'POST /api/benches': { roles: ['admin'] },
  'PATCH /api/benches/{id}': { roles: ['admin'], ids: { id: 'bench' } },
  'POST /api/benches/{id}/token': { roles: ['admin'], ids: { id: 'missing' }, body: 'none' },
  'DELETE /api/benches/{id}/token': { roles: ['admin'], ids: { id: 'missing' }, body: 'none' },
  'GET /api/mail': { roles: ['admin'] },
  'GET /api/mail/{id}': { roles: ['admin'], ids: { id: 'mail' } },
  'GET /api/mail/{id}/raw': { roles: ['admin'], ids: { id: 'mail' } },
  'GET /api/mail/{id}/attachments/{index}': { roles: ['admin'], ids: { id: 'mail', index: 'zero' } },
  'GET /api/users': { roles: ALL },
  'GET /api/users/{id}': { roles: ALL, ids: { id: 'user' } },
  'POST /api/users': { roles: ['admin'] },
  'PATCH /api/users/{id}': { roles: ['admin'], ids: { id: 'user' } },
  'GET /api/organizations': { roles: ALL },
  'GET /api/organizations/{id}': { roles: ALL, ids: { id: 'organization' } },
  'POST /api/organizations': { roles: ['admin'] },
  'PATCH /api/organizations/{id}': { roles: ['admin'], ids: { id: 'organization' } },

  // Lab records: the audit log is the lab's; recall notices the admin's and lead's, the run the admin's.
  'GET /api/audit': { roles: LAB },
  'GET /api/recall/notices': { roles: ['admin', 'lead'] },
  'POST /api/recall/run': { roles: ['admin'], body: 'none', performed: 'at-end' },

  // Prices, tax rates and customer terms (issue 18): admin and lead set them; technicians and engineers see
  // prices but do not change them; a client reads its own organisation's terms (its tax and payment terms).
  'GET /api/prices/items': { roles: LAB },
  'POST /api/prices/items': { roles: BILLING },
  'PATCH /api/prices/items/{id}': { roles: BILLING, ids: { id: 'priceItem' } },
  'GET /api/prices/tax-rates': { roles: LAB },
  'POST /api/prices/tax-rates': { roles: BILLING },
  'PATCH /api/prices/tax-rates/{id}': { roles: BILLING, ids: { id: 'taxRate' } },
  'GET /api/prices/customer-terms': { roles: LAB },
  'GET /api/prices/customer-terms/{organizationId}': { roles: ALL, ids: { organizationId: 'organization' } },
  'PUT /api/prices/customer-terms/{organizationId}': { roles: BILLING, ids: { organizationId: 'organization' } },

  // Quotes: admin and lead make, change and send them; the lab reads them all, a client its own organisation's once
  // sent. The client accepts or declines in the portal; admin and lead record a decision given by phone or mail.
  // Deciding, sending and making a quote take no probe body: they are called on a quote or job that does not exist.
  'GET /api/quotes': { roles: ALL },
  'GET /api/quotes/{id}': { roles: ALL, ids: { id: 'quote' } },
  'GET /api/quotes/{id}/pdf': { roles: ALL, ids: { id: 'quote' } },
  'PATCH /api/quotes/{id}': { roles: BILLING, ids: { id: 'quote' } },
  'POST /api/quotes/{id}/send': { roles: BILLING, ids: { id: 'missing' }, body: 'none' },
  'POST /api/quotes/{id}/accept': { roles: [...BILLING, 'client'], ids: { id: 'missing' }, body: 'none' },
  'POST /api/quotes/{id}/decline': { roles: [...BILLING, 'client'], ids: { id: 'missing' }, body: 'none' },
  'POST /api/jobs/{id}/quote': { roles: BILLING, ids: { id: 'missing' }, body: 'none' },

  // Billing (issue 18): admin and lead make, issue and credit invoices; the rest of the lab reads them; a client
  // reads its own organisation's issued invoices, credit notes and statement. The bookkeeper's export and the
  // overdue reminder run are billing work (admin, lead).
  'GET /api/invoices': { roles: ALL },
  'GET /api/invoices/export.csv': { roles: ['admin', 'lead'] },
  'POST /api/invoices/overdue-reminders/run': { roles: ['admin', 'lead'], body: 'none', performed: 'at-end' },
  'GET /api/invoices/{id}': { roles: ALL, ids: { id: 'invoice' } },
  'GET /api/invoices/{id}/pdf': { roles: ALL, ids: { id: 'invoice' } },
  'PATCH /api/invoices/{id}': { roles: ['admin', 'lead'], ids: { id: 'invoice' } },
  'POST /api/invoices/{id}/issue': { roles: ['admin', 'lead'], ids: { id: 'missing' }, body: 'none' },
  'POST /api/invoices/{id}/credit-notes': { roles: ['admin', 'lead'], ids: { id: 'invoice' } },
  'GET /api/credit-notes/{id}/pdf': { roles: ALL, ids: { id: 'creditNote' } },
  'POST /api/jobs/{id}/invoice': { roles: ['admin', 'lead'], ids: { id: 'missing' }, body: 'none' },
  'GET /api/organizations/{id}/statement': { roles: ALL, ids: { id: 'organization' } },
  // Card payments: a client pays its own organisation's invoices (admin and lead may start one on a customer's
  // behalf, say on the phone); refunds are billing work. The payment service's webhook has no session: its
  // signature is its authentication, so without one (the probe) it answers 400.
  'POST /api/invoices/{id}/pay': { roles: ['admin', 'lead', 'client'], ids: { id: 'missing' }, body: 'none' },
  'GET /api/payments': { roles: ALL },
  'GET /api/payments/{id}': { roles: ALL, ids: { id: 'payment' } },
  'POST /api/payments/{id}/refund': { roles: ['admin', 'lead'], ids: { id: 'payment' } },
  'POST /api/payments/webhook': { roles: 'public' },
};

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(200, 7)]);
const PROBE = { accessMatrixProbe: true };

type Records = Record<Owned, number | undefined>;
type Facts = {
  owned: Record<Customer, Records>;
  lab: Record<Exclude<Lab, 'missing' | 'zero' | 'importId'>, number | string | undefined>;
  /** What a client of the other organisation must never be shown. */
  needles: Record<Customer, string[]>;
  organizationId: Record<Customer, number>;
};

describe('access matrix (e2e, MariaDB): every route × every role × own/other organisation', () => {
  let t: TestApp;
  let as: AsDemo;
  let facts: Facts;
  let routes: string[];

  const one = async (sql: string, params: unknown[] = []): Promise<number | undefined> => {
    const rows = (await t.dataSource.query(sql, params)) as Array<{ id: number | string }>;
    return rows.length ? Number(rows[0].id) : undefined;
  };

  async function recordsOf(org: number): Promise<Records> {
    // A run with readings, so analysis, exports and exclusion have something to read.
    const run = await one(
      'SELECT r.id FROM runs r JOIN jobs j ON j.id = r.job_id WHERE j.organization_id = ? AND EXISTS (SELECT 1 FROM readings x WHERE x.run_id = r.id) ORDER BY r.id LIMIT 1',
      [org],
    );
    return {
      organization: org,
      instrument: await one('SELECT id FROM instruments WHERE organization_id = ? ORDER BY id LIMIT 1', [org]),
      job: await one('SELECT id FROM jobs WHERE organization_id = ? ORDER BY id LIMIT 1', [org]),
      run,
      reading: run === undefined ? undefined : await one('SELECT id FROM readings WHERE run_id = ? ORDER BY id LIMIT 1', [run]),
      certificate: await one("SELECT id FROM certificates WHERE organization_id = ? AND status = 'issued' ORDER BY id LIMIT 1", [org]),
      attachment: await one(
        'SELECT a.id FROM attachments a LEFT JOIN instruments i ON i.id = a.instrument_id LEFT JOIN jobs j ON j.id = a.job_id WHERE COALESCE(i.organization_id, j.organization_id) = ? ORDER BY a.id LIMIT 1',
        [org],
      ),
      user: await one("SELECT id FROM users WHERE organization_id = ? AND role = 'client' ORDER BY id LIMIT 1", [org]),
      // A quote the client may see (drafts are the lab's own).
      quote: await one("SELECT id FROM quotes WHERE organization_id = ? AND status <> 'draft' ORDER BY id LIMIT 1", [org]),
      invoice: await one("SELECT id FROM invoices WHERE organization_id = ? AND status <> 'draft' ORDER BY id LIMIT 1", [org]),
      creditNote: await one('SELECT id FROM credit_notes WHERE organization_id = ? ORDER BY id LIMIT 1', [org]),
      payment: await one('SELECT id FROM payments WHERE organization_id = ? ORDER BY id LIMIT 1', [org]),
    };
  }

  async function needlesOf(org: number): Promise<string[]> {
    const texts = async (sql: string): Promise<string[]> =>
      ((await t.dataSource.query(sql, [org])) as Array<{ v: string | null }>).map((row) => row.v).filter((v): v is string => !!v && v.length >= 4);
    return [
      ...(await texts('SELECT name AS v FROM organizations WHERE id = ?')),
      ...(await texts('SELECT serial AS v FROM instruments WHERE organization_id = ?')),
      ...(await texts('SELECT asset_tag AS v FROM instruments WHERE organization_id = ?')),
      ...(await texts('SELECT number AS v FROM jobs WHERE organization_id = ?')),
      ...(await texts('SELECT number AS v FROM certificates WHERE organization_id = ?')),
      ...(await texts('SELECT email AS v FROM users WHERE organization_id = ?')),
      ...(await texts('SELECT number AS v FROM quotes WHERE organization_id = ?')),
      ...(await texts('SELECT number AS v FROM invoices WHERE organization_id = ? AND number IS NOT NULL')),
      ...(await texts('SELECT number AS v FROM credit_notes WHERE organization_id = ?')),
      ...(await texts(
        'SELECT a.original_name AS v FROM attachments a LEFT JOIN instruments i ON i.id = a.instrument_id LEFT JOIN jobs j ON j.id = a.job_id WHERE COALESCE(i.organization_id, j.organization_id) = ?',
      )),
    ];
  }

  let tables: string[] = [];
  async function rowCounts(): Promise<Record<string, number>> {
    const sql = tables.map((name) => `SELECT '${name}' AS t, COUNT(*) AS n FROM \`${name}\``).join(' UNION ALL ');
    const rows = (await t.dataSource.query(sql)) as Array<{ t: string; n: number | string }>;
    return Object.fromEntries(rows.map((row) => [row.t, Number(row.n)]));
  }

  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    const document = SwaggerModule.createDocument(t.app, new DocumentBuilder().build());
    routes = Object.entries(document.paths).flatMap(([path, item]) =>
      Object.keys(item)
        .filter((method) => ['get', 'post', 'put', 'patch', 'delete'].includes(method))
        .map((method) => `${method.toUpperCase()} ${path}`),
    );
    const orgId = async (name: string) => (await one('SELECT id FROM organizations WHERE name = ?', [name]))!;
    const organizationId = { northgate: await orgId(DEMO_CUSTOMERS.northgate), saltmarsh: await orgId(DEMO_CUSTOMERS.saltmarsh) };

    // One attachment each side, uploaded as a technician would: a Northgate instrument photo, a Saltmarsh job document.
    const northgateInstrument = await one('SELECT id FROM instruments WHERE organization_id = ? ORDER BY id LIMIT 1', [organizationId.northgate]);
    const saltmarshJob = await one('SELECT id FROM jobs WHERE organization_id = ? ORDER BY id LIMIT 1', [organizationId.saltmarsh]);
    for (const [path, filename] of [
      [`/api/instruments/${northgateInstrument}/attachments`, 'northgate-front-panel.png'],
      [`/api/jobs/${saltmarshJob}/attachments`, 'saltmarsh-job-sheet.png'],
    ]) {
      const res = await t.http.post(path).set(as('tech')).attach('file', PNG, { filename, contentType: 'image/png' });
      expect(res.status).toBe(201);
    }

    // One message in the outbox, through the app's own mail catcher, for the outbox routes.
    await t.app.get(MailService).mailer.send({
      kind: 'other',
      to: ['someone@example.test'],
      subject: 'Access matrix',
      text: 'A message for the outbox routes.\n',
      attachments: [{ filename: 'note.pdf', content: Buffer.from('%PDF-1.4\n%%EOF\n'), contentType: 'application/pdf' }],
    });

    // One card payment started on each side, as each client would by pressing Pay on an open invoice.
    for (const who of ['northgate', 'saltmarsh'] as const) {
      const open = await one("SELECT id FROM invoices WHERE organization_id = ? AND status IN ('issued', 'part_paid') ORDER BY id LIMIT 1", [
        organizationId[who],
      ]);
      const res = await t.http.post(`/api/invoices/${open}/pay`).set(as(who));
      expect(res.status).toBe(201);
    }

    facts = {
      organizationId,
      owned: { northgate: await recordsOf(organizationId.northgate), saltmarsh: await recordsOf(organizationId.saltmarsh) },
      lab: {
        bench: await one('SELECT id FROM benches ORDER BY id LIMIT 1'),
        procedure: await one('SELECT id FROM procedures ORDER BY id LIMIT 1'),
        standard: await one('SELECT id FROM standards ORDER BY id LIMIT 1'),
        comparison: await one('SELECT id FROM comparisons ORDER BY id LIMIT 1'),
        priceItem: await one('SELECT id FROM price_items ORDER BY id LIMIT 1'),
        taxRate: await one('SELECT id FROM tax_rates ORDER BY id LIMIT 1'),
        mail: await one('SELECT id FROM mail_messages WHERE attachment_count > 0 ORDER BY id LIMIT 1'),
        certificateNumber: (
          (await t.dataSource.query("SELECT number FROM certificates WHERE status = 'issued' ORDER BY id LIMIT 1")) as Array<{ number: string }>
        )[0]?.number,
      },
      needles: { northgate: await needlesOf(organizationId.northgate), saltmarsh: await needlesOf(organizationId.saltmarsh) },
    };
    tables = (
      (await t.dataSource.query('SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = ?', [
        'BASE TABLE',
      ])) as Array<{ name: string }>
    )
      .map((row) => row.name)
      .filter((name) => name !== 'kc_migrations');
  });

  afterAll(async () => {
    await t?.close();
    rmSync(varDir, { recursive: true, force: true });
  });

  it('the demo holds a record of each kind on both sides, so every cell below is really exercised', () => {
    for (const customer of ['northgate', 'saltmarsh'] as const) {
      for (const [kind, id] of Object.entries(facts.owned[customer])) {
        // The demo issues a certificate to Northgate only; Saltmarsh's client is the one who asks for it.
        if (kind === 'certificate' && customer === 'saltmarsh') continue;
        expect(`${customer} ${kind} ${id ?? 'missing'}`).not.toMatch(/missing$/);
      }
      // At least the name, a serial, a job number, an e-mail and an attachment's file name.
      expect(facts.needles[customer].length).toBeGreaterThanOrEqual(5);
    }
    for (const [kind, id] of Object.entries(facts.lab)) expect(`${kind} ${id ?? 'missing'}`).not.toMatch(/missing$/);
  });

  it('every route of the OpenAPI document has an entry in the access matrix, and every entry a route', () => {
    const missing = routes.filter((route) => !(route in ACCESS_MATRIX)).map((route) => `route ${route} has no entry in the access matrix`);
    const stale = Object.keys(ACCESS_MATRIX)
      .filter((route) => !routes.includes(route))
      .map((route) => `matrix entry ${route} matches no route`);
    expect([...missing, ...stale]).toEqual([]);
  });

  /** The path with its parameters filled from one organisation's records (lab records are shared). */
  function pathFor(path: string, rule: Rule, side: Customer): string | undefined {
    let unresolved = false;
    const filled = path.replace(/\{(\w+)\}/g, (_all, name: string) => {
      const kind = rule.ids?.[name];
      let value: number | string | undefined;
      if (kind === 'missing') value = 999999;
      else if (kind === 'zero') value = 0;
      else if (kind === 'importId') value = 'no-such-import';
      else if (kind && kind in facts.owned[side]) value = facts.owned[side][kind as Owned];
      else if (kind) value = facts.lab[kind as keyof Facts['lab']];
      if (value === undefined) unresolved = true;
      return encodeURIComponent(String(value));
    });
    return unresolved ? undefined : filled;
  }

  const ownsIds = (rule: Rule) =>
    Object.values(rule.ids ?? {}).some((kind) =>
      ['instrument', 'job', 'run', 'reading', 'certificate', 'attachment', 'organization', 'user', 'quote', 'invoice', 'creditNote', 'payment'].includes(kind),
    );

  async function send(method: string, path: string, rule: Rule, headers: Record<string, string>): Promise<Response> {
    const req = (t.http as unknown as Record<string, (url: string) => import('supertest').Test>)[method.toLowerCase()](path).set(headers);
    if (method === 'GET' || rule.body === 'none') return req;
    if (rule.body === 'multipart') return req.field('accessMatrixProbe', '1');
    return req.send(PROBE);
  }

  /** Every other-organisation name, number, serial or e-mail, and any organizationId of the other side. */
  function foreignData(res: Response, customer: Customer): string[] {
    const text = typeof res.text === 'string' ? res.text : '';
    const found = facts.needles[OTHER[customer]].filter((needle) => text.includes(needle));
    const otherId = facts.organizationId[OTHER[customer]];
    const walk = (value: unknown): void => {
      if (Array.isArray(value)) value.forEach(walk);
      else if (value && typeof value === 'object') {
        for (const [key, inner] of Object.entries(value)) {
          if (/organizationId$/i.test(key) && inner === otherId) found.push(`${key}=${otherId}`);
          walk(inner);
        }
      }
    };
    walk(res.body);
    return found;
  }

  const namesMissing = (rule: Rule) => Object.values(rule.ids ?? {}).some((kind) => kind === 'missing' || kind === 'importId');
  const isGuardRefusal = (status: number, body: { message?: unknown }) => status === 403 && String(body.message).startsWith('This needs one of the roles');

  // Ids travel in queries too: a client filtering a list by the other side's organisation, instrument,
  // job or run gets a refusal of the filter (400), an empty page or its own records — never theirs.
  it("a client filtering any list by the other organisation's ids is shown none of its records", async () => {
    const problems: string[] = [];
    const lists = Object.entries(ACCESS_MATRIX).filter(
      ([route, rule]) => route.startsWith('GET ') && rule.roles !== 'public' && rule.roles.includes('client') && !rule.ids,
    );
    expect(lists.length).toBeGreaterThanOrEqual(6);
    for (const customer of ['northgate', 'saltmarsh'] as const) {
      const other = facts.owned[OTHER[customer]];
      const filters = {
        organizationId: other.organization,
        customerId: other.organization,
        instrumentId: other.instrument,
        jobId: other.job,
        runId: other.run,
      };
      for (const [route] of lists) {
        for (const [name, value] of Object.entries(filters)) {
          const path = `${route.slice(4)}?${name}=${value}`;
          const res = await t.http.get(path).set(as(customer));
          if (res.status !== 400 && (res.status < 200 || res.status > 299)) problems.push(`${customer} GET ${path}: expected 2xx or 400, got ${res.status}`);
          if (res.status >= 200 && res.status <= 299) {
            const leaked = foreignData(res, customer);
            if (leaked.length) problems.push(`${customer} GET ${path}: 2xx body holds the other organisation's ${leaked.join(', ')}`);
          }
        }
      }
    }
    expect(problems).toEqual([]);
  });

  const atEnd: Array<() => Promise<void>> = [];

  describe.each(Object.keys(ACCESS_MATRIX))('%s', (route) => {
    it('answers every role as the rules say', async () => {
      const rule = ACCESS_MATRIX[route];
      const [method, template] = route.split(' ') as [string, string];
      const problems: string[] = [];
      const isWrite = method !== 'GET';

      for (const who of WHO) {
        const role = who === 'anonymous' ? undefined : ROLE_OF[who];
        const allowed = rule.roles === 'public' || (role !== undefined && rule.roles.includes(role));
        const isClient = who === 'northgate' || who === 'saltmarsh';
        // Lab staff and the anonymous visitor try both customers' records; a client its own, then the other's.
        const sides: Customer[] = ownsIds(rule) ? (isClient ? [who, OTHER[who]] : ['northgate', 'saltmarsh']) : [isClient ? who : 'northgate'];
        for (const side of sides) {
          const path = pathFor(template, rule, side);
          if (path === undefined) continue; // no such record on that side in the demo (a Saltmarsh certificate)
          const label = `${who} ${method} ${path}`;

          let expected: string;
          let ok: (status: number, body: { message?: unknown }) => boolean;
          if (who === 'anonymous' && rule.roles !== 'public') [expected, ok] = ['401', (s) => s === 401];
          else if (!allowed) [expected, ok] = ['403', (s) => s === 403];
          else if (isClient && ownsIds(rule) && side !== who) [expected, ok] = ['404', (s) => s === 404];
          else if (rule.performed) {
            if (rule.performed === 'at-end') {
              atEnd.push(async () => {
                const res = await send(method, path, rule, as(who as DemoAccount));
                if (res.status < 200 || res.status > 299) problems.push(`${label}: expected 2xx, got ${res.status}`);
              });
              continue;
            }
            // Sign-out ends the session it is called with: use a throwaway one.
            const token = await tokenFor(t.http, DEMO[who as DemoAccount]);
            const res = await send(method, path, rule, { Authorization: `Bearer ${token}` });
            if (res.status !== 204) problems.push(`${label}: expected 204, got ${res.status}`);
            const after = await t.http.get('/api/auth/me').set({ Authorization: `Bearer ${token}` });
            if (after.status !== 401) problems.push(`${label}: the ended session still answers ${after.status}`);
            continue;
          } else if (namesMissing(rule) || rule.body === 'none') [expected, ok] = ['404 (no such record)', (s) => s === 404];
          else if (!isWrite && isClient && rule.held)
            [expected, ok] = [
              '2xx, or 403 saying why it is held',
              (s, body) => (s >= 200 && s <= 299) || (s === 403 && /^Held until/.test(String(body.message))),
            ];
          else if (!isWrite) [expected, ok] = ['2xx', (s) => s >= 200 && s <= 299];
          // A form is read by the handler, after the service's own checks (run closed, an engineer on a
          // calibration run): any refusal but the guard's shows the call got past it.
          else if (rule.body === 'multipart')
            [expected, ok] = ['a 4xx past the guard', (s, body) => s >= 400 && s < 500 && s !== 401 && !isGuardRefusal(s, body)];
          else [expected, ok] = ['400 (probe body refused after the guard)', (s) => s === 400];

          const headers = who === 'anonymous' ? {} : as(who);
          const before = isWrite ? await rowCounts() : undefined;
          const res = await send(method, path, rule, headers);
          if (!ok(res.status, res.body ?? {})) problems.push(`${label}: expected ${expected}, got ${res.status} ${JSON.stringify(res.body?.message ?? '')}`);
          if (before) {
            const after = await rowCounts();
            const changed = Object.keys(after).filter((name) => after[name] !== before[name]);
            if (changed.length) problems.push(`${label}: rows changed in ${changed.join(', ')}`);
          }
          // Public routes answer anyone who holds the certificate number alike: the scan is for signed-in routes.
          if (isClient && rule.roles !== 'public' && res.status >= 200 && res.status <= 299) {
            const leaked = foreignData(res, who);
            if (leaked.length) problems.push(`${label}: 2xx body holds the other organisation's ${leaked.join(', ')}`);
          }
        }
      }
      for (const call of atEnd.splice(0)) await call();
      // Signing out may end every session of that account (a token version): sign everyone in afresh.
      if (rule.performed === 'own-session') as = await signInDemo(t.http);
      expect(problems).toEqual([]);
    });
  });
});
