import type { Page } from 'playwright-core';
import type { Bench, CustomerTerms, Instrument, Job, ListResponse, Organization, Quote } from '@kilocycle/common/types';
import { BASE_URL } from './browser';

/** The signed-in page's session token, to set up or check data through the same API the page uses. */
export async function sessionToken(page: Page): Promise<string> {
  const raw = await page.evaluate(() => window.localStorage.getItem('kc.session'));
  if (!raw) throw new Error('no session in the page: sign in first');
  return (JSON.parse(raw) as { accessToken: string }).accessToken;
}

export async function apiRequest<T>(token: string, method: string, path: string, body?: unknown): Promise<T> {
  const response = await fetch(`${BASE_URL}/api${path}`, {
    method,
    headers: {
      ...(token ? { Authorization: `Bearer ${token}` } : {}),
      Accept: 'application/json',
      ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  if (!response.ok) throw new Error(`${method} ${path} answered ${response.status}: ${text}`);
  return (text ? JSON.parse(text) : undefined) as T;
}

export const apiGet = <T>(token: string, path: string) => apiRequest<T>(token, 'GET', path);

/** Signs in through the API (for set-up the test does as another person than the page's). */
export async function apiLogin(email: string, password: string): Promise<string> {
  const answer = await apiRequest<{ accessToken: string }>('', 'POST', '/auth/login', { email, password });
  return answer.accessToken;
}

type TestInstrument = { organizationId: number; make: string; model: string; serial: string; label?: string; tolerancePercent?: number };

/**
 * An invented instrument with one direct-reading 1750–2000 kHz range, for a test's own records (the browser tests
 * share the demo ones, so a test that writes readings or changes state works on its own).
 */
export function createTestInstrument(
  token: string,
  { organizationId, make, model, serial, label = 'A  1750–2000 kHz', tolerancePercent = 0.5 }: TestInstrument,
) {
  return apiRequest<Instrument>(token, 'POST', '/instruments', {
    organizationId,
    make,
    model,
    serial,
    ranges: [
      {
        label,
        dialUnit: 'kHz',
        dialLaw: { kind: 'direct', unit: 'kHz' },
        dialMin: 1750,
        dialMax: 2000,
        freqMinHz: 1_750_000,
        freqMaxHz: 2_000_000,
        tolerance: { kind: 'percent', percent: tolerancePercent },
        multipliers: [1],
      },
    ],
  });
}

/** A job for the instrument, received today, ready for work (see readyForWork). */
export async function openJob(token: string, instrumentId: number): Promise<Job> {
  const job = await apiRequest<Job>(token, 'POST', '/jobs', { instrumentId, receivedDate: new Date().toISOString().slice(0, 10) });
  await readyForWork(job.id);
  return job;
}

/**
 * When the job's customer requires an accepted quote before work starts (Northgate in the demo), the lead makes the
 * quote from the price list, sends it and records the customer's acceptance by phone, as a lab would.
 */
export async function readyForWork(jobId: number): Promise<void> {
  const lead = await apiLogin('lead@kilocycle.test', 'kilocycle-demo');
  const job = await apiGet<Job>(lead, `/jobs/${jobId}`);
  const org = await apiGet<Organization>(lead, `/organizations/${job.organizationId}`).catch(() => null);
  if (org?.kind !== 'customer') return; // the lab's own instruments are never quoted
  const terms = await apiGet<CustomerTerms>(lead, `/prices/customer-terms/${job.organizationId}`);
  if (!terms.requiresQuote) return;
  const quote = await apiRequest<Quote>(lead, 'POST', `/jobs/${job.id}/quote`);
  await apiRequest(lead, 'POST', `/quotes/${quote.id}/send`);
  await apiRequest(lead, 'POST', `/quotes/${quote.id}/accept`, { channel: 'phone', note: 'Accepted by phone (browser test set-up).' });
}

/**
 * A test's own instrument (for the demo's customer club, else the first organisation) with a job received
 * today, and the first active bench that has a default standard, with that standard's id.
 */
export async function ownJobAtBench(token: string, model: string, serial: string) {
  const orgs = await apiGet<ListResponse<Organization>>(token, '/organizations?pageSize=100');
  const customer = orgs.items.find((o) => o.name === 'Northgate Radio Club') ?? orgs.items[0]!;
  const instrument = await createTestInstrument(token, { organizationId: customer.id, make: 'Harwick Radio', model, serial });
  const job = await openJob(token, instrument.id);
  const benches = await apiGet<ListResponse<Bench>>(token, '/benches?active=true&sort=name&pageSize=200');
  const bench = benches.items.find((b) => b.defaultStandardId !== null)!;
  return { instrument, job, bench, standardId: bench.defaultStandardId! };
}

/**
 * Runs `journey` with the customer on account, then puts its terms back: Northgate pays before its certificates
 * are released (pay-certificate.e2e.test.ts walks that), and journeys about other things download them at once.
 */
export async function onAccountWhile<T>(organizationName: string, journey: () => Promise<T>): Promise<T> {
  const lead = await apiLogin('lead@kilocycle.test', 'kilocycle-demo');
  const orgs = await apiGet<ListResponse<Organization>>(lead, '/organizations?pageSize=100');
  const org = orgs.items.find((o) => o.name === organizationName)!;
  const terms = await apiGet<CustomerTerms>(lead, `/prices/customer-terms/${org.id}`);
  const body = (t: CustomerTerms) => ({
    taxRateId: t.taxRateId,
    taxRegistration: t.taxRegistration,
    paymentTerms: t.paymentTerms,
    netDays: t.netDays,
    requiresQuote: t.requiresQuote,
  });
  await apiRequest(lead, 'PUT', `/prices/customer-terms/${org.id}`, { ...body(terms), paymentTerms: 'on_account', netDays: 30 });
  try {
    return await journey();
  } finally {
    await apiRequest(lead, 'PUT', `/prices/customer-terms/${org.id}`, body(terms));
  }
}
