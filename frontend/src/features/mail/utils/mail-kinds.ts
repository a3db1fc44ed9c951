export const MAIL_KIND_LABELS: Record<string, string> = {
  certificate_issued: 'Certificate issued',
  job_returned: 'Job returned',
  recall_reminder: 'Recall reminder',
  other: 'Other',
};

export function mailKindLabel(kind: string): string {
  return MAIL_KIND_LABELS[kind] ?? kind.replace(/_/g, ' ');
}
