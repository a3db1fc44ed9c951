import type { DataSource } from 'typeorm';
import type { RecallNotice as RecallNoticeView, RecallRunResult } from '@kilocycle/common/types';
import { namedLockName } from '../cluster/cluster.module.js';
import { CertificateSettingsReader } from '../certificates/certificate-settings.reader.js';
import { RecallInstrumentsReader, type RecallInstrument } from '../instruments/recall-instruments.reader.js';
import { recallReminderMail, type OutgoingMail } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';

/** How long a run asked for by a person (the admin's button, `bin/kilocycle remind`) waits for another node's run to end. */
export const MANUAL_RUN_WAIT_S = 20;

/** The named lock every pass of the reminder holds, on whichever node or command runs it. */
export function recallLockName(dataSource: DataSource): string {
  return namedLockName(dataSource, 'recall');
}

type DueRow = { id: number; make: string; model: string; serial: string; due: string; organization_id: number; org_name: string; contact_email: string | null };

function addDays(date: Date, days: number): string {
  return new Date(date.getTime() + days * 86_400_000).toISOString().slice(0, 10);
}

/**
 * The instruments due by `until` whose customer is active and which have had no reminder for that due
 * date: instruments and organisations from their owners' readers, the reminders already sent from this
 * module's own table.
 */
async function dueRows(dataSource: DataSource, until: string): Promise<DueRow[]> {
  const due = (await new RecallInstrumentsReader(dataSource).dueBy(until)) as Array<RecallInstrument & { nextDueDate: string }>;
  if (due.length === 0) return [];
  const [organizations, noticed] = await Promise.all([
    new OrganizationsReader(dataSource).byIds(due.map((i) => i.organizationId)),
    dataSource.query("SELECT instrument_id, DATE_FORMAT(due_date, '%Y-%m-%d') AS due FROM recall_notices WHERE instrument_id IN (?)", [due.map((i) => i.id)]),
  ]);
  const sent = new Set((noticed as Array<{ instrument_id: number; due: string }>).map((n) => `${Number(n.instrument_id)}|${n.due}`));
  return due.flatMap((i) => {
    const organization = organizations.get(i.organizationId);
    if (!organization?.active || sent.has(`${i.id}|${i.nextDueDate}`)) return [];
    const { id, make, model, serial } = i;
    return [
      { id, make, model, serial, due: i.nextDueDate, organization_id: i.organizationId, org_name: organization.name, contact_email: organization.contactEmail },
    ];
  });
}

/**
 * Sends the recall reminders that are due: every instrument whose next due date falls within the notice
 * period (30 days unless the admin changed it; overdue ones included) and which has had no reminder for
 * that due date. A reminder is claimed by inserting its recall_notices row (unique per instrument and
 * due date) before the mail goes, so the scheduler and `kilocycle remind` never both send one; a claim
 * whose mail fails is released, to be tried again next time. One mail per customer.
 */
export async function runRecall(
  dataSource: DataSource,
  send: (mail: OutgoingMail) => Promise<unknown>,
  options: { publicUrl: string; now?: Date },
): Promise<RecallRunResult> {
  const now = options.now ?? new Date();
  const settings = await new CertificateSettingsReader(dataSource).read();
  const until = addDays(now, settings.recallNoticeDays);
  const rows = await dueRows(dataSource, until);
  const lab = await new OrganizationsReader(dataSource).lab();
  const recipientsOf = new CertificateRecipientsReader(dataSource);
  const byOrg = new Map<number, DueRow[]>();
  for (const row of rows) byOrg.set(row.organization_id, [...(byOrg.get(row.organization_id) ?? []), row]);
  const notices: RecallNoticeView[] = [];
  let skipped = 0;
  for (const [organizationId, due] of byOrg) {
    const clients = await recipientsOf.clientEmails(organizationId);
    const recipients = [...new Set([due[0]!.contact_email, ...clients].filter((e): e is string => !!e))];
    if (recipients.length === 0) {
      skipped += due.length;
      continue;
    }
    const claimed: Array<DueRow & { noticeId: number }> = [];
    for (const row of due) {
      const result = await dataSource.query('INSERT IGNORE INTO recall_notices (instrument_id, due_date, recipients) VALUES (?, ?, ?)', [
        row.id,
        row.due,
        JSON.stringify(recipients),
      ]);
      if (Number(result.affectedRows) === 1) claimed.push({ ...row, noticeId: Number(result.insertId) });
      else skipped += 1;
    }
    if (claimed.length === 0) continue;
    try {
      await send(
        recallReminderMail({
          to: recipients,
          labName: lab?.name ?? 'The laboratory',
          customer: due[0]!.org_name,
          instruments: claimed.map((c) => ({ label: `${c.make} ${c.model}, serial ${c.serial}`, dueDate: c.due })),
          portalUrl: `${options.publicUrl}/instruments`,
        }),
      );
    } catch (error) {
      await dataSource.query('DELETE FROM recall_notices WHERE id IN (?)', [claimed.map((c) => c.noticeId)]);
      throw error;
    }
    const sentAt = now.toISOString();
    for (const c of claimed) {
      notices.push({
        id: c.noticeId,
        instrumentId: c.id,
        instrumentLabel: `${c.make} ${c.model}, serial ${c.serial}`,
        organizationId,
        organizationName: c.org_name,
        dueDate: c.due,
        recipients,
        sentAt,
      });
    }
  }
  return { checked: rows.length, sent: notices.length, skipped, notices };
}
