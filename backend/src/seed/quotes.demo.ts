import type { BillingLineInput, QuoteStatus, AcceptanceChannel } from '@kilocycle/common/types';
import { dueDate } from '@kilocycle/common/money';
import type { EntityManager } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { readSettings } from '../certificates/certificate-settings.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { instrumentLabel } from '../instruments/instruments.service.js';
import { insertDemoJob, nextDemoJobNumber } from '../jobs/jobs.demo.js';
import { CustomerTermsReader } from '../prices/customer-terms.reader.js';
import { PriceItem } from '../prices/price-item.entity.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { renderQuotePdf } from '../quotes/quote-pdf.js';
import { QuoteLine } from '../quotes/quote-line.entity.js';
import { Quote } from '../quotes/quote.entity.js';
import { priceLines, quoteNumber, taxTreatment, totalsOf } from '../quotes/quotes.service.js';
import { labCurrency } from '../shared/currency.js';
import { addDays } from '../shared/demo-signals.js';
import { FileStore } from '../storage/file-store.service.js';
import type { DemoContext } from './demo-seed.js';

/** The Northgate field generator (the bench SG-4's bands) that waits in 'received' for its quote to be accepted in the portal. */
export const DEMO_QUOTED_INSTRUMENT = { make: 'Harwick Radio', model: 'FG-2 field signal generator', serial: 'N-1302' } as const;

type DemoJob = { id: number; number: string; organizationId: number; receivedDate: string; instrument: string; instrumentId: number };
type Decision = { daysAgo: number; by: number; channel: AcceptanceChannel | null; note: string | null };
type QuoteSpec = {
  job: DemoJob;
  status: QuoteStatus;
  createdDaysAgo: number;
  sentDaysAgo?: number;
  validityDays?: number;
  decision?: Decision;
  notes?: string;
  /** Lines beyond the proposed ones (e.g. an adjustment the lead expects). */
  extra?: BillingLineInput[];
};

/**
 * Quotes in every state on the demo jobs: the issued Northgate VFO and the Northgate jobs at work were accepted
 * (in the portal, by phone), one earlier Northgate quote was declined, a Saltmarsh quote ran out (expired) and its
 * replacement is a draft, and a new Northgate generator waits in 'received' with a SENT quote the club can accept.
 */
export async function seedDemoQuotes({ manager, customerIds, userIds }: DemoContext): Promise<void> {
  const lead = userIds['lead@kilocycle.test']!;
  const client = userIds['client@northgate.test']!;
  const today = new Date();
  const jobs = await demoJobs(manager);
  const find = (organizationId: number, status: string, model?: string) =>
    jobs.find((j) => j.organizationId === organizationId && j.status === status && (!model || j.instrument.includes(model)));
  const issued = find(customerIds.northgate, 'issued');
  const inReview = find(customerIds.northgate, 'in_review');
  const generator = find(customerIds.northgate, 'in_progress', 'SG-4');
  const live = find(customerIds.northgate, 'in_progress', 'BV-12');
  const saltmarsh = find(customerIds.saltmarsh, 'in_progress');
  const received = await insertReceivedJob(manager, customerIds.northgate, today);

  const adjustment: BillingLineInput = {
    code: 'ADJ-RNG',
    description: 'Adjustment of the dial, per range',
    unit: 'per_range',
    quantityMilli: 1000,
    unitPriceMinor: 6000,
  };
  const specs: QuoteSpec[] = [];
  if (issued)
    specs.push({ job: issued, status: 'accepted', createdDaysAgo: 16, sentDaysAgo: 16, decision: { daysAgo: 15, by: client, channel: 'portal', note: null } });
  if (inReview)
    specs.push({
      job: inReview,
      status: 'accepted',
      createdDaysAgo: 21,
      sentDaysAgo: 21,
      decision: { daysAgo: 20, by: lead, channel: 'phone', note: 'The club secretary accepted by phone; the written copy follows by post.' },
    });
  if (generator) {
    specs.push({
      job: generator,
      status: 'declined',
      createdDaysAgo: 9,
      sentDaysAgo: 9,
      extra: [{ ...adjustment, quantityMilli: 4000 }],
      decision: { daysAgo: 8, by: client, channel: null, note: 'Please quote the calibration without the adjustment: we adjust it ourselves.' },
    });
    specs.push({ job: generator, status: 'accepted', createdDaysAgo: 7, sentDaysAgo: 7, decision: { daysAgo: 6, by: client, channel: 'portal', note: null } });
  }
  if (live)
    specs.push({
      job: live,
      status: 'accepted',
      createdDaysAgo: 4,
      sentDaysAgo: 4,
      decision: { daysAgo: 3, by: lead, channel: 'email', note: 'Accepted by e-mail from the club secretary.' },
    });
  if (saltmarsh) {
    specs.push({
      job: saltmarsh,
      status: 'expired',
      createdDaysAgo: 50,
      sentDaysAgo: 48,
      validityDays: 30,
      notes: 'Warm-up study of both ranges, eight hours each.',
    });
    specs.push({
      job: saltmarsh,
      status: 'draft',
      createdDaysAgo: 1,
      extra: [{ code: 'WARM-HR', description: 'Warm-up drift study, per hour', unit: 'per_hour', quantityMilli: 16_000, unitPriceMinor: 3800 }],
      notes: 'Warm-up study of both ranges, eight hours each.',
    });
  }
  specs.push({ job: received, status: 'sent', createdDaysAgo: 1, sentDaysAgo: 1 });
  for (const spec of specs) await insertQuote(manager, spec, lead, today);
}

async function demoJobs(manager: EntityManager): Promise<Array<DemoJob & { status: string }>> {
  const rows: Array<Record<string, unknown>> = await manager.query(
    'SELECT j.id, j.number, j.status, j.organization_id, j.received_date, j.instrument_id, i.make, i.model, i.serial FROM jobs j JOIN instruments i ON i.id = j.instrument_id ORDER BY j.id',
  );
  return rows.map((r) => ({
    id: Number(r.id),
    number: String(r.number),
    status: String(r.status),
    organizationId: Number(r.organization_id),
    receivedDate: r.received_date instanceof Date ? r.received_date.toISOString().slice(0, 10) : String(r.received_date).slice(0, 10),
    instrumentId: Number(r.instrument_id),
    instrument: instrumentLabel({ make: String(r.make), model: String(r.model), serial: String(r.serial) }),
  }));
}

/** A third club generator (with the bands of the bench SG-4 N-1041), received yesterday, whose work waits for the quote. */
async function insertReceivedJob(manager: EntityManager, organizationId: number, today: Date): Promise<DemoJob> {
  const twin = await manager.findOneByOrFail(Instrument, { serial: 'N-1041' });
  const instrumentId = (
    await manager.insert(Instrument, {
      ...DEMO_QUOTED_INSTRUMENT,
      organizationId,
      assetTag: 'NRC-14',
      description: 'The club’s field-day generator, on the same bands as its bench SG-4s.',
      recallIntervalMonths: 12,
      // In for its first calibration with the lab: no due date yet (the recall demo keeps its two instruments due).
      nextDueDate: null,
    })
  ).identifiers[0].id as number;
  const ranges = await manager.find(InstrumentRange, { where: { instrumentId: twin.id }, order: { position: 'ASC' } });
  await manager.insert(
    InstrumentRange,
    ranges.map(({ id: _id, instrument: _i, ...range }) => ({ ...range, instrumentId })),
  );
  const receivedDate = addDays(today, -1);
  const job = await insertDemoJob(manager, {
    number: await nextDemoJobNumber(manager, receivedDate),
    instrumentId,
    organizationId,
    receivedDate,
    status: 'received',
    technicianId: null,
    conditionReceived: 'Received in its carrying case; mains lead included.',
    ambientTempC: 21.5,
    humidityPct: 44,
  });
  return { id: job.id, number: job.number, organizationId, receivedDate, instrumentId, instrument: instrumentLabel(DEMO_QUOTED_INSTRUMENT) };
}

/** One quote as the service would have left it, its PDF stored when it was sent, and its history in the audit log. */
async function insertQuote(manager: EntityManager, spec: QuoteSpec, lead: number, today: Date): Promise<void> {
  const audit = AuditService.within(manager);
  const organizations = new OrganizationsReader(manager.connection);
  const terms = await new CustomerTermsReader(manager.connection, organizations).termsFor(spec.job.organizationId, manager);
  const tax = taxTreatment(terms);
  const inputs = [...(await proposedFor(manager, spec.job)), ...(spec.extra ?? [])];
  const lines = priceLines(inputs, tax.rateBasisPoints);
  const totals = totalsOf(lines);
  const at = (daysAgo: number, hour: number) => new Date(`${addDays(today, -daysAgo)}T${String(hour).padStart(2, '0')}:15:00Z`);
  const createdAt = at(spec.createdDaysAgo, 9);
  const sentAt = spec.sentDaysAgo === undefined ? null : at(spec.sentDaysAgo, 11);
  const validityDays = spec.validityDays ?? 30;
  const validUntil = sentAt ? dueDate(sentAt.toISOString().slice(0, 10), validityDays) : null;
  const id = (
    await manager.insert(Quote, {
      number: null,
      jobId: spec.job.id,
      organizationId: spec.job.organizationId,
      status: spec.status,
      currency: labCurrency(),
      taxExempt: tax.exempt,
      taxRegistration: tax.registration,
      taxRateBasisPoints: tax.rateBasisPoints,
      netMinor: totals.netMinor,
      taxMinor: totals.taxMinor,
      grossMinor: totals.grossMinor,
      validityDays,
      notes: spec.notes ?? null,
      sentAt,
      validUntil,
      decidedAt: spec.decision ? at(spec.decision.daysAgo, 14) : null,
      decidedById: spec.decision?.by ?? null,
      acceptanceChannel: spec.status === 'accepted' ? (spec.decision?.channel ?? null) : null,
      decisionNote: spec.decision?.note ?? null,
      createdById: lead,
      createdAt,
    })
  ).identifiers[0].id as number;
  const number = quoteNumber(id);
  await manager.update(Quote, { id }, { number });
  await manager.insert(
    QuoteLine,
    lines.map((l) => ({ ...l, quoteId: id })),
  );
  await audit.record(
    { actorId: lead, entity: 'quote', entityId: id, action: 'create', changes: { number, jobId: spec.job.id, lines: lines.length }, at: createdAt },
    manager,
  );
  if (!sentAt) return;
  const [lab, customer, settings] = await Promise.all([
    organizations.lab(manager),
    organizations.byId(spec.job.organizationId, manager),
    readSettings(manager),
  ]);
  const pdf = await renderQuotePdf({
    number,
    draft: false,
    lab: { name: lab?.name ?? 'The laboratory', address: settings.labAddress, contactEmail: lab?.contactEmail ?? null },
    customer: { name: customer?.name ?? '', contactEmail: customer?.contactEmail ?? null },
    job: { number: spec.job.number, receivedDate: spec.job.receivedDate, instrument: spec.job.instrument },
    currency: labCurrency(),
    taxExempt: tax.exempt,
    taxRegistration: tax.registration,
    lines,
    totals,
    validityDays,
    validUntil,
    date: sentAt,
    paymentTerms: terms.paymentTerms,
    netDays: terms.netDays,
    notes: spec.notes ?? null,
  });
  const file = await new FileStore(manager.connection).put('quote-pdf', pdf, manager);
  await manager.update(Quote, { id }, { pdfFileId: file.id });
  await audit.record(
    {
      actorId: lead,
      entity: 'quote',
      entityId: id,
      action: 'send',
      changes: { to: customer?.contactEmail, validUntil, grossMinor: totals.grossMinor },
      at: sentAt,
    },
    manager,
  );
  if (spec.status === 'expired') {
    await audit.record(
      { actorId: null, entity: 'quote', entityId: id, action: 'expire', changes: { validUntil }, at: at(spec.sentDaysAgo! - validityDays - 1, 0) },
      manager,
    );
  } else if (spec.decision && (spec.status === 'accepted' || spec.status === 'declined')) {
    await audit.record(
      {
        actorId: spec.decision.by,
        entity: 'quote',
        entityId: id,
        action: spec.status === 'accepted' ? 'accept' : 'decline',
        changes: { channel: spec.status === 'accepted' ? spec.decision.channel : null, note: spec.decision.note },
        at: at(spec.decision.daysAgo, 14),
      },
      manager,
    );
  }
}

/** The proposed lines as ProposedLinesReader makes them, for the demo's calibration jobs (per range and per job; no study hours). */
async function proposedFor(manager: EntityManager, job: DemoJob): Promise<BillingLineInput[]> {
  const items = await manager.find(PriceItem, { where: { active: true, proposeOnQuotes: true }, order: { code: 'ASC' } });
  const ranges = await manager.countBy(InstrumentRange, { instrumentId: job.instrumentId });
  return items
    .filter((i) => i.unit !== 'per_hour')
    .map((i) => ({
      priceItemId: i.id,
      code: i.code,
      description: i.description,
      unit: i.unit,
      quantityMilli: i.unit === 'per_range' ? Math.max(1, ranges) * 1000 : 1000,
      unitPriceMinor: i.unitPriceMinor,
    }));
}
